import { HttpContextToken, HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { catchError, throwError } from 'rxjs';
import { problemFromResponse } from './api-problem';

/** Set on a request that reads its own error bodies (the health check reads a report from a 503). */
export const KEEP_HTTP_ERRORS = new HttpContextToken<boolean>(() => false);

/** The one place HTTP failures become typed {@link ApiProblem}s, so features never parse error bodies. */
export const problemInterceptor: HttpInterceptorFn = (request, next) => {
  if (request.context.get(KEEP_HTTP_ERRORS)) return next(request);
  return next(request).pipe(
    catchError((error: unknown) => throwError(() => (error instanceof HttpErrorResponse ? problemFromResponse(error) : error))),
  );
};
