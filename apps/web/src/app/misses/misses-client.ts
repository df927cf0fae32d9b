import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  MissDetail,
  MissRule,
  MissRuleCreate,
  MissRulesInForce,
  MissRuleUpdate,
  MissSummary,
  SeriesLevel,
  SeriesPage,
} from '@loadwright/contracts';
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

  /** The rules in force for one series or one group (level), kind by kind. */
  rulesInForce(target: { series: number } | { level: SeriesLevel }): Observable<MissRulesInForce> {
    const params: Record<string, string> = 'series' in target ? { series: String(target.series) } : { level: target.level };
    return this.http.get<MissRulesInForce>('/api/miss-rules/in-force', { params });
  }

  /** Adds an override of one kind for a group or a series. */
  addOverride(body: MissRuleCreate): Observable<MissRule> {
    return this.http.post<MissRule>('/api/miss-rules', body);
  }

  /** Changes a rule's settings. */
  changeRule(id: number, change: MissRuleUpdate): Observable<MissRule> {
    return this.http.patch<MissRule>(`/api/miss-rules/${id}`, change);
  }

  /** Removes an override; the group's override or the default applies again. */
  removeOverride(id: number): Observable<{ message: string }> {
    return this.http.delete<{ message: string }>(`/api/miss-rules/${id}`);
  }

  /** Live load series, by key, for choosing whose rules to see (the first 200). */
  loadSeries(): Observable<SeriesPage> {
    return this.http.get<SeriesPage>('/api/series', { params: { kind: 'load', limit: '200', sort: 'key' } });
  }
}
