import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AuditPage } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** Filters of the audit log, all optional. */
export interface AuditFilter {
  /** Action code prefix, e.g. "user.". */
  readonly action?: string;
  /** Only what this person did. */
  readonly actorUserId?: number;
  /** Earliest time, ISO 8601. */
  readonly from?: string;
  /** Latest time, ISO 8601. */
  readonly to?: string;
}

/** Entries per page: enough for a day of sign-ins at a small utility. */
export const AUDIT_PAGE_SIZE = 50;

/** The audit log API (admins). Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class AuditClient {
  private readonly http = inject(HttpClient);

  /** One page of entries, newest first; pass the previous page's `nextBefore` to continue. */
  page(filter: AuditFilter, before?: number): Observable<AuditPage> {
    let params = new HttpParams().set('limit', AUDIT_PAGE_SIZE);
    for (const [key, value] of Object.entries({ ...filter, before })) {
      if (value !== undefined && value !== '') params = params.set(key, value);
    }
    return this.http.get<AuditPage>('/api/audit', { params });
  }
}
