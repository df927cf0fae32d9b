import { sql } from 'drizzle-orm';
import { type AnyPgColumn, check, index, integer, pgEnum, pgTable, smallint, text } from 'drizzle-orm/pg-core';
import { createdAt, instant, updatedAt } from './timestamps';

/** What a series measures. */
export const seriesKind = pgEnum('series_kind', ['load', 'temperature']);

/** Where a series sits in the network hierarchy, from the whole system down to one feeder. */
export const seriesLevel = pgEnum('series_level', ['system', 'zone', 'substation', 'feeder']);

/** Unit of stored values: load as mean demand over the interval, temperature in degrees. */
export const seriesUnit = pgEnum('series_unit', ['W', 'kW', 'MW', 'degC', 'degF']);

/** Whether a reading's timestamp marks the start or the end of its interval. */
export const timestampsMark = pgEnum('timestamps_mark', ['start', 'end']);

/** Interval lengths Loadwright accepts, in minutes (daily is 1440). */
export const seriesIntervalMinutes = [5, 15, 30, 60, 1440] as const;

/** One measured series: a system, zone, substation or feeder load, or a weather station temperature. */
export const series = pgTable(
  'series',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    key: text('key').notNull().unique('series_key_key'),
    name: text('name').notNull(),
    kind: seriesKind('kind').notNull(),
    level: seriesLevel('level'),
    parentId: integer('parent_id').references((): AnyPgColumn => series.id, { onDelete: 'restrict' }),
    unit: seriesUnit('unit').notNull(),
    intervalMinutes: smallint('interval_minutes').notNull().default(60),
    timeZone: text('time_zone').notNull(),
    timestampsMark: timestampsMark('timestamps_mark').notNull().default('start'),
    temperatureSeriesId: integer('temperature_series_id').references((): AnyPgColumn => series.id, {
      onDelete: 'set null',
    }),
    /** Series of similar behaviour whose models lend a prior to a new member (cold start). */
    peerGroup: text('peer_group'),
    description: text('description'),
    archivedAt: instant('archived_at'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index('series_parent_id_idx').on(t.parentId),
    index('series_temperature_series_id_idx').on(t.temperatureSeriesId),
    index('series_peer_group_idx').on(t.peerGroup),
    check('series_interval_minutes_check', sql`${t.intervalMinutes} in (5, 15, 30, 60, 1440)`),
    // A load series sits somewhere in the hierarchy; a temperature series is a station, outside it.
    check(
      'series_level_matches_kind_check',
      sql`(${t.kind} = 'load' and ${t.level} is not null) or (${t.kind} = 'temperature' and ${t.level} is null and ${t.temperatureSeriesId} is null)`,
    ),
    check('series_unit_matches_kind_check', sql`(${t.kind} = 'load') = (${t.unit} in ('W', 'kW', 'MW'))`),
    check('series_parent_not_self_check', sql`${t.parentId} <> ${t.id}`),
  ],
);
