/**
 * E-mail about misses: at once for high severity (or for people who want every miss at once), in a
 * daily digest for the rest (or for people who want only the digest). Recipients are a rule's
 * addresses and roles; each person's choice in their account settings decides how they hear.
 * Mail is queued in the sent-mail log in the same transaction that marks the event notified.
 */
import { and, eq, gt, inArray, isNull, lte, sql } from 'drizzle-orm';
import { mailMessages, missEvents, missRules, organisation, series, users, type Database } from '@loadwright/db';
import { localClock } from '@loadwright/forecasts';
import { missAlertMessage, missDigestMessage, queueMail, type MissMailView, type QueuedMail } from '@loadwright/mail';
import type { EventDetail } from './miss-repository';
import { kilowattsPer, ruleKindInfo, type LoadUnit, type MissSeverity } from './rule-kinds';

type MissChoice = 'by_severity' | 'immediate' | 'digest' | 'none';

/** A person (or a bare address) who should hear about a rule's misses, and how they want to. */
export interface MissRecipient {
  email: string;
  userId: number | null;
  choice: MissChoice;
}

/** How a recipient hears about a miss of `severity`. */
export function deliveryFor(choice: MissChoice, severity: MissSeverity): 'immediate' | 'digest' | 'none' {
  if (choice === 'none') return 'none';
  if (choice === 'immediate') return 'immediate';
  if (choice === 'digest') return 'digest';
  return severity === 'high' ? 'immediate' : 'digest';
}

/**
 * A rule's recipients: `role:<role>` entries become the active people in that role, addresses of our
 * people take their choice, other addresses get the default (by severity). A rule without recipients
 * uses the organisation's default recipients.
 */
export async function recipientsOf(db: Pick<Database, 'select'>, entries: readonly string[]): Promise<MissRecipient[]> {
  let list = [...entries];
  if (list.length === 0) {
    const [org] = await db.select({ defaults: organisation.alertDefaults }).from(organisation).limit(1);
    list = org?.defaults.recipients ?? [];
  }
  const roles = list.filter((e) => e.startsWith('role:')).map((e) => e.slice(5));
  const addresses = list.filter((e) => !e.startsWith('role:')).map((e) => e.toLowerCase());
  const people = await db
    .select({ id: users.id, email: users.email, choice: users.missMail, role: users.role })
    .from(users)
    .where(
      and(
        eq(users.active, true),
        sql`(${users.role}::text = any(${sql.param(roles)}::text[]) or lower(${users.email}) = any(${sql.param(addresses)}::text[]))`,
      ),
    );
  const byEmail = new Map<string, MissRecipient>();
  for (const person of people) byEmail.set(person.email.toLowerCase(), { email: person.email, userId: person.id, choice: person.choice });
  for (const address of addresses) if (!byEmail.has(address)) byEmail.set(address, { email: address, userId: null, choice: 'by_severity' });
  return [...byEmail.values()];
}

/** Formats a load in the series' unit. */
function load(value: number | null, unit: LoadUnit): string {
  if (value === null) return '—';
  return `${value.toLocaleString('en-US', { maximumFractionDigits: 1, minimumFractionDigits: 1 })} ${unit}`;
}

/** The message view of an event. */
export function mailViewOf(
  event: typeof missEvents.$inferSelect,
  rule: { kind: keyof typeof ruleKindInfo; name: string },
  watched: { name: string; unit: string; timeZone: string },
  publicUrl: string,
): MissMailView {
  const unit = (watched.unit in kilowattsPer ? watched.unit : 'kW') as LoadUnit;
  const detail = event.detail as EventDetail;
  const local = (d: Date) => localClock(d, watched.timeZone);
  const start = local(event.periodStart);
  const end = local(event.periodEnd);
  const period = `${start.date} ${start.time.slice(0, 5)}–${end.date === start.date ? '' : `${end.date} `}${end.time.slice(0, 5)} (${watched.timeZone})`;
  const cause = (event.cause as { words?: string } | null)?.words ?? null;
  return {
    severity: event.severity,
    seriesName: watched.name,
    ruleName: ruleKindInfo[rule.kind].name,
    period,
    summary: detail.summary ?? rule.name,
    cause,
    hours: (detail.hours ?? []).map((hour) => {
      const clock = local(new Date(hour.ts));
      return {
        time: `${clock.date} ${clock.time.slice(0, 5)}`,
        actual: load(hour.actual, unit),
        forecast: load(hour.forecast, unit),
        band: hour.lower === null || hour.upper === null ? '—' : `${load(hour.lower, unit)} to ${load(hour.upper, unit)}`,
        error: hour.error === null ? '—' : `${hour.error > 0 ? '+' : ''}${load(hour.error, unit)}`,
      };
    }),
    link: `${publicUrl}/misses/${event.id}`,
  };
}

/** Loads events with their rule and series. */
async function eventsWithContext(db: Pick<Database, 'select'>, ids: number[]) {
  if (ids.length === 0) return [];
  return db
    .select({ event: missEvents, rule: missRules, series: { name: series.name, unit: series.unit, timeZone: series.timeZone } })
    .from(missEvents)
    .innerJoin(missRules, eq(missRules.id, missEvents.ruleId))
    .innerJoin(series, eq(series.id, missEvents.seriesId))
    .where(inArray(missEvents.id, ids));
}

/**
 * Queues the immediate e-mails for newly opened events not yet notified and marks them notified
 * (whether or not anyone wanted them at once). Returns the number of messages queued.
 */
export async function notifyNewMisses(db: Database, eventIds: readonly number[], publicUrl: string): Promise<number> {
  let queued = 0;
  for (const id of eventIds) {
    queued += await db.transaction(async (tx) => {
      const [locked] = await tx
        .select({ id: missEvents.id })
        .from(missEvents)
        .where(and(eq(missEvents.id, id), isNull(missEvents.notifiedAt)))
        .for('update');
      if (!locked) return 0;
      const [row] = await eventsWithContext(tx, [id]);
      if (!row) return 0;
      const recipients = await recipientsOf(tx, row.rule.recipients);
      const view = mailViewOf(row.event, row.rule, row.series, publicUrl);
      const messages: QueuedMail[] = recipients
        .filter((r) => deliveryFor(r.choice, row.event.severity) === 'immediate')
        .map((r) => ({ ...missAlertMessage(r.email, view), kind: 'miss_alert', userId: r.userId }));
      await queueMail(tx, messages);
      await tx.update(missEvents).set({ notifiedAt: new Date() }).where(eq(missEvents.id, id));
      return messages.length;
    });
  }
  return queued;
}

/**
 * The daily digest: for each recipient who gets some of the misses detected in the 24 hours before
 * `now` by digest, one message listing them. A recipient sent a digest in the last 20 hours is skipped,
 * so a repeated run adds nothing. Returns the number of digests queued.
 */
export async function sendMissDigest(db: Database, now: Date, publicUrl: string): Promise<number> {
  const since = new Date(now.getTime() - 24 * 3_600_000);
  const rows = await db
    .select({ event: missEvents, rule: missRules, series: { name: series.name, unit: series.unit, timeZone: series.timeZone } })
    .from(missEvents)
    .innerJoin(missRules, eq(missRules.id, missEvents.ruleId))
    .innerJoin(series, eq(series.id, missEvents.seriesId))
    .where(and(gt(missEvents.detectedAt, since), lte(missEvents.detectedAt, now)))
    .orderBy(missEvents.detectedAt);
  const byRecipient = new Map<string, { recipient: MissRecipient; views: MissMailView[] }>();
  for (const row of rows) {
    for (const recipient of await recipientsOf(db, row.rule.recipients)) {
      if (deliveryFor(recipient.choice, row.event.severity) !== 'digest') continue;
      const key = recipient.email.toLowerCase();
      const entry = byRecipient.get(key) ?? { recipient, views: [] };
      entry.views.push(mailViewOf(row.event, row.rule, row.series, publicUrl));
      byRecipient.set(key, entry);
    }
  }
  if (byRecipient.size === 0) return 0;
  const [org] = await db.select({ timeZone: organisation.timeZone }).from(organisation).limit(1);
  const date = localClock(now, org?.timeZone ?? 'UTC').date;
  return db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext('loadwright:miss-digest'))`);
    const recent = await tx
      .select({ recipient: mailMessages.recipient })
      .from(mailMessages)
      .where(and(eq(mailMessages.kind, 'miss_digest'), gt(mailMessages.queuedAt, new Date(now.getTime() - 20 * 3_600_000))));
    const done = new Set(recent.map((r) => r.recipient.toLowerCase()));
    const messages: QueuedMail[] = [...byRecipient.entries()]
      .filter(([key]) => !done.has(key))
      .map(([, { recipient, views }]) => ({
        ...missDigestMessage(recipient.email, date, views),
        kind: 'miss_digest',
        userId: recipient.userId,
      }));
    await queueMail(tx, messages);
    return messages.length;
  });
}

/** True when `now` falls in the organisation's digest hour (local). */
export async function isDigestHour(db: Pick<Database, 'select'>, now: Date): Promise<boolean> {
  const [org] = await db.select({ timeZone: organisation.timeZone, digestHour: organisation.digestHour }).from(organisation).limit(1);
  const hour = Number(localClock(now, org?.timeZone ?? 'UTC').time.slice(0, 2));
  return hour === (org?.digestHour ?? 7);
}
