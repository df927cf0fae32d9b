import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { MissDetail, MissRule, MissSummary } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** Filters of the miss list as the page keeps them (empty = any). */
export interface MissFilters {
  series: string;
  level: string;
  severity: string;
  state: string;
  from: string;
  to: string;
}

/** The Misses API. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class MissesClient {
  private readonly http = inject(HttpClient);

  /** Misses matching the filters, newest first. */
  list(filters: MissFilters): Observable<MissSummary[]> {
    let params = new HttpParams();
    for (const [key, value] of Object.entries(filters)) {
      if (!value) continue;
      params = params.set(key, key === 'from' || key === 'to' ? new Date(`${value}T00:00:00`).toISOString() : value);
    }
    return this.http.get<MissSummary[]>('/api/misses', { params });
  }

  /** One miss with evidence, cause, comments and chart. */
  detail(id: number): Observable<MissDetail> {
    return this.http.get<MissDetail>(`/api/misses/${id}`);
  }

  /** Acknowledges with a comment. */
  acknowledge(id: number, comment: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>(`/api/misses/${id}/acknowledge`, { comment });
  }

  /** Adds a comment. */
  comment(id: number, comment: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>(`/api/misses/${id}/comments`, { comment });
  }

  /** Resolves. */
  resolve(id: number, comment?: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>(`/api/misses/${id}/resolve`, comment ? { comment } : {});
  }

  /** Every rule. */
  rules(): Observable<MissRule[]> {
    return this.http.get<MissRule[]>('/api/miss-rules');
  }
}
