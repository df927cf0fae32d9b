/**
 * The Overview's accuracy card: over the days up to the newest scored hour, each series' MASE, MAPE,
 * skill against seasonal naive and 95 % coverage, computed in one grouped query over the stored hours
 * (the same definitions as accuracy-summary.ts), and a pooled skill for the whole network.
 * Pooled skill = 1 − mean(|e|/Q) / mean(|e_naive|/Q) over every hour with a naive value and a scale:
 * scaled errors are unit-free (Hyndman & Koehler 2006, §4), so kW feeders and MW zones pool fairly,
 * and the ratio is the skill score of Murphy (1988) on the scaled MAE.
 */
import type { AccuracyOverview } from '@loadwright/contracts';
import { skillScore } from '@loadwright/forecasting';
import { sql } from 'drizzle-orm';
import { scoredUntil, type ScoreDb } from './score-repository';

/** Series listed as missing most. */
export const worstListed = 5;

const dayMs = 86_400_000;

interface SeriesRow extends Record<string, unknown> {
  series_id: number;
  key: string;
  name: string;
  hours: number;
  mase: number | null;
  mape: number | null;
  mae_benchmarked: number | null;
  naive_mae: number | null;
  scaled_error_sum: number | null;
  scaled_naive_sum: number | null;
  coverage95: number;
}

/** Accuracy across series over the `days` days up to the newest scored hour. */
export async function accuracyOverview(db: ScoreDb, days: number): Promise<AccuracyOverview> {
  const to = await scoredUntil(db);
  if (!to) return { window: null, hours: 0, seriesCount: 0, skill: null, worst: [] };
  const from = new Date(to.getTime() - days * dayMs);
  const { rows } = await db.execute<SeriesRow>(sql`
    select h.series_id, s.key, s.name, count(*)::int as hours,
           avg(abs(h.actual - h.forecast) / h.scale) filter (where h.scale is not null) as mase,
           case when bool_and(h.actual <> 0) then avg(abs((h.actual - h.forecast) / h.actual)) * 100 end as mape,
           avg(abs(h.actual - h.forecast)) filter (where h.naive is not null) as mae_benchmarked,
           avg(abs(h.actual - h.naive)) filter (where h.naive is not null) as naive_mae,
           sum(abs(h.actual - h.forecast) / h.scale) filter (where h.scale is not null and h.naive is not null) as scaled_error_sum,
           sum(abs(h.actual - h.naive) / h.scale) filter (where h.scale is not null and h.naive is not null) as scaled_naive_sum,
           avg(case when h.actual between h.lower_95 and h.upper_95 then 1.0 else 0.0 end)::float8 as coverage95
      from forecast_hour_scores h
      join series s on s.id = h.series_id
     where h.ts >= ${from.toISOString()}::timestamptz and h.ts < ${to.toISOString()}::timestamptz and s.archived_at is null
     group by h.series_id, s.key, s.name`);
  const number = (value: unknown) => (value === null || value === undefined ? null : Number(value));
  const perSeries = rows.map((row) => {
    const mae = number(row.mae_benchmarked);
    const naive = number(row.naive_mae);
    return {
      seriesId: Number(row.series_id),
      key: row.key,
      name: row.name,
      hours: Number(row.hours),
      mase: number(row.mase),
      mape: number(row.mape),
      skill: mae !== null && naive !== null ? skillScore(mae, naive) : null,
      coverage95: Number(row.coverage95),
    };
  });
  const scaledError = rows.reduce((s, row) => s + (number(row.scaled_error_sum) ?? 0), 0);
  const scaledNaive = rows.reduce((s, row) => s + (number(row.scaled_naive_sum) ?? 0), 0);
  const anyPooled = rows.some((row) => row.scaled_naive_sum !== null);
  const worst = perSeries
    .filter((row) => row.mase !== null)
    .sort((a, b) => b.mase! - a.mase! || a.seriesId - b.seriesId)
    .slice(0, worstListed);
  return {
    window: { from: from.toISOString(), to: to.toISOString(), days },
    hours: perSeries.reduce((s, row) => s + row.hours, 0),
    seriesCount: perSeries.length,
    // Sums over the same hours: their ratio is the ratio of the two means.
    skill: anyPooled ? skillScore(scaledError, scaledNaive) : null,
    worst,
  };
}
