/**
 * Sign-in rate limit: failures are counted per account (lower-cased e-mail) and per client address in
 * a sliding window; too many lock that subject out for a while. Counting addresses as well as accounts
 * stops one client from trying a password against many accounts (OWASP Authentication Cheat Sheet).
 */
import { and, eq, sql } from 'drizzle-orm';
import { loginThrottles, type Database } from '@loadwright/db';

/** Limits per subject kind. */
export const throttleRules = {
  account: { maxFailures: 5, windowMinutes: 15, lockMinutes: 15 },
  address: { maxFailures: 30, windowMinutes: 15, lockMinutes: 15 },
} as const;

type Subject = { kind: 'account' | 'address'; value: string };

/** Minutes left on the longest lock among the subjects, or 0 when none is locked. */
export async function lockedMinutes(db: Database, subjects: Subject[]): Promise<number> {
  let longest = 0;
  for (const subject of subjects) {
    const [row] = await db
      .select({ lockedUntil: loginThrottles.lockedUntil })
      .from(loginThrottles)
      .where(and(eq(loginThrottles.subjectKind, subject.kind), eq(loginThrottles.subject, subject.value)));
    if (row?.lockedUntil && row.lockedUntil.getTime() > Date.now())
      longest = Math.max(longest, Math.ceil((row.lockedUntil.getTime() - Date.now()) / 60_000));
  }
  return longest;
}

/** Counts a failure against each subject, locking those over their limit. */
export async function recordFailure(db: Database, subjects: Subject[]): Promise<void> {
  for (const subject of subjects) {
    const rule = throttleRules[subject.kind];
    // One statement per subject: restart the window when it has passed, then lock when over the limit.
    await db.execute(sql`
      INSERT INTO login_throttles (subject_kind, subject, failures, window_started_at)
      VALUES (${subject.kind}, ${subject.value}, 1, now())
      ON CONFLICT (subject_kind, subject) DO UPDATE SET
        failures = CASE WHEN login_throttles.window_started_at < now() - make_interval(mins => ${rule.windowMinutes})
                        THEN 1 ELSE login_throttles.failures + 1 END,
        window_started_at = CASE WHEN login_throttles.window_started_at < now() - make_interval(mins => ${rule.windowMinutes})
                        THEN now() ELSE login_throttles.window_started_at END,
        updated_at = now()`);
    await db.execute(sql`
      UPDATE login_throttles SET locked_until = now() + make_interval(mins => ${rule.lockMinutes}), failures = 0, window_started_at = now()
       WHERE subject_kind = ${subject.kind} AND subject = ${subject.value} AND failures >= ${rule.maxFailures}`);
  }
}

/** Clears an account's failures after it signs in. */
export async function clearFailures(db: Database, subject: Subject): Promise<void> {
  await db.delete(loginThrottles).where(and(eq(loginThrottles.subjectKind, subject.kind), eq(loginThrottles.subject, subject.value)));
}
