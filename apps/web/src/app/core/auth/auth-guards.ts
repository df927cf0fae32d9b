import { inject } from '@angular/core';
import type { CanActivateChildFn, CanActivateFn, CanMatchFn } from '@angular/router';
import { Router } from '@angular/router';
import type { Permission } from '@loadwright/contracts';
import { safeReturnUrl } from './return-url';
import { SessionStore } from './session-store';

/** Lets signed-in people through; sends everyone else to the sign-in page with the address they wanted. */
export const signedIn: CanActivateChildFn = (_route, state) => {
  if (inject(SessionStore).user()) return true;
  return inject(Router).createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
};

/** The sign-in page is for people not signed in; the signed-in go on to where they were heading. */
export const signedOut: CanActivateFn = (route) => {
  if (!inject(SessionStore).user()) return true;
  return inject(Router).parseUrl(safeReturnUrl(route.queryParamMap.get('returnUrl')));
};

/**
 * Matches a route only for people holding `permission`; the next route with the same path (a page that
 * says the role may not open it) catches everyone else, so a typed address never shows a blank page.
 */
export function holds(permission: Permission): CanMatchFn {
  return () => inject(SessionStore).can(permission);
}
