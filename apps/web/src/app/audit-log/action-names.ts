import type { AuditEntry } from '@loadwright/contracts';

/** Readable names of the audit actions the product records today; others are spelled out from their code. */
const ACTION_NAMES: Readonly<Record<string, string>> = {
  'session.signed_in': 'Signed in',
  'session.signed_out': 'Signed out',
  'session.sign_in_failed': 'Sign-in failed',
  'session.sign_in_locked': 'Sign-in refused: locked after repeated failures',
  'session.sign_in_delayed': 'Sign-in refused: waiting after repeated failures',
  'access.denied': 'Refused: not allowed, or signed out',
  'access.csrf_refused': 'Refused: a change without its CSRF token',
  'token.refused': 'Refused an API token (revoked, expired or its creator inactive)',
  'outbox.listed': 'Looked at the Outbox',
  'outbox.message_read': 'Read a message in the Outbox',
  'user.invited': 'Invited a person',
  'user.invite_resent': 'Resent an invite',
  'user.invite_accepted': 'Accepted an invite and set a password',
  'user.password_changed': 'Changed own password',
  'user.password_reset_requested': 'Asked for a password reset link',
  'user.password_reset': 'Reset a password from a link',
  'user.role_changed': 'Changed a role',
  'user.deactivated': 'Deactivated a person',
  'user.reactivated': 'Reactivated a person',
  'user.updated': 'Changed a person',
  'token.created': 'Created an API token',
  'token.revoked': 'Revoked an API token',
};

/** The action families an admin can filter by: the part of the code before the dot. */
export const ACTION_FAMILIES: readonly { readonly prefix: string; readonly label: string }[] = [
  { prefix: 'session.', label: 'Sign-ins and sign-outs' },
  { prefix: 'user.', label: 'People and passwords' },
  { prefix: 'token.', label: 'API tokens' },
  { prefix: 'access.', label: 'Refused calls' },
  { prefix: 'outbox.', label: 'Outbox reads' },
  { prefix: 'upload.', label: 'Uploads' },
  { prefix: 'series.', label: 'Series catalogue' },
  { prefix: 'model.', label: 'Model settings' },
  { prefix: 'forecast.', label: 'Forecast approvals and adjustments' },
  { prefix: 'miss', label: 'Misses and miss rules' },
];

/** "Signed in" for a known code; "Upload imported" for `upload.imported` and other codes added later. */
export function actionName(action: string): string {
  const known = ACTION_NAMES[action];
  if (known) return known;
  const words = action.replace(/[._]+/g, ' ').trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** Who did it, in words: a person's name, a token's name, or nobody signed in (a failed sign-in, a link redeemed, the system). */
export function actorName(actor: AuditEntry['actor']): string {
  if (actor.kind === 'visitor') return 'Not signed in';
  if (actor.kind === 'system') return 'Loadwright (automatic)';
  if (actor.kind === 'token') return `API token ${actor.name ?? `#${actor.id}`}`;
  return actor.name ?? (actor.id === null ? 'Someone not signed in' : 'A person no longer listed');
}

/** Names of the kinds of things entries act on. */
const TARGET_NAMES: Readonly<Record<string, string>> = { user: 'Person', api_token: 'API token', forecast_version: 'Forecast' };

/** "Person: Dana Reyes" for a target the entry names, by its name; null when the entry names none. */
export function targetName(entry: Pick<AuditEntry, 'targetType' | 'targetId' | 'targetName'>): string | null {
  if (!entry.targetType) return null;
  const kind = TARGET_NAMES[entry.targetType] ?? actionName(entry.targetType);
  if (entry.targetName) return `${kind}: ${entry.targetName}`;
  return entry.targetId ? `${kind} ${entry.targetId} (no longer listed)` : kind;
}

/** The entry's detail as short "key: value" pairs, e.g. "role: planner → admin". */
export function detailSummary(detail: AuditEntry['detail']): string {
  return Object.entries(detail)
    .map(([key, value]) => `${key}: ${describeValue(value)}`)
    .join(' · ');
}

/** A change `{from, to}` reads as "from → to"; other values as compact JSON. */
function describeValue(value: unknown): string {
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') return String(value);
  if (value && typeof value === 'object' && 'from' in value && 'to' in value) {
    const change = value as { from: unknown; to: unknown };
    return `${describeValue(change.from)} → ${describeValue(change.to)}`;
  }
  return JSON.stringify(value);
}
