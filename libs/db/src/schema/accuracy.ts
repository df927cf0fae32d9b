import { sql } from 'drizzle-orm';
import { bigint, check, date, doublePrecision, index, integer, pgEnum, pgTable, primaryKey, smallint } from 'drizzle-orm/pg-core';
import { forecastVersions } from './forecasts';
import { series } from './series';
import { instant } from './timestamps';

/** Kind of local day an hour falls on: a working weekday, Saturday or Sunday, or a day of the holiday calendar. */
export const dayType = pgEnum('day_type', ['weekday', 'weekend', 'holiday']);

/**
 * One scored hour of one forecast version: the hourly actual beside the version's numbers as handed
 * on (after planners' adjustments) and the seasonal-naive benchmark for the same hour. Every version
 * that forecast an hour gets its own row (draft, approved and superseded alike), so accuracy reads by
 * horizon, day type, band kind or day are single index range scans over a series' rows, with no
 * joins to the points. Rows are rewritten when actuals are revised (scoring is idempotent).
 */
export const forecastHourScores = pgTable(
  'forecast_hour_scores',
  {
    versionId: bigint('version_id', { mode: 'number' })
      .notNull()
      .references(() => forecastVersions.id, { onDelete: 'cascade' }),
    /** Repeated from the version so a series' scores read without a join. */
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    ts: instant('ts').notNull(),
    /** Hours ahead of the version's origin: 1 for the origin hour itself. */
    horizon: smallint('horizon').notNull(),
    /** Calendar date of the hour in the series' time zone. */
    localDate: date('local_date', { mode: 'string' }).notNull(),
    /** Hour of the local day (0–23), for daily peaks. */
    localHour: smallint('local_hour').notNull(),
    dayType: dayType('day_type').notNull(),
    actual: doublePrecision('actual').notNull(),
    forecast: doublePrecision('forecast').notNull(),
    /** Seasonal-naive forecast of the hour (the actual one week earlier); null when that actual is missing. */
    naive: doublePrecision('naive'),
    /** The version's MASE scale (in-sample seasonal-naive MAE before its origin); null when it cannot be formed or is 0. */
    scale: doublePrecision('scale'),
    lower80: doublePrecision('lower_80').notNull(),
    upper80: doublePrecision('upper_80').notNull(),
    lower95: doublePrecision('lower_95').notNull(),
    upper95: doublePrecision('upper_95').notNull(),
  },
  (t) => [
    primaryKey({ name: 'forecast_hour_scores_pkey', columns: [t.versionId, t.ts] }),
    index('forecast_hour_scores_series_ts_idx').on(t.seriesId, t.ts),
    check('forecast_hour_scores_horizon_check', sql`${t.horizon} >= 1`),
    check('forecast_hour_scores_local_hour_check', sql`${t.localHour} between 0 and 23`),
  ],
);
