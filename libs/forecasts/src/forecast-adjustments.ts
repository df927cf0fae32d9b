/**
 * Adding and removing a planner's adjustments of a draft. The layer lives beside the model's points,
 * which never change; see adjustment-layer.ts for how adjusted numbers are computed.
 */
import { plausibleAdjustmentShare, type CreateAdjustmentRequest, type ForecastAdjustment } from '@loadwright/contracts';
import { forecastAdjustments, forecastPoints, forecastVersions, users, type Database } from '@loadwright/db';
import { and, eq, gte, lt, sql } from 'drizzle-orm';
import type { Actor } from '@loadwright/audit';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import { sqlState, versionNotDraftState } from './database-errors';
import { adjustPoints } from './adjustment-layer';
import { adjustmentsOf, pointsOf } from './forecast-repository';

/** Who did it and from where, for the audit log. */
export interface Caller {
  actor: Actor;
  ip?: string;
}

type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];

/** Locks a version row and checks it is a draft; throws not found or conflict otherwise. */
async function lockDraft(tx: Transaction, versionId: number): Promise<{ id: number; seriesId: number }> {
  const [version] = await tx
    .select({ id: forecastVersions.id, seriesId: forecastVersions.seriesId, state: forecastVersions.state })
    .from(forecastVersions)
    .where(eq(forecastVersions.id, versionId))
    .for('update');
  if (!version) throw new HttpProblem('notFound', `No forecast version with id ${versionId}.`);
  if (version.state !== 'draft') {
    throw new HttpProblem(
      'conflict',
      `Forecast version ${versionId} is ${version.state}; only a draft can be adjusted. Adjust the current draft instead.`,
    );
  }
  return version;
}

/** Turns the immutability trigger's refusal (a race lost to an approval) into a conflict. */
function asConflict(error: unknown, versionId: number): never {
  if (sqlState(error) === versionNotDraftState)
    throw new HttpProblem('conflict', `Forecast version ${versionId} was approved meanwhile; only a draft can be adjusted.`);
  throw error;
}

/** Formats a number of the series' unit for a message: 1,234.5. */
function amountText(value: number): string {
  return value.toLocaleString('en-US', { maximumFractionDigits: 1 });
}

/**
 * Refuses an adjustment whose result is below zero load where the model's own mean is not (a series
 * that can run negative, like a feeder exporting solar, keeps its sign), and asks for confirmation of
 * a change beyond plausibleAdjustmentShare of the numbers before it.
 */
async function checkAdjustedLoad(
  tx: Transaction,
  versionId: number,
  request: CreateAdjustmentRequest,
  from: Date,
  to: Date,
): Promise<void> {
  const points = (await pointsOf(tx, [versionId])).get(versionId)!;
  const existing = (await adjustmentsOf(tx, [versionId])).get(versionId)!;
  const proposed = { id: Number.MAX_SAFE_INTEGER, periodStart: from, periodEnd: to, kind: request.kind, amount: request.amount };
  const before = adjustPoints(points, existing);
  const after = adjustPoints(points, [...existing, proposed]);
  let lowest: { value: number; ts: Date } | null = null;
  let largestShare = 0;
  for (const [i, point] of points.entries()) {
    if (!(from <= point.ts && point.ts < to)) continue;
    const previous = before[i]?.mean ?? point.mean;
    const next = after[i]!.mean;
    if (next < 0 && point.mean >= 0 && (lowest === null || next < lowest.value)) lowest = { value: next, ts: point.ts };
    if (previous !== 0) largestShare = Math.max(largestShare, Math.abs(next - previous) / Math.abs(previous));
  }
  if (lowest) {
    throw new HttpProblem(
      'invalidInput',
      `The adjusted forecast would fall to ${amountText(lowest.value)} at ${lowest.ts.toISOString()}, below zero load. Choose a smaller shift or a scale factor.`,
      [{ pointer: '/amount', detail: `This would take the load below zero (to ${amountText(lowest.value)} at the lowest hour)` }],
    );
  }
  if (largestShare > plausibleAdjustmentShare && !request.confirmLargeChange) {
    const percent = Math.round(largestShare * 100);
    throw new HttpProblem(
      'invalidInput',
      `This changes the forecast by up to ${percent} % of its value, more than the ${plausibleAdjustmentShare * 100} % a known event usually does. Check the amount and its unit, then confirm the change.`,
      [{ pointer: '/confirmLargeChange', detail: `Confirm a change of up to ${percent} % of the forecast` }],
    );
  }
}

/** Adds an adjustment to a draft; the period must cover at least one of its intervals. */
export async function addAdjustment(
  db: Database,
  versionId: number,
  request: CreateAdjustmentRequest,
  { actor, ip }: Caller,
): Promise<ForecastAdjustment> {
  const from = new Date(request.from);
  const to = new Date(request.to);
  return db
    .transaction(async (tx) => {
      const version = await lockDraft(tx, versionId);
      const [{ intervals }] = (await tx
        .select({ intervals: sql<number>`count(*)::int` })
        .from(forecastPoints)
        .where(and(eq(forecastPoints.versionId, versionId), gte(forecastPoints.ts, from), lt(forecastPoints.ts, to)))) as [
        { intervals: number },
      ];
      if (intervals === 0) {
        throw new HttpProblem(
          'invalidInput',
          'The period covers none of the forecast intervals of this version. Choose from/to within its horizon.',
          [{ pointer: '/from', detail: 'The period lies outside the forecast horizon' }],
        );
      }
      await checkAdjustedLoad(tx, versionId, request, from, to);
      const [row] = await tx
        .insert(forecastAdjustments)
        .values({
          versionId,
          periodStart: from,
          periodEnd: to,
          kind: request.kind,
          amount: request.amount,
          reason: request.reason,
          createdById: actor.kind === 'user' ? actor.userId : null,
        })
        .returning();
      await recordAudit(tx, {
        actor,
        action: 'forecast.adjusted',
        targetType: 'forecast_version',
        targetId: versionId,
        detail: {
          seriesId: version.seriesId,
          adjustmentId: row!.id,
          kind: request.kind,
          amount: request.amount,
          from: from.toISOString(),
          to: to.toISOString(),
          reason: request.reason,
        },
        ip,
      });
      const [creator] =
        row!.createdById === null ? [] : await tx.select({ name: users.displayName }).from(users).where(eq(users.id, row!.createdById));
      return {
        id: row!.id,
        versionId,
        from: from.toISOString(),
        to: to.toISOString(),
        kind: row!.kind,
        amount: row!.amount,
        reason: row!.reason,
        createdBy: row!.createdById !== null && creator ? { id: row!.createdById, name: creator.name } : null,
        createdAt: row!.createdAt.toISOString(),
        intervals,
      };
    })
    .catch((error: unknown) => asConflict(error, versionId));
}

/** Removes an adjustment from a draft. */
export async function removeAdjustment(db: Database, versionId: number, adjustmentId: number, { actor, ip }: Caller): Promise<void> {
  await db
    .transaction(async (tx) => {
      const version = await lockDraft(tx, versionId);
      const [removed] = await tx
        .delete(forecastAdjustments)
        .where(and(eq(forecastAdjustments.id, adjustmentId), eq(forecastAdjustments.versionId, versionId)))
        .returning();
      if (!removed) throw new HttpProblem('notFound', `Forecast version ${versionId} has no adjustment with id ${adjustmentId}.`);
      await recordAudit(tx, {
        actor,
        action: 'forecast.adjustment_removed',
        targetType: 'forecast_version',
        targetId: versionId,
        detail: {
          seriesId: version.seriesId,
          adjustmentId,
          kind: removed.kind,
          amount: removed.amount,
          from: removed.periodStart.toISOString(),
          to: removed.periodEnd.toISOString(),
          reason: removed.reason,
        },
        ip,
      });
    })
    .catch((error: unknown) => asConflict(error, versionId));
}
