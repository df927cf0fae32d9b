import type { Person } from '@loadwright/contracts';

/** A person's standing, in the words the People page uses, with an icon that never carries meaning alone. */
export interface PersonStatus {
  /** Machine-readable state, also the CSS class that colours the icon. */
  readonly kind: 'active' | 'invite-pending' | 'deactivated';
  /** The state in words, as the page shows it. */
  readonly label: string;
  /** Material Symbols ligature shown beside the words. */
  readonly icon: string;
}

/** Deactivated wins over a pending invite: a deactivated person cannot sign in either way. */
export function personStatus(person: Pick<Person, 'active' | 'invitePending'>): PersonStatus {
  if (!person.active) return { kind: 'deactivated', label: 'Deactivated', icon: 'block' };
  if (person.invitePending) return { kind: 'invite-pending', label: 'Invite pending', icon: 'schedule_send' };
  return { kind: 'active', label: 'Active', icon: 'check_circle' };
}

/** What each role may do, in one line, for the role picker. */
export const ROLE_DESCRIPTIONS = {
  admin: 'Everything, plus people, API tokens, settings and the audit log',
  steward: 'Uploads histories and keeps the series catalogue',
  planner: 'Reviews, adjusts and approves forecasts; model settings and miss rules',
  viewer: 'Reads forecasts and acknowledges misses',
} as const;
