import type { ApiToken } from '@loadwright/contracts';

/** Whether a token still works, in words, with an icon that never carries meaning alone. */
export interface TokenState {
  /** Machine-readable state, also the CSS class that colours the icon. */
  readonly kind: 'live' | 'expired' | 'revoked';
  /** The state in words, as the page shows it. */
  readonly label: string;
  /** Material Symbols ligature shown beside the words. */
  readonly icon: string;
}

/** Revoked wins over expired: revocation is the admin's deliberate act. */
export function tokenState(token: Pick<ApiToken, 'revokedAt' | 'expiresAt'>, now: Date): TokenState {
  if (token.revokedAt) return { kind: 'revoked', label: 'Revoked', icon: 'block' };
  if (token.expiresAt && new Date(token.expiresAt) <= now) return { kind: 'expired', label: 'Expired', icon: 'timer_off' };
  return { kind: 'live', label: 'Active', icon: 'check_circle' };
}

/** What each scope lets a downstream system do. */
export const SCOPE_DESCRIPTIONS = {
  read: 'Read series, approved forecasts and accuracy',
  'read-write': 'Read, and push new actuals (uploads)',
} as const;
