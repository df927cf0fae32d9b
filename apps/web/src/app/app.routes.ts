import type { Type } from '@angular/core';
import { Route, Routes } from '@angular/router';
import { holds, signedIn, signedOut } from './core/auth/auth-guards';
import { PRODUCT_SECTIONS, type ProductSection } from './core/product-sections';

/** Lazy loaders of every section's page, by path. */
const sectionPages: Readonly<Record<string, () => Promise<Type<unknown>>>> = {
  overview: () => import('./overview/overview').then((m) => m.Overview),
  series: () => import('./series-catalogue/series-catalogue').then((m) => m.SeriesCatalogue),
  uploads: () => import('./uploads/uploads').then((m) => m.Uploads),
  refits: () => import('./refits/refits').then((m) => m.Refits),
  people: () => import('./people/people').then((m) => m.People),
  'api-tokens': () => import('./api-tokens/api-tokens').then((m) => m.ApiTokens),
  'audit-log': () => import('./audit-log/audit-log').then((m) => m.AuditLog),
  outbox: () => import('./outbox/outbox').then((m) => m.Outbox),
  misses: () => import('./misses/misses').then((m) => m.Misses),
  settings: () => import('./settings/settings').then((m) => m.Settings),
};

/** Extra paths under a section (e.g. one Outbox message), served by the section's own page. */
const sectionSubpaths: Readonly<Record<string, readonly string[]>> = {
  outbox: [':id'],
  uploads: [':id'],
  series: [':id'],
  // 'rules' before ':id', so the Rules view is not read as a miss id.
  misses: ['rules', ':id'],
};

/** Extra paths served by a page of their own instead of the section's (e.g. one series), by full path. */
const subpathPages: Readonly<Record<string, () => Promise<Type<unknown>>>> = {
  'series/:id': () => import('./series-page/series-page').then((m) => m.SeriesPage),
  'misses/rules': () => import('./misses/miss-rules').then((m) => m.MissRules),
};

/**
 * The routes of one section: its page for people holding the section's permission, then, at the same
 * path, a page saying the role may not open it.
 */
function sectionRoutes(section: ProductSection): Routes {
  const loadComponent = sectionPages[section.path];
  if (!loadComponent) throw new Error(`The section "${section.path}" has no page in sectionPages.`);
  const paths = [section.path, ...(sectionSubpaths[section.path] ?? []).map((sub) => `${section.path}/${sub}`)];
  return paths.flatMap((path): Route[] => [
    {
      path,
      title: section.label,
      data: { section },
      canMatch: [holds(section.permission)],
      loadComponent: subpathPages[path] ?? loadComponent,
    },
    { path, title: 'Not allowed', data: { section }, loadComponent: () => import('./shared/refused/refused').then((m) => m.Refused) },
  ]);
}

/** Every page loads lazily, so the first screen downloads only the shell. */
export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'overview' },
  {
    path: 'sign-in',
    title: 'Sign in',
    canActivate: [signedOut],
    loadComponent: () => import('./sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'forgot-password',
    title: 'Reset your password',
    loadComponent: () => import('./sign-in/forgot-password').then((m) => m.ForgotPassword),
  },
  {
    path: 'set-password',
    title: 'Choose a password',
    loadComponent: () => import('./set-password/set-password').then((m) => m.SetPassword),
  },
  {
    path: '',
    canActivateChild: [signedIn],
    children: [
      ...PRODUCT_SECTIONS.flatMap(sectionRoutes),
      {
        path: 'account',
        title: 'Your account',
        loadComponent: () => import('./account/account').then((m) => m.Account),
      },
      {
        path: '**',
        title: 'Page not found',
        loadComponent: () => import('./shared/not-found/not-found').then((m) => m.NotFound),
      },
    ],
  },
];
