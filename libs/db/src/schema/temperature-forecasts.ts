import { doublePrecision, index, integer, pgTable, primaryKey } from 'drizzle-orm/pg-core';
import { series } from './series';
import { instant } from './timestamps';
import { uploads } from './uploads';

/**
 * Forecast temperatures for a weather station (a temperature series), as issued by the weather
 * provider and uploaded by a steward. Each issue is kept whole, so a refit can use the newest issue
 * made before its forecast origin and a backtest can use what was known at the time.
 */
export const temperatureForecasts = pgTable(
  'temperature_forecasts',
  {
    /** When the provider issued this forecast. */
    issuedAt: instant('issued_at').notNull(),
    ts: instant('ts').notNull(),
    value: doublePrecision('value').notNull(),
    seriesId: integer('series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    uploadId: integer('upload_id').references(() => uploads.id, { onDelete: 'restrict' }),
  },
  (t) => [
    primaryKey({ name: 'temperature_forecasts_pkey', columns: [t.seriesId, t.issuedAt, t.ts] }),
    index('temperature_forecasts_series_ts_idx').on(t.seriesId, t.ts),
  ],
);
