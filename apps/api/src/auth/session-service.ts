/** Opening and ending sessions, and the session info the web app reads. */
import { and, eq, isNull, ne, sql } from 'drizzle-orm';
import { permissionTable, roleHas, type Permission, type Role, type SessionInfo } from '@loadwright/contracts';
import { sessions, users, type Database } from '@loadwright/db';
import { sessionMaxAgeSeconds } from './session-token';

/** Creates a session row for a person who just proved who they are. */
export async function openSession(
  db: Pick<Database, 'insert' | 'update'>,
  userId: number,
  ip: string,
  userAgent: string | undefined,
): Promise<string> {
  const [row] = await db
    .insert(sessions)
    .values({
      userId,
      ip,
      userAgent: userAgent?.slice(0, 300) ?? null,
      expiresAt: new Date(Date.now() + sessionMaxAgeSeconds * 1000),
      lastSeenAt: new Date(),
    })
    .returning({ id: sessions.id });
  await db.update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, userId));
  return row!.id;
}

/** Ends one session at once. */
export async function revokeSession(db: Pick<Database, 'update'>, sessionId: string): Promise<void> {
  await db
    .update(sessions)
    .set({ revokedAt: new Date() })
    .where(and(eq(sessions.id, sessionId), isNull(sessions.revokedAt)));
}

/** Ends every live session of a person (role change, deactivation, password change), optionally sparing one. */
export async function revokeSessionsOf(db: Pick<Database, 'update'>, userId: number, except?: string): Promise<void> {
  await db
    .update(sessions)
    .set({ revokedAt: new Date() })
    .where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt), except ? ne(sessions.id, except) : sql`true`));
}

/** The permissions a role holds, in the table's order. */
export function permissionsOf(role: Role): Permission[] {
  return (Object.keys(permissionTable) as Permission[]).filter((permission) => roleHas(role, permission));
}

/** What the web app needs to know about the signed-in person. */
export function sessionInfo(user: { id: number; email: string; displayName: string; role: Role }): SessionInfo {
  return {
    user: { id: user.id, email: user.email, displayName: user.displayName, role: user.role },
    permissions: permissionsOf(user.role),
  };
}
