/**
 * The Misses page's and Settings page's domain operations, free of HTTP: listing and reading misses,
 * acknowledging, commenting, resolving, the Overview's summary, the organisation's settings and each
 * person's miss e-mail choice (rules: rule-service.ts). Refusals are HttpProblems the API writes as problem details.
 */
import { and, asc, desc, eq, gte, lte, or, sql, type SQL } from 'drizzle-orm';
import type {
  MissDetail,
  MissOverview,
  MissSummary,
  OrganisationSettings,
  OrganisationSettingsUpdate,
  missListQuerySchema,
} from '@loadwright/contracts';
import { missComments, missEvents, missRules, observations, organisation, series, users, type Database } from '@loadwright/db';
import { recordAudit, type Actor } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import type { z } from 'zod';
import type { EventDetail } from './miss-repository';
import { hourPointsOf, watchedSeries } from './miss-repository';
import { hourMs } from './hour-point';
import { ruleKindInfo } from './rule-kinds';

const eventColumns = {
  event: missEvents,
  seriesKey: series.key,
  seriesName: series.name,
  level: series.level,
  unit: series.unit,
  timeZone: series.timeZone,
  temperatureSeriesId: series.temperatureSeriesId,
  kind: missRules.kind,
};

type EventRow = {
  event: typeof missEvents.$inferSelect;
  seriesKey: string;
  seriesName: string;
  level: MissSummary['level'];
  unit: string;
  timeZone: string;
  kind: MissSummary['kind'];
};

function toSummary(row: EventRow): MissSummary {
  const detail = row.event.detail as Partial<EventDetail>;
  return {
    id: row.event.id,
    seriesId: row.event.seriesId,
    seriesKey: row.seriesKey,
    seriesName: row.seriesName,
    level: row.level,
    unit: row.unit,
    timeZone: row.timeZone,
    ruleId: row.event.ruleId,
    kind: row.kind,
    kindName: ruleKindInfo[row.kind].name,
    severity: row.event.severity,
    state: row.event.state,
    periodStart: row.event.periodStart.toISOString(),
    periodEnd: row.event.periodEnd.toISOString(),
    detectedAt: row.event.detectedAt.toISOString(),
    summary: detail.summary ?? ruleKindInfo[row.kind].name,
    cause: (row.event.cause as { words?: string } | null)?.words ?? null,
  };
}

/** Misses matching the filters, newest period first. */
export async function listMisses(db: Database, query: z.output<typeof missListQuerySchema>): Promise<MissSummary[]> {
  const where: SQL[] = [];
  if (query.series) where.push(or(eq(series.key, query.series), eq(sql`${series.id}::text`, query.series))!);
  if (query.level) where.push(eq(series.level, query.level));
  if (query.severity) where.push(eq(missEvents.severity, query.severity));
  if (query.state) where.push(eq(missEvents.state, query.state));
  if (query.from) where.push(gte(missEvents.periodEnd, new Date(query.from)));
  if (query.to) where.push(lte(missEvents.periodStart, new Date(query.to)));
  const rows = await db
    .select(eventColumns)
    .from(missEvents)
    .innerJoin(series, eq(series.id, missEvents.seriesId))
    .innerJoin(missRules, eq(missRules.id, missEvents.ruleId))
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(missEvents.periodStart), desc(missEvents.id))
    .limit(query.limit);
  return rows.map(toSummary);
}

/** One miss with its evidence, cause, comments and the chart of its period (12 hours either side). */
export async function missDetail(db: Database, id: number): Promise<MissDetail> {
  const [row] = await db
    .select(eventColumns)
    .from(missEvents)
    .innerJoin(series, eq(series.id, missEvents.seriesId))
    .innerJoin(missRules, eq(missRules.id, missEvents.ruleId))
    .where(eq(missEvents.id, id));
  if (!row) throw new HttpProblem('notFound', `No miss with id ${id}.`);
  const detail = row.event.detail as Partial<EventDetail>;
  const cause = (row.event.cause ?? {}) as { flags?: string[]; split?: MissDetail['split'] };
  const names = async (userId: number | null) =>
    userId === null ? null : ((await db.select({ name: users.displayName }).from(users).where(eq(users.id, userId)))[0]?.name ?? null);
  const comments = await db
    .select({ id: missComments.id, authorName: users.displayName, body: missComments.body, createdAt: missComments.createdAt })
    .from(missComments)
    .leftJoin(users, eq(users.id, missComments.authorId))
    .where(eq(missComments.eventId, id))
    .orderBy(asc(missComments.createdAt), asc(missComments.id));
  const from = new Date(row.event.periodStart.getTime() - 12 * hourMs);
  const to = new Date(Math.min(row.event.periodEnd.getTime() + 12 * hourMs, row.event.periodStart.getTime() + 14 * 24 * hourMs));
  const [watched] = await watchedSeries(db, [row.event.seriesId]);
  const points = watched ? await hourPointsOf(db, watched, from, to) : [];
  let temperatureUnit: string | null = null;
  const temperatures = new Map<number, number>();
  if (row.temperatureSeriesId) {
    const [station] = await db.select({ unit: series.unit }).from(series).where(eq(series.id, row.temperatureSeriesId));
    temperatureUnit = station?.unit ?? null;
    const readings = await db
      .select({ ts: observations.ts, value: observations.value, estimated: observations.estimated })
      .from(observations)
      .where(and(eq(observations.seriesId, row.temperatureSeriesId), gte(observations.ts, from), lte(observations.ts, to)));
    for (const reading of readings) {
      const value = reading.estimated ?? reading.value;
      if (value !== null) temperatures.set(reading.ts.getTime(), value);
    }
  }
  return {
    ...toSummary(row),
    versionId: row.event.versionId,
    hours: detail.hours ?? [],
    flags: cause.flags ?? [],
    split: cause.split ?? null,
    acknowledgedBy: await names(row.event.acknowledgedById),
    acknowledgedAt: row.event.acknowledgedAt?.toISOString() ?? null,
    resolvedBy: await names(row.event.resolvedById),
    resolvedAt: row.event.resolvedAt?.toISOString() ?? null,
    comments: comments.map((c) => ({ ...c, createdAt: c.createdAt.toISOString() })),
    chart: points.map((p) => ({
      ts: p.ts.toISOString(),
      actual: p.actual,
      forecast: p.forecast,
      lower95: p.lower95,
      upper95: p.upper95,
      temperature: temperatures.get(p.ts.getTime()) ?? null,
    })),
    temperatureUnit,
  };
}

/** Who is acting, as the miss columns need it. */
function personOf(actor: Actor): number | null {
  return actor.kind === 'user' ? actor.userId : null;
}

/** Acknowledges an open miss with a comment (anyone with misses.acknowledge); a second acknowledgement only adds the comment. */
export async function acknowledgeMiss(db: Database, id: number, comment: string, actor: Actor, ip?: string): Promise<void> {
  await db.transaction(async (tx) => {
    const [event] = await tx.select().from(missEvents).where(eq(missEvents.id, id)).for('update');
    if (!event) throw new HttpProblem('notFound', `No miss with id ${id}.`);
    if (event.state === 'resolved') throw new HttpProblem('conflict', 'This miss is resolved already; add a comment instead.');
    if (event.state === 'open')
      await tx
        .update(missEvents)
        .set({ state: 'acknowledged', acknowledgedAt: new Date(), acknowledgedById: personOf(actor) })
        .where(eq(missEvents.id, id));
    await tx.insert(missComments).values({ eventId: id, authorId: personOf(actor), body: comment });
    await recordAudit(tx, {
      actor,
      action: 'miss.acknowledged',
      targetType: 'miss',
      targetId: id,
      detail: { comment },
      ...(ip ? { ip } : {}),
    });
  });
}

/** Adds a comment to a miss. */
export async function commentOnMiss(db: Database, id: number, comment: string, actor: Actor): Promise<void> {
  const [event] = await db.select({ id: missEvents.id }).from(missEvents).where(eq(missEvents.id, id));
  if (!event) throw new HttpProblem('notFound', `No miss with id ${id}.`);
  await db.insert(missComments).values({ eventId: id, authorId: personOf(actor), body: comment });
}

/** Resolves a miss (acknowledging it on the way when still open). */
export async function resolveMiss(db: Database, id: number, comment: string | undefined, actor: Actor, ip?: string): Promise<void> {
  await db.transaction(async (tx) => {
    const [event] = await tx.select().from(missEvents).where(eq(missEvents.id, id)).for('update');
    if (!event) throw new HttpProblem('notFound', `No miss with id ${id}.`);
    if (event.state === 'resolved') throw new HttpProblem('conflict', 'This miss is resolved already.');
    const now = new Date();
    await tx
      .update(missEvents)
      .set({
        state: 'resolved',
        resolvedAt: now,
        resolvedById: personOf(actor),
        ...(event.acknowledgedAt ? {} : { acknowledgedAt: now, acknowledgedById: personOf(actor) }),
      })
      .where(eq(missEvents.id, id));
    if (comment) await tx.insert(missComments).values({ eventId: id, authorId: personOf(actor), body: comment });
    await recordAudit(tx, { actor, action: 'miss.resolved', targetType: 'miss', targetId: id, ...(ip ? { ip } : {}) });
  });
}

const severityRank = { low: 0, medium: 1, high: 2 } as const;

/** Open misses by severity and the five series with the most (highest severity first). */
export async function missOverview(db: Database): Promise<MissOverview> {
  const rows = await db
    .select({ id: missEvents.id, severity: missEvents.severity, seriesId: series.id, seriesKey: series.key, seriesName: series.name })
    .from(missEvents)
    .innerJoin(series, eq(series.id, missEvents.seriesId))
    .where(eq(missEvents.state, 'open'))
    .orderBy(desc(missEvents.periodStart));
  const open = { low: 0, medium: 0, high: 0 };
  const bySeries = new Map<number, MissOverview['worstSeries'][number]>();
  for (const row of rows) {
    open[row.severity]++;
    const entry = bySeries.get(row.seriesId) ?? {
      seriesId: row.seriesId,
      seriesKey: row.seriesKey,
      seriesName: row.seriesName,
      open: 0,
      highest: row.severity,
      latestMissId: row.id,
    };
    entry.open++;
    if (severityRank[row.severity] > severityRank[entry.highest]) {
      entry.highest = row.severity;
      entry.latestMissId = row.id;
    }
    bySeries.set(row.seriesId, entry);
  }
  const worstSeries = [...bySeries.values()]
    .sort((a, b) => severityRank[b.highest] - severityRank[a.highest] || b.open - a.open || a.seriesName.localeCompare(b.seriesName))
    .slice(0, 5);
  return { open, worstSeries };
}

/** The organisation's settings (defaults before the organisation exists). */
export async function readSettings(db: Database): Promise<OrganisationSettings> {
  const [row] = await db.select().from(organisation).limit(1);
  if (!row) throw new HttpProblem('notFound', 'The organisation is not set up yet (npm run seed creates the demo one).');
  const minute = row.forecastDeadlineMinute;
  return {
    name: row.name,
    timeZone: row.timeZone,
    refitHour: row.refitHour,
    forecastDeadline: `${String(Math.floor(minute / 60)).padStart(2, '0')}:${String(minute % 60).padStart(2, '0')}`,
    digestHour: row.digestHour,
    mailFrom: row.mailFrom,
    holidayCountry: row.holidayCountry,
    holidayRegion: row.holidayRegion,
  };
}

/** Changes the organisation's settings; an unknown time zone is refused with the reason. */
export async function updateSettings(db: Database, change: OrganisationSettingsUpdate, actor: Actor): Promise<OrganisationSettings> {
  if (change.timeZone !== undefined) {
    try {
      new Intl.DateTimeFormat('en-US', { timeZone: change.timeZone });
    } catch {
      throw new HttpProblem('invalidInput', `"${change.timeZone}" is not a time zone. Use an IANA name such as America/Chicago.`, [
        { pointer: '/timeZone', detail: 'Not an IANA time zone' },
      ]);
    }
  }
  const before = await readSettings(db);
  const { forecastDeadline, ...rest } = change;
  const set: Partial<typeof organisation.$inferInsert> = { ...rest };
  if (forecastDeadline) set.forecastDeadlineMinute = Number(forecastDeadline.slice(0, 2)) * 60 + Number(forecastDeadline.slice(3, 5));
  await db.update(organisation).set(set).where(eq(organisation.singleton, true));
  const after = await readSettings(db);
  const changes = Object.fromEntries(
    Object.keys(change).map((key) => [
      key,
      { from: before[key as keyof OrganisationSettings], to: after[key as keyof OrganisationSettings] },
    ]),
  );
  await recordAudit(db, { actor, action: 'settings.changed', targetType: 'organisation', detail: changes });
  return after;
}

/** A person's miss e-mail choice. */
export async function readMissMail(db: Database, userId: number) {
  const [row] = await db.select({ missMail: users.missMail }).from(users).where(eq(users.id, userId));
  if (!row) throw new HttpProblem('notFound', 'No such person.');
  return row;
}

/** Sets a person's miss e-mail choice. */
export async function setMissMail(db: Database, userId: number, missMail: (typeof users.missMail.enumValues)[number]) {
  await db.update(users).set({ missMail }).where(eq(users.id, userId));
  return { missMail };
}
