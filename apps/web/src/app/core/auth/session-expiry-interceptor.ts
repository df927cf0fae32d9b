import { type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { ApiProblem } from '../problems/api-problem';
import { SessionStore } from './session-store';

/**
 * When the API says a signed-in person's session has ended (expired, revoked, role changed), forget it
 * and go to the sign-in page, keeping the address to come back to. Sign-in calls themselves are left alone.
 */
export const sessionExpiryInterceptor: HttpInterceptorFn = (request, next) => {
  const store = inject(SessionStore);
  const router = inject(Router);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (error instanceof ApiProblem && error.status === 401 && !request.url.startsWith('/api/auth/') && store.user()) {
        store.forget();
        void router.navigate(['/sign-in'], { queryParams: { returnUrl: router.url, ended: 1 } });
      }
      return throwError(() => error);
    }),
  );
};
