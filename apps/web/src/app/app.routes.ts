import { Routes } from '@angular/router';
import { PRODUCT_SECTIONS } from './core/product-sections';

/** Sections not built yet share one honest page that says what each will do. */
const upcomingRoutes: Routes = PRODUCT_SECTIONS.filter((section) => !section.available).map((section) => ({
  path: section.path,
  title: section.label,
  data: { section },
  loadComponent: () => import('./shared/upcoming-section/upcoming-section').then((m) => m.UpcomingSection),
}));

/** Every feature loads lazily, so the first screen downloads only the shell. */
export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'overview' },
  {
    path: 'overview',
    title: 'Overview',
    loadComponent: () => import('./overview/overview').then((m) => m.Overview),
  },
  ...upcomingRoutes,
  {
    path: '**',
    title: 'Page not found',
    loadComponent: () => import('./shared/not-found/not-found').then((m) => m.NotFound),
  },
];
