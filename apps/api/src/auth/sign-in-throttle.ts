/**
 * Sign-in throttle: consecutive failures are counted per account (lower-cased e-mail) and per client
 * address; past a few free attempts each failure makes the subject wait longer before the next try,
 * doubling each time up to a ceiling (exponential back-off, OWASP Authentication Cheat Sheet,
 * "Account Lockout"). The account's ceiling is short, so nobody can lock a person out for long by
 * typing wrong passwords at their e-mail address; the address's ceiling is long, so one client cannot
 * keep guessing. A sign-in or a password reset through the e-mailed link clears the account's count.
 */
import { and, eq, sql } from 'drizzle-orm';
import { loginThrottles, type Database } from '@loadwright/db';

/** Back-off per subject kind: failures before any wait, the first wait and its ceiling (seconds), and when a quiet subject starts afresh. */
export const throttleRules = {
  account: { freeFailures: 3, firstDelaySeconds: 1, maxDelaySeconds: 60, forgetAfterMinutes: 60 },
  address: { freeFailures: 10, firstDelaySeconds: 1, maxDelaySeconds: 15 * 60, forgetAfterMinutes: 60 },
} as const;

/** Whose failures are counted. */
export type Subject = { kind: 'account' | 'address'; value: string };

/**
 * Seconds a subject waits after its `failures`-th consecutive failure: none for the free ones, then
 * first × 2^(failures − free − 1), at most the ceiling. Account: 3 free, then 1, 2, 4, … 32, 60, 60 s.
 */
export function delayAfterFailures(kind: Subject['kind'], failures: number): number {
  const rule = throttleRules[kind];
  if (failures <= rule.freeFailures) return 0;
  return Math.min(rule.maxDelaySeconds, rule.firstDelaySeconds * 2 ** (failures - rule.freeFailures - 1));
}

/** Seconds until the first of the subjects may try again (the longest wait among them), 0 when none waits. */
export async function secondsToWait(db: Database, subjects: Subject[]): Promise<number> {
  let longest = 0;
  for (const subject of subjects) {
    const [row] = await db
      .select({ lockedUntil: loginThrottles.lockedUntil })
      .from(loginThrottles)
      .where(and(eq(loginThrottles.subjectKind, subject.kind), eq(loginThrottles.subject, subject.value)));
    if (row?.lockedUntil && row.lockedUntil.getTime() > Date.now())
      longest = Math.max(longest, Math.ceil((row.lockedUntil.getTime() - Date.now()) / 1000));
  }
  return longest;
}

/** Counts a failure against each subject and sets how long it waits before its next attempt. */
export async function recordFailure(db: Database, subjects: Subject[]): Promise<void> {
  for (const subject of subjects) {
    const rule = throttleRules[subject.kind];
    // One statement per subject: start afresh after a quiet spell, then count this failure.
    const [row] = await db
      .execute<{ failures: number }>(
        sql`
      INSERT INTO login_throttles (subject_kind, subject, failures, window_started_at)
      VALUES (${subject.kind}, ${subject.value}, 1, now())
      ON CONFLICT (subject_kind, subject) DO UPDATE SET
        failures = CASE WHEN login_throttles.updated_at < now() - make_interval(mins => ${rule.forgetAfterMinutes})
                        THEN 1 ELSE login_throttles.failures + 1 END,
        window_started_at = CASE WHEN login_throttles.updated_at < now() - make_interval(mins => ${rule.forgetAfterMinutes})
                        THEN now() ELSE login_throttles.window_started_at END,
        updated_at = now()
      RETURNING failures`,
      )
      .then((result) => result.rows);
    const delay = delayAfterFailures(subject.kind, Number(row!.failures));
    await db
      .update(loginThrottles)
      .set({ lockedUntil: delay > 0 ? sql`now() + make_interval(secs => ${delay})` : null })
      .where(and(eq(loginThrottles.subjectKind, subject.kind), eq(loginThrottles.subject, subject.value)));
  }
}

/** Clears a subject's failures and wait (after a sign-in, or an account's password reset). */
export async function clearFailures(db: Pick<Database, 'delete'>, subject: Subject): Promise<void> {
  await db.delete(loginThrottles).where(and(eq(loginThrottles.subjectKind, subject.kind), eq(loginThrottles.subject, subject.value)));
}

/** "1 second", "45 seconds", "2 minutes": the wait as the sign-in page says it. */
export function describeWait(seconds: number): string {
  if (seconds < 90) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minutes`;
}
