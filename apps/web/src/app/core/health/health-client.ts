import { HttpClient, HttpContext, HttpErrorResponse } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type HealthReport, healthReportSchema } from '@loadwright/contracts';
import { Observable, catchError, map, of, throwError } from 'rxjs';
import { KEEP_HTTP_ERRORS } from '../problems/problem-interceptor';
import { HealthCheckFailed } from './health-check-failed';

/** Reads the API's health report, validated against the shared contract. */
@Injectable({ providedIn: 'root' })
export class HealthClient {
  private readonly http = inject(HttpClient);

  /**
   * Fetches `GET /api/health` once. Emits the report (also when the API answers 503 "degraded" with a
   * report in the body) or fails with {@link HealthCheckFailed} carrying a message for the planner.
   */
  read(): Observable<HealthReport> {
    return this.http.get<unknown>('/api/health', { context: new HttpContext().set(KEEP_HTTP_ERRORS, true) }).pipe(
      catchError((error: unknown) => {
        // A degraded service answers 503 with a full report: that is news, not a failure.
        if (error instanceof HttpErrorResponse && error.status === 503 && healthReportSchema.safeParse(error.error).success) {
          return of(error.error as unknown);
        }
        return throwError(() => new HealthCheckFailed(describeFailure(error)));
      }),
      map((body) => {
        const parsed = healthReportSchema.safeParse(body);
        if (!parsed.success) {
          throw new HealthCheckFailed(
            'The API answered, but not with a health report this version of the app understands. Reload the page after an update.',
          );
        }
        return parsed.data;
      }),
    );
  }
}

/** Turns a transport error into one sentence a planner can act on. */
function describeFailure(error: unknown): string {
  if (error instanceof HttpErrorResponse) {
    if (error.status === 0)
      return 'The Loadwright API cannot be reached. Check that the server is running and this machine is on its network.';
    return `The Loadwright API answered with an error (HTTP ${error.status}${error.statusText ? ` ${error.statusText}` : ''}).`;
  }
  return 'The health check failed unexpectedly.';
}
