import type { Permission } from '@loadwright/contracts';

/** Where a section sits in the navigation. */
export type SectionGroup = 'work' | 'people-and-settings' | 'development';

/** One section of the product as the navigation lists it. */
export interface ProductSection {
  /** Route path, without a leading slash. */
  readonly path: string;
  /** Name shown in the navigation and as the page title. */
  readonly label: string;
  /** Name of the navigation icon in the bundled SVG icon set. */
  readonly icon: string;
  /** One line on what the section lets its users get done. */
  readonly purpose: string;
  /** The permission a person needs to see the section; the API checks the same one on every call. */
  readonly permission: Permission;
  /** The navigation group it belongs to. */
  readonly group: SectionGroup;
}

/** Heading of each navigation group that has one. */
export const SECTION_GROUP_LABELS: Readonly<Record<Exclude<SectionGroup, 'work'>, string>> = {
  'people-and-settings': 'People and settings',
  development: 'Development',
};

/** The product's sections in navigation order, as the product brief lists its screens. */
export const PRODUCT_SECTIONS: readonly ProductSection[] = [
  {
    path: 'overview',
    label: 'Overview',
    icon: 'space_dashboard',
    purpose: 'Live refit status, open misses, accuracy against the naive benchmark and the next-week system peak.',
    permission: 'data.read',
    group: 'work',
  },
  {
    path: 'series',
    label: 'Series',
    icon: 'stacked_line_chart',
    purpose:
      'The series catalogue with a hierarchy filter; for each series its history and forecast with 80 % and 95 % bands, model card, diagnostics, accuracy by horizon, versions and adjustments.',
    permission: 'data.read',
    group: 'work',
  },
  {
    path: 'uploads',
    label: 'Uploads',
    icon: 'upload_file',
    purpose: 'Drop a load or temperature file, map its columns, preview it, follow its progress and read its validation report.',
    permission: 'data.upload',
    group: 'work',
  },
  {
    path: 'refits',
    label: 'Refits',
    icon: 'model_training',
    purpose: 'Refit runs with per-series status, errors and durations, and a way to refit now.',
    permission: 'data.read',
    group: 'work',
  },
  {
    path: 'misses',
    label: 'Misses',
    icon: 'crisis_alert',
    purpose: 'Miss events and the rules that raise them, to acknowledge, comment on and resolve.',
    permission: 'data.read',
    group: 'work',
  },
  {
    path: 'people',
    label: 'People',
    icon: 'group',
    purpose: 'Invite people by e-mail, change their roles, deactivate and reactivate them.',
    permission: 'admin.people',
    group: 'people-and-settings',
  },
  {
    path: 'api-tokens',
    label: 'API tokens',
    icon: 'key',
    purpose: 'Tokens for downstream systems that pull approved forecasts: create, see last use, revoke.',
    permission: 'admin.tokens',
    group: 'people-and-settings',
  },
  {
    path: 'audit-log',
    label: 'Audit log',
    icon: 'policy',
    purpose: 'Who did what, when and from where: sign-ins, role and token changes, uploads, model settings, approvals.',
    permission: 'admin.audit',
    group: 'people-and-settings',
  },
  {
    path: 'settings',
    label: 'Settings',
    icon: 'tune',
    purpose: 'Time zone, refit hour and morning deadline, miss rule defaults, the sender address and the holiday calendar.',
    permission: 'admin.settings',
    group: 'people-and-settings',
  },
  {
    path: 'outbox',
    label: 'Outbox',
    icon: 'outbox',
    purpose: 'The local mail catcher for development: every e-mail Loadwright has sent, as its recipient would read it.',
    permission: 'admin.outbox',
    group: 'development',
  },
];
