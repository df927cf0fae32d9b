/** Reading and changing a series' model settings and reading its newest fit, without HTTP. */
import type { FitSummary, ModelSettings, ModelSettingsRequest } from '@loadwright/contracts';
import { fitDiagnosticsSchema, fitSelectionSchema } from '@loadwright/contracts';
import { modelSpecs, type Database } from '@loadwright/db';
import { eq } from 'drizzle-orm';
import type pg from 'pg';
import { contractMethod, defaultModelSettings, rowValuesFromSettings, settingsFromRow, type ModelSpecRow } from './model-settings';

/** A series that has no model settings because it is not a load series, or does not exist. */
export class NoModelError extends Error {
  override readonly name = 'NoModelError';
}

/** The settings of load series `seriesId` (defaults when none were stored). */
export async function readModelSettings(db: Database, pool: pg.Pool, seriesId: number): Promise<ModelSettings> {
  const { rows } = await pool.query<{
    kind: string;
    t_id: number | null;
    t_key: string | null;
    t_name: string | null;
    t_unit: string | null;
    created_at: Date;
  }>(
    `select s.kind, s.created_at, t.id as t_id, t.key as t_key, t.name as t_name, t.unit as t_unit
       from series s left join series t on t.id = s.temperature_series_id where s.id = $1`,
    [seriesId],
  );
  const series = rows[0];
  if (!series) throw new NoModelError(`No series with id ${seriesId}.`);
  if (series.kind !== 'load') throw new NoModelError(`Series ${seriesId} is a temperature series; only load series have a model.`);
  const [spec] = await db.select().from(modelSpecs).where(eq(modelSpecs.seriesId, seriesId));
  let updatedBy: string | null = null;
  if (spec?.updatedById) {
    const user = await pool.query<{ display_name: string }>('select display_name from users where id = $1', [spec.updatedById]);
    updatedBy = user.rows[0]?.display_name ?? null;
  }
  return {
    ...(spec ? settingsFromRow(spec as ModelSpecRow) : defaultModelSettings),
    seriesId,
    temperatureSeries: series.t_id === null ? null : { id: series.t_id, key: series.t_key!, name: series.t_name!, unit: series.t_unit! },
    updatedAt: (spec?.updatedAt ?? series.created_at).toISOString(),
    updatedBy,
  };
}

/** Stores new settings for `seriesId` (insert or replace). */
export async function writeModelSettings(
  db: Pick<Database, 'insert'>,
  seriesId: number,
  settings: ModelSettingsRequest,
  updatedById: number | null,
): Promise<void> {
  const values = rowValuesFromSettings(settings, updatedById);
  await db
    .insert(modelSpecs)
    .values({ seriesId, ...values })
    .onConflictDoUpdate({ target: modelSpecs.seriesId, set: values });
}

/** A fits row as the newest-fit query returns it (bigint id as text, jsonb parsed). */
interface FitRow {
  id: string;
  series_id: number;
  method: ModelSpecRow['method'];
  ar_order: number;
  ma_order: number;
  parameters: Record<string, unknown>;
  standard_errors: Record<string, unknown> | null;
  sigma2: number;
  aic: number | null;
  bic: number | null;
  data_start: Date;
  data_end: Date;
  observation_count: number;
  duration_ms: number;
  created_at: Date;
  diagnostics: unknown;
  selection: unknown;
}

/** The newest fit of `seriesId`, or null. */
export async function readLatestFit(pool: pg.Pool, seriesId: number): Promise<FitSummary | null> {
  const { rows } = await pool.query<FitRow>(
    `select id, series_id, method, ar_order, ma_order, parameters, standard_errors, sigma2, aic, bic, data_start, data_end, observation_count, duration_ms, created_at, diagnostics, selection
       from fits where series_id = $1 order by created_at desc, id desc limit 1`,
    [seriesId],
  );
  const row = rows[0];
  if (!row) return null;
  return {
    id: Number(row.id),
    seriesId: row.series_id,
    method: contractMethod(row.method) as FitSummary['method'],
    arOrder: row.ar_order,
    maOrder: row.ma_order,
    // Standard errors live in their own column; the model card reads them beside the estimates.
    parameters: (row.standard_errors
      ? { ...row.parameters, standardErrors: row.standard_errors }
      : row.parameters) as FitSummary['parameters'],
    sigma2: row.sigma2,
    aic: row.aic,
    bic: row.bic,
    dataStart: row.data_start.toISOString(),
    dataEnd: row.data_end.toISOString(),
    observationCount: row.observation_count,
    durationMs: row.duration_ms,
    createdAt: row.created_at.toISOString(),
    diagnostics: fitDiagnosticsSchema.parse(row.diagnostics),
    selection: row.selection ? fitSelectionSchema.parse(row.selection) : null,
  };
}
