import { type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { ApiProblem } from '../problems/api-problem';
import { SessionStore } from './session-store';

/** Calls whose 401 means "not signed in (yet)", never "your session just ended". */
const sessionQuestions = ['/api/auth/sign-in', '/api/auth/session'];

/**
 * When the API says a signed-in person's session has ended (expired, revoked, role changed), forget it
 * and go to the sign-in page, keeping the address to come back to. A refused sign-in and the start-up
 * session check are answers, not endings, and are left alone.
 */
export const sessionExpiryInterceptor: HttpInterceptorFn = (request, next) => {
  const store = inject(SessionStore);
  const router = inject(Router);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (error instanceof ApiProblem && error.status === 401 && !sessionQuestions.includes(request.url) && store.user()) {
        store.forget();
        void router.navigate(['/sign-in'], { queryParams: { returnUrl: router.url, ended: 1 } });
      }
      return throwError(() => error);
    }),
  );
};
