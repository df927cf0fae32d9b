/** One section of the product as the navigation lists it. */
export interface ProductSection {
  /** Route path, without a leading slash. */
  readonly path: string;
  /** Name shown in the navigation and as the page title. */
  readonly label: string;
  /** Material Symbols ligature for the navigation icon. */
  readonly icon: string;
  /** One line on what the section lets its users get done. */
  readonly purpose: string;
  /** False until the section ships; its route then shows the "later release" page. */
  readonly available: boolean;
}

/** The product's sections in navigation order, as the product brief lists its screens. */
export const PRODUCT_SECTIONS: readonly ProductSection[] = [
  {
    path: 'overview',
    label: 'Overview',
    icon: 'space_dashboard',
    purpose: 'Live refit status, open misses, accuracy against the naive benchmark and the next-week system peak.',
    available: true,
  },
  {
    path: 'series',
    label: 'Series',
    icon: 'stacked_line_chart',
    purpose:
      'The series catalogue with a hierarchy filter; for each series its history and forecast with 80 % and 95 % bands, model card, diagnostics, accuracy by horizon, versions and adjustments.',
    available: false,
  },
  {
    path: 'uploads',
    label: 'Uploads',
    icon: 'upload_file',
    purpose: 'Drop a load or temperature file, map its columns, preview it, follow its progress and read its validation report.',
    available: false,
  },
  {
    path: 'refits',
    label: 'Refits',
    icon: 'model_training',
    purpose: 'Refit runs with per-series status, errors and durations, and a way to refit now.',
    available: false,
  },
  {
    path: 'misses',
    label: 'Misses',
    icon: 'crisis_alert',
    purpose: 'Miss events and the rules that raise them, to acknowledge, comment on and resolve.',
    available: false,
  },
  {
    path: 'settings',
    label: 'People and settings',
    icon: 'manage_accounts',
    purpose: 'People and roles, refit schedule and time zone, alert rule defaults, mail settings, API tokens and the audit log.',
    available: false,
  },
  {
    path: 'outbox',
    label: 'Outbox',
    icon: 'outbox',
    purpose: 'The local mail catcher for development: every e-mail Loadwright has sent, as its recipient would read it.',
    available: false,
  },
];
