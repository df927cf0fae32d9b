import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CurrentRefit, RefitRunDetail, RefitRunList, RefitRunSummary, RefitScope, SeriesPage } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The refit-run API. Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class RefitsClient {
  private readonly http = inject(HttpClient);

  /** The run in progress, or `{ run: null }` when idle. */
  current(): Observable<CurrentRefit> {
    return this.http.get<CurrentRefit>('/api/refits/current');
  }

  /** The newest runs, newest first. */
  list(limit = 20): Observable<RefitRunList> {
    return this.http.get<RefitRunList>('/api/refits', { params: { limit } });
  }

  /** One run with every series' status, attempts, error and duration. */
  detail(id: number): Observable<RefitRunDetail> {
    return this.http.get<RefitRunDetail>(`/api/refits/${id}`);
  }

  /** Starts a run now (planners, admins). */
  start(scope: RefitScope): Observable<RefitRunSummary> {
    return this.http.post<RefitRunSummary>('/api/refits', { scope });
  }

  /** Live load series (for the scope pickers), system first. */
  loadSeries(): Observable<SeriesPage> {
    return this.http.get<SeriesPage>('/api/series', { params: { kind: 'load', sort: 'level', limit: 200 } });
  }
}
