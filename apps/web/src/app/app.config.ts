import { provideHttpClient, withFetch, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import {
  ApplicationConfig,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { TitleStrategy, provideRouter, withComponentInputBinding } from '@angular/router';
import { routes } from './app.routes';
import { SessionStore } from './core/auth/session-store';
import { sessionExpiryInterceptor } from './core/auth/session-expiry-interceptor';
import { problemInterceptor } from './core/problems/problem-interceptor';
import { ProductTitleStrategy } from './core/product-title-strategy';
import { provideIcons } from './core/icons/icon-set';

/** Application-wide providers: zoneless change detection, the router, HTTP with CSRF and problems, the session, the icons. */
export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    provideHttpClient(
      withFetch(),
      // Every cookie-authenticated write echoes the readable CSRF cookie in this header.
      withXsrfConfiguration({ cookieName: 'lw_csrf', headerName: 'X-CSRF-Token' }),
      // Listed outermost first: problems are typed before the session-expiry check reads them.
      withInterceptors([sessionExpiryInterceptor, problemInterceptor]),
    ),
    // Know who is signed in before the first route's guards run.
    provideAppInitializer(() => inject(SessionStore).restore()),
    { provide: TitleStrategy, useClass: ProductTitleStrategy },
    // Icons are bundled SVGs of the few Material Symbols the app shows, never a font or a network service.
    provideIcons(),
  ],
};
