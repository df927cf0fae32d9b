/**
 * Writes one series' refit in ONE transaction: the fit, a new draft forecast version (superseding the
 * previous draft; approved versions are never touched) and its points, and the run-series row marked
 * done. The run-series row is locked first, so a duplicated or retried job that arrives after the
 * version was written finds it done and writes nothing (the unique key on (refit_run_id, series_id)
 * backs this up). Then the series row is locked (FOR NO KEY UPDATE, as approvals do), so two writes of
 * one series, whatever let them run at once, take turns and never both insert a draft. Under that lock
 * a version written by a newer run wins: a late retry of an older run records its series as done
 * without a version and leaves the newer draft in place.
 */
import { createHash } from 'node:crypto';
import type pg from 'pg';
import type { SeriesModelOutcome } from './fit-series-model';
import { RefitDataError } from './refit-errors';
import type { RefitInputs } from './series-window';

/** How the write ended. */
export type WriteResult =
  | { written: true; fitId: number; versionId: number }
  | { written: false; reason: 'already-done' | 'not-in-run' }
  | { written: false; reason: 'newer-run'; newerRunId: number };

/** Phase times recorded with the run-series row. */
export interface PhaseTimings {
  read: number;
  fit: number;
  /** CPU milliseconds of the fit. */
  fitCpu: number;
  diagnose: number;
  forecast: number;
  write?: number;
}

/** Writes fit, version, points and status for (runId, series); see the file comment. */
export async function writeRefit(
  pool: pg.Pool,
  runId: number,
  inputs: RefitInputs,
  outcome: SeriesModelOutcome,
  timings: PhaseTimings,
  startedMs: number,
): Promise<WriteResult> {
  const points = pointColumns(outcome);
  const seriesId = inputs.series.id;
  const written = performance.now();
  const client = await pool.connect();
  try {
    await client.query('begin');
    const state = await client.query<{ status: string }>(
      'select status from refit_run_series where run_id = $1 and series_id = $2 for update',
      [runId, seriesId],
    );
    if (state.rows.length === 0) {
      await client.query('rollback');
      return { written: false, reason: 'not-in-run' };
    }
    if (state.rows[0]!.status === 'done') {
      await client.query('rollback');
      return { written: false, reason: 'already-done' };
    }
    await client.query('select 1 from series where id = $1 for no key update', [seriesId]);
    const newer = await client.query<{ run_id: number }>(
      'select max(refit_run_id) as run_id from forecast_versions where series_id = $1 and refit_run_id > $2',
      [seriesId, runId],
    );
    const newerRunId = newer.rows[0]?.run_id ?? null;
    if (newerRunId !== null) {
      await client.query(
        `update refit_run_series set status = 'done', error = $3, finished_at = now(), duration_ms = $4 where run_id = $1 and series_id = $2`,
        [
          runId,
          seriesId,
          `Not kept: run ${newerRunId} had already written a newer draft for this series.`,
          Math.round(performance.now() - startedMs),
        ],
      );
      await countDone(client, runId);
      await client.query('commit');
      return { written: false, reason: 'newer-run', newerRunId };
    }
    const fitId = await insertFit(client, inputs, outcome);
    await client.query(
      `update forecast_versions set state = 'superseded', superseded_at = now() where series_id = $1 and state = 'draft'`,
      [seriesId],
    );
    const warnings = outcome.diagnostics.warnings;
    const version = await client.query<{ id: string }>(
      `insert into forecast_versions (series_id, fit_id, refit_run_id, state, origin, horizon_hours, levels, warnings, band_kind, bands)
       values ($1, $2, $3, 'draft', to_timestamp($4::float8 / 1000), $5, $6, $7, $8, $9) returning id`,
      [
        seriesId,
        fitId,
        runId,
        points.ts[0],
        points.ts.length,
        inputs.settings.levels,
        JSON.stringify(warnings),
        outcome.bands.kind,
        JSON.stringify({
          scale: outcome.bands.scale,
          origins: outcome.bands.origins,
          scores: outcome.bands.scores,
          reason: outcome.bands.reason,
        }),
      ],
    );
    const versionId = Number(version.rows[0]!.id);
    await client.query(
      `insert into forecast_points (version_id, ts, mean, std_error, lower_80, upper_80, lower_95, upper_95)
       select $1, to_timestamp(t / 1000), m, s, l80, u80, l95, u95
         from unnest($2::float8[], $3::float8[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[]) as u(t, m, s, l80, u80, l95, u95)`,
      [versionId, points.ts, points.mean, points.se, points.lower80, points.upper80, points.lower95, points.upper95],
    );
    const phaseMs = { ...roundTimings(timings), write: Math.round((performance.now() - written) * 10) / 10 };
    await client.query(
      `update refit_run_series set status = 'done', error = null, fit_id = $3, phase_ms = $4, finished_at = now(), duration_ms = $5
        where run_id = $1 and series_id = $2`,
      [runId, seriesId, fitId, JSON.stringify(phaseMs), Math.round(performance.now() - startedMs)],
    );
    await countDone(client, runId);
    await client.query('commit');
    return { written: true, fitId, versionId };
  } catch (error) {
    await client.query('rollback').catch(() => {});
    throw error;
  } finally {
    client.release();
  }
}

/** Counts one more series done on the run, finishing the run if it was the last. */
async function countDone(client: pg.PoolClient, runId: number): Promise<void> {
  await client.query(
    `update refit_runs set series_done = series_done + 1,
            finished_at = case when series_done + 1 + series_failed >= series_total then now() else finished_at end
      where id = $1`,
    [runId],
  );
}

/** Inserts the fit row; returns its id. */
async function insertFit(client: pg.PoolClient, inputs: RefitInputs, outcome: SeriesModelOutcome): Promise<number> {
  const { model, data } = outcome;
  const arma = model.arma;
  const parameters: Record<string, unknown> = arma
    ? {
        mean: arma.mean,
        ar: arma.ar,
        ma: arma.ma,
        regression: { names: model.regression.names, coefficients: model.regression.coefficients, dropped: model.regression.dropped },
      }
    : { seasonalNaive: model.seasonalNaive };
  // The scale the ARMA part and σ² are on: log load when the settings asked for logs.
  parameters['log'] = model.spec.log;
  if (model.profile)
    parameters['profile'] = {
      slot: model.profile.slot,
      form: model.profile.form,
      level: model.profile.level,
      effect: Array.from(model.profile.effect),
    };
  const standardErrors = arma ? { ...arma.stderr, regression: model.regression.stderr } : null;
  const methodColumn = {
    'yule-walker': 'yule_walker',
    cmle: 'conditional_mle',
    nls: 'nls_arma',
    ridge: 'ridge_ar',
    lasso: 'lasso_ar',
    'seasonal-naive': 'seasonal_naive',
  }[outcome.method];
  const hash = createHash('sha256')
    .update(new Uint8Array(data.values.buffer, data.values.byteOffset, data.values.byteLength))
    .digest('hex');
  const n = data.values.length;
  const { rows } = await client.query<{ id: string }>(
    `insert into fits (series_id, spec_snapshot, method, ar_order, ma_order, parameters, standard_errors, sigma2, log_likelihood, aic, aicc, bic,
                       diagnostics, selection, data_start, data_end, observation_count, data_hash, duration_ms)
     values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, to_timestamp($15::float8 / 1000), to_timestamp($16::float8 / 1000), $17, $18, $19)
     returning id`,
    [
      inputs.series.id,
      JSON.stringify(inputs.settings),
      methodColumn,
      arma?.p ?? 0,
      arma?.q ?? 0,
      JSON.stringify(parameters),
      standardErrors ? JSON.stringify(standardErrors) : null,
      finiteOrNull(arma?.sigma2 ?? model.seasonalNaive?.sigma2),
      finiteOrNull(arma?.loglik),
      finiteOrNull(arma?.aic),
      finiteOrNull(arma?.aicc),
      finiteOrNull(arma?.bic),
      JSON.stringify(outcome.diagnostics),
      outcome.selection ? JSON.stringify(outcome.selection) : null,
      data.timestamps[0],
      data.timestamps[n - 1],
      n,
      hash,
      Math.round(outcome.timings.fit),
    ],
  );
  return Number(rows[0]!.id);
}

/** The forecast as point columns (mean, se, 80 % and 95 % bounds); refuses non-finite numbers. */
function pointColumns(outcome: SeriesModelOutcome) {
  const { forecast } = outcome;
  const at = (level: number) => {
    const interval = forecast.intervals.find((i) => i.level === level);
    if (!interval) throw new Error(`the forecast has no ${level} % interval`);
    return interval;
  };
  const i80 = at(80);
  const i95 = at(95);
  const columns = {
    ts: Array.from(forecast.timestamps),
    mean: Array.from(forecast.mean),
    se: Array.from(forecast.se),
    lower80: Array.from(i80.lower),
    upper80: Array.from(i80.upper),
    lower95: Array.from(i95.lower),
    upper95: Array.from(i95.upper),
  };
  for (const [name, values] of Object.entries(columns)) {
    if (values.some((v) => !Number.isFinite(v)))
      throw new RefitDataError(`the forecast's ${name} is not finite: the model is unusable for this series`);
  }
  return columns;
}

/** Null for a missing or non-finite number (JSON and SQL have no NaN). */
function finiteOrNull(value: number | null | undefined): number | null {
  return value !== null && value !== undefined && Number.isFinite(value) ? value : null;
}

/** Timings to a tenth of a millisecond. */
function roundTimings(timings: PhaseTimings): PhaseTimings {
  return Object.fromEntries(Object.entries(timings).map(([k, v]) => [k, Math.round(v * 10) / 10])) as unknown as PhaseTimings;
}
