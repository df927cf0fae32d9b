/**
 * Miss rules as people see and change them, free of HTTP: every rule, the rules in force for one series
 * or group kind by kind, changing a rule (the defaults need an admin), and a planner's overrides for a
 * group (level) or one series: add, change, remove. Refusals are HttpProblems in sentences.
 */
import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import type { MissRule, MissRulesInForce, MissRuleUpdate, missRuleCreateSchema, missRulesInForceQuerySchema } from '@loadwright/contracts';
import { missRules, series, type Database } from '@loadwright/db';
import { recordAudit, type Actor } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import type { z } from 'zod';
import { missRuleKinds, ruleKindInfo, type MissRuleKind, type RuleParameter } from './rule-kinds';
import { rulesInForce } from './rules-in-force';

type RuleRow = typeof missRules.$inferSelect;

/** A stored rule as the API sends it, with its kind's words and the parameters it reads. */
export function toRule(rule: RuleRow): MissRule {
  const info = ruleKindInfo[rule.kind];
  return {
    id: rule.id,
    name: rule.name,
    kind: rule.kind,
    kindName: info.name,
    watches: info.watches,
    thresholdMeaning: info.threshold,
    reads: [...info.reads],
    scope: rule.scope,
    scopeLevel: rule.scopeLevel,
    scopeSeriesId: rule.scopeSeriesId,
    hours: rule.hours,
    threshold: rule.threshold,
    bandLevel: rule.bandLevel,
    floorKw: rule.floorKw,
    peakHourTolerance: rule.peakHourTolerance,
    severity: rule.severity,
    recipients: rule.recipients,
    active: rule.active,
  };
}

/** Every rule not removed: defaults first, then overrides by group, then by series. */
export async function listRules(db: Database): Promise<MissRule[]> {
  const rows = await db
    .select()
    .from(missRules)
    .where(isNull(missRules.removedAt))
    .orderBy(sql`case ${missRules.scope} when 'all' then 0 when 'level' then 1 else 2 end`, asc(missRules.id));
  return rows.map(toRule);
}

/** What each parameter is called in a refusal. */
const parameterWords: Record<RuleParameter, string> = {
  hours: 'a number of hours in a row',
  threshold: 'a threshold',
  bandLevel: 'a band level',
  floorKw: 'a load floor',
  peakHourTolerance: 'a peak hour tolerance',
};

/**
 * Refuses values for parameters the kind does not read (they would be ignored, and a planner reading
 * the rule would believe them), naming each field. `hours` is always stored, so only a change to it is refused.
 */
function checkParameters(kind: MissRuleKind, values: Partial<Record<RuleParameter, number | null>>, hoursChanged: boolean): void {
  const reads = ruleKindInfo[kind].reads;
  const refused = (Object.keys(parameterWords) as RuleParameter[]).filter((key) => {
    if (reads.includes(key)) return false;
    if (key === 'hours') return hoursChanged && values.hours !== undefined && values.hours !== 1;
    return values[key] !== undefined && values[key] !== null;
  });
  if (refused.length === 0) return;
  const name = ruleKindInfo[kind].name;
  throw new HttpProblem(
    'invalidInput',
    `${name} takes no ${refused.map((key) => parameterWords[key].replace(/^an? /, '')).join(' and no ')}; leave ${refused.length === 1 ? 'that field' : 'those fields'} empty.`,
    refused.map((key) => ({ pointer: `/${key}`, detail: `${name} does not use ${parameterWords[key]}` })),
  );
}

/** Changes a rule: defaults (scope all) need admin.settings, overrides misses.rules (checked by the caller via `mayChangeDefaults`). */
export async function updateRule(
  db: Database,
  id: number,
  change: MissRuleUpdate,
  actor: Actor,
  mayChangeDefaults: boolean,
): Promise<MissRule> {
  return db.transaction(async (tx) => {
    const [rule] = await tx
      .select()
      .from(missRules)
      .where(and(eq(missRules.id, id), isNull(missRules.removedAt)))
      .for('update');
    if (!rule) throw new HttpProblem('notFound', `No miss rule with id ${id}.`);
    if (rule.scope === 'all' && !mayChangeDefaults)
      throw new HttpProblem('forbidden', 'Only an admin changes the default rules; add an override for your series or group instead.');
    checkParameters(rule.kind, change, change.hours !== undefined && change.hours !== rule.hours);
    const [row] = await tx
      .update(missRules)
      .set({ ...change, updatedAt: new Date() })
      .where(eq(missRules.id, id))
      .returning();
    await recordAudit(tx, {
      actor,
      action: 'miss_rule.changed',
      targetType: 'miss_rule',
      targetId: id,
      detail: change as Record<string, unknown>,
    });
    return toRule(row!);
  });
}

/** Who is acting, as the rule's creator column needs it. */
function personOf(actor: Actor): number | null {
  return actor.kind === 'user' ? actor.userId : null;
}

/** The load series an override names, or a refusal saying why it cannot have one. */
async function overrideSeries(db: Pick<Database, 'select'>, id: number) {
  const [row] = await db
    .select({ id: series.id, key: series.key, name: series.name, kind: series.kind, archivedAt: series.archivedAt })
    .from(series)
    .where(eq(series.id, id));
  if (!row || row.kind !== 'load')
    throw new HttpProblem('invalidInput', `There is no load series with id ${id}; overrides are for load series.`, [
      { pointer: '/scopeSeriesId', detail: 'Not a load series' },
    ]);
  if (row.archivedAt) throw new HttpProblem('conflict', `${row.name} is archived, so no misses are looked for on it.`);
  return row;
}

/** Adds a planner's override of one kind for a group (level) or one series, with its audit row in the same transaction. */
export async function createRuleOverride(db: Database, body: z.output<typeof missRuleCreateSchema>, actor: Actor): Promise<MissRule> {
  if (body.scope === 'level' && !body.scopeLevel)
    throw new HttpProblem('invalidInput', 'Name the group (level) this override is for.', [
      { pointer: '/scopeLevel', detail: 'Required for a group override' },
    ]);
  if (body.scope === 'series' && !body.scopeSeriesId)
    throw new HttpProblem('invalidInput', 'Name the series this override is for.', [
      { pointer: '/scopeSeriesId', detail: 'Required for a series override' },
    ]);
  checkParameters(body.kind, body, true);
  return db.transaction(async (tx) => {
    const target = body.scope === 'series' ? (await overrideSeries(tx, body.scopeSeriesId!)).name : `every ${body.scopeLevel}`;
    // One live override of a kind per target: serialise additions so two at once cannot both pass the check.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext('loadwright:miss-rule-override'))`);
    const [existing] = await tx
      .select({ id: missRules.id })
      .from(missRules)
      .where(
        and(
          eq(missRules.kind, body.kind),
          eq(missRules.scope, body.scope),
          body.scope === 'series' ? eq(missRules.scopeSeriesId, body.scopeSeriesId!) : eq(missRules.scopeLevel, body.scopeLevel!),
          isNull(missRules.removedAt),
        ),
      );
    if (existing)
      throw new HttpProblem(
        'conflict',
        `${ruleKindInfo[body.kind].name} already has an override for ${target} (rule ${existing.id}); change that one instead.`,
      );
    const [row] = await tx
      .insert(missRules)
      .values({
        name: `${ruleKindInfo[body.kind].name} for ${target}`,
        kind: body.kind,
        scope: body.scope,
        scopeLevel: body.scope === 'level' ? body.scopeLevel! : null,
        scopeSeriesId: body.scope === 'series' ? body.scopeSeriesId! : null,
        hours: body.hours,
        threshold: body.threshold,
        bandLevel: body.bandLevel,
        floorKw: body.floorKw,
        peakHourTolerance: body.peakHourTolerance,
        severity: body.severity,
        recipients: body.recipients,
        active: body.active,
        createdById: personOf(actor),
      })
      .returning();
    await recordAudit(tx, {
      actor,
      action: 'miss_rule.added',
      targetType: 'miss_rule',
      targetId: row!.id,
      detail: { kind: body.kind, scope: body.scope, target },
    });
    return toRule(row!);
  });
}

/**
 * Removes an override: the default (or the group's override) applies again from the next detection. The
 * row stays, marked removed, so the misses it found keep their rule.
 */
export async function removeRuleOverride(db: Database, id: number, actor: Actor): Promise<{ message: string }> {
  return db.transaction(async (tx) => {
    const [rule] = await tx
      .select()
      .from(missRules)
      .where(and(eq(missRules.id, id), isNull(missRules.removedAt)))
      .for('update');
    if (!rule) throw new HttpProblem('notFound', `No miss rule with id ${id}.`);
    if (rule.scope === 'all')
      throw new HttpProblem('conflict', 'A default rule cannot be removed; an admin switches it off in Settings instead.');
    await tx.update(missRules).set({ removedAt: new Date(), updatedAt: new Date() }).where(eq(missRules.id, id));
    await recordAudit(tx, { actor, action: 'miss_rule.removed', targetType: 'miss_rule', targetId: id, detail: { name: rule.name } });
    const fallsBackTo = rule.scope === 'series' ? 'the group override or the default' : 'the default';
    return { message: `Override removed: ${ruleKindInfo[rule.kind].name} follows ${fallsBackTo} again.` };
  });
}

/** The rules in force for one series or one group (level), kind by kind, with the override set at exactly that place. */
export async function rulesInForceFor(db: Database, query: z.output<typeof missRulesInForceQuerySchema>): Promise<MissRulesInForce> {
  if ((query.series === undefined) === (query.level === undefined))
    throw new HttpProblem(
      'invalidInput',
      'Ask for the rules of one series (series=<id>) or of one group (level=<level>), not both or neither.',
      [{ pointer: '/series', detail: 'Give a series or a level' }],
    );
  let target: { id: number; level: string | null };
  let seriesOut: MissRulesInForce['series'] = null;
  if (query.series !== undefined) {
    const [row] = await db
      .select({ id: series.id, key: series.key, name: series.name, unit: series.unit, kind: series.kind, level: series.level })
      .from(series)
      .where(eq(series.id, query.series));
    if (!row || row.kind !== 'load') throw new HttpProblem('notFound', `No load series with id ${query.series}.`);
    target = { id: row.id, level: row.level };
    seriesOut = { id: row.id, key: row.key, name: row.name, unit: row.unit };
  } else {
    // A group stands for any series of that level that has no override of its own.
    target = { id: 0, level: query.level! };
  }
  const rows = await db.select().from(missRules).where(isNull(missRules.removedAt)).orderBy(asc(missRules.id));
  const applicable = rows.filter((rule) => query.series !== undefined || rule.scope !== 'series');
  const inForce = rulesInForce(applicable, target);
  const sourceOf = { all: 'default', level: 'level', series: 'series' } as const;
  return {
    scope: query.series !== undefined ? 'series' : 'level',
    level: (target.level as MissRulesInForce['level']) ?? null,
    series: seriesOut,
    kinds: missRuleKinds.map((kind) => {
      const rule = inForce.find((candidate) => candidate.kind === kind) ?? null;
      // The most specific rule of the kind, active or not, says where the answer comes from.
      const candidates = applicable.filter(
        (candidate) =>
          candidate.kind === kind &&
          (candidate.scope === 'all' ||
            (candidate.scope === 'level' && candidate.scopeLevel === target.level) ||
            (candidate.scope === 'series' && candidate.scopeSeriesId === target.id)),
      );
      const deciding = candidates.find((c) => c.scope === 'series') ?? candidates.find((c) => c.scope === 'level') ?? candidates[0];
      const override =
        query.series !== undefined
          ? candidates.find((c) => c.scope === 'series')
          : candidates.find((c) => c.scope === 'level' && c.scopeLevel === query.level);
      return {
        kind,
        kindName: ruleKindInfo[kind].name,
        watches: ruleKindInfo[kind].watches,
        inForce: rule ? toRule(rule) : null,
        source: deciding ? sourceOf[deciding.scope] : 'default',
        override: override ? toRule(override) : null,
      };
    }),
  };
}
