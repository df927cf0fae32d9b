/**
 * Who may do what: the one permission table of the product. The API enforces it on every route;
 * the web app reads the same table to hide actions a role cannot take (the server alone decides).
 */

/** The roles a person can hold. */
export const roles = ['admin', 'steward', 'planner', 'viewer'] as const;
export type Role = (typeof roles)[number];

/** What a downstream system's API token may do. */
export const tokenScopes = ['read', 'read-write'] as const;
export type TokenScope = (typeof tokenScopes)[number];

/** Each permission: the roles that hold it, and the token scopes that hold it (none for people-only actions). */
export const permissionTable = {
  /** Read series, histories, forecasts, fits, accuracy, refit status and misses. */
  'data.read': { roles: ['admin', 'steward', 'planner', 'viewer'], tokenScopes: ['read', 'read-write'] },
  /** Upload histories and temperature files, resolve validation findings. */
  'data.upload': { roles: ['admin', 'steward'], tokenScopes: ['read-write'] },
  /** Create, edit and archive series in the catalogue. */
  'series.edit': { roles: ['admin', 'steward'], tokenScopes: [] },
  /** Change a series' model settings and the holiday calendar; start refits and backtests. */
  'models.edit': { roles: ['admin', 'planner'], tokenScopes: [] },
  /** Adjust and approve forecasts. */
  'forecasts.approve': { roles: ['admin', 'planner'], tokenScopes: [] },
  /** Acknowledge and comment on misses. */
  'misses.acknowledge': { roles: ['admin', 'planner', 'viewer'], tokenScopes: [] },
  /** Create and change miss rules. */
  'misses.rules': { roles: ['admin', 'planner'], tokenScopes: [] },
  /** Invite people, change roles, deactivate; API tokens; settings; audit log; outbox. */
  'admin.people': { roles: ['admin'], tokenScopes: [] },
  'admin.tokens': { roles: ['admin'], tokenScopes: [] },
  'admin.settings': { roles: ['admin'], tokenScopes: [] },
  'admin.audit': { roles: ['admin'], tokenScopes: [] },
  'admin.outbox': { roles: ['admin'], tokenScopes: [] },
  /** Anyone signed in: their own profile and password. */
  'self.manage': { roles: ['admin', 'steward', 'planner', 'viewer'], tokenScopes: [] },
} as const satisfies Record<string, { roles: readonly Role[]; tokenScopes: readonly TokenScope[] }>;

export type Permission = keyof typeof permissionTable;

/** True when a person with `role` holds `permission`. */
export function roleHas(role: Role, permission: Permission): boolean {
  return (permissionTable[permission].roles as readonly Role[]).includes(role);
}

/** True when a token with `scope` holds `permission`. */
export function scopeHas(scope: TokenScope, permission: Permission): boolean {
  return (permissionTable[permission].tokenScopes as readonly TokenScope[]).includes(scope);
}
