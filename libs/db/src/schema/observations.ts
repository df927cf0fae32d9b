import { sql } from 'drizzle-orm';
import { check, doublePrecision, integer, pgTable, primaryKey, smallint } from 'drizzle-orm/pg-core';
import { instant } from './timestamps';

/**
 * Quality bits of a reading, OR-ed together in `observations.quality` (smallint, 16 bits).
 * A clean raw reading has quality 0.
 */
export const qualityFlag = {
  /** `estimated` holds a value to use instead of (or in place of a missing) raw reading. */
  estimated: 1 << 0,
  /** No raw reading arrived for this interval; the row exists to carry an estimate. */
  missing: 1 << 1,
  /** Robust spike test (Hampel/MAD) flagged the raw value. */
  spike: 1 << 2,
  /** Part of a run of identical values longer than the flat-line limit. */
  flatLine: 1 << 3,
  /** Below zero where the series cannot be negative. */
  negative: 1 << 4,
  /** Outside the physically possible range for the series. */
  impossible: 1 << 5,
  /** The upload held conflicting values for this instant; the first was kept. */
  duplicateConflict: 1 << 6,
  /** Local time fell in a repeated daylight-saving hour and was resolved by the upload settings. */
  dstAmbiguous: 1 << 7,
  /** A person edited the estimate by hand. */
  manualEdit: 1 << 8,
  /** Excluded from model training by a steward. */
  excluded: 1 << 9,
} as const;

/** Name of one quality bit. */
export type QualityFlagName = keyof typeof qualityFlag;

/**
 * The current reading of each series at each instant: one row per (series_id, ts), which is the
 * primary key and the only index. Older revisions move to `observation_revisions` before a row is
 * replaced, so raw readings are never lost. Column order is chosen for alignment (8-byte columns
 * first, then 4- and 2-byte ones), giving 56-byte tuples.
 *
 * There are no row-level foreign keys: their per-row check cut bulk loading to a quarter. Migration
 * 0004 checks series and uploads once per statement instead (SQLSTATE 23503 as a foreign key
 * would), deletes a deleted series' readings, and refuses to delete an upload that landed readings.
 * See docs/observations-store.md for the measurements.
 */
export const observations = pgTable(
  'observations',
  {
    ts: instant('ts').notNull(),
    /** Raw reading as received, in the series' unit; null only for a missing interval carrying an estimate. */
    value: doublePrecision('value'),
    /** Refers to series.id; checked per statement, not per row (see the note above the table). */
    seriesId: integer('series_id').notNull(),
    /** Refers to uploads.id: the upload or API push that brought this revision; checked per statement. */
    uploadId: integer('upload_id'),
    quality: smallint('quality').notNull().default(0),
    /** 1 for the first reading received; each correcting upload increments it. */
    revision: smallint('revision').notNull().default(1),
    /** Value to use in place of the raw one (gap fill, spike replacement), flagged `estimated`. */
    estimated: doublePrecision('estimated'),
  },
  (t) => [
    primaryKey({ name: 'observations_pkey', columns: [t.seriesId, t.ts] }),
    check('observations_has_value_check', sql`${t.value} is not null or ${t.estimated} is not null`),
    check('observations_revision_check', sql`${t.revision} >= 1`),
  ],
);

/**
 * Superseded revisions of readings, written when a later upload corrects a value. Together with
 * `observations` this keeps every raw reading ever received.
 */
export const observationRevisions = pgTable(
  'observation_revisions',
  {
    ts: instant('ts').notNull(),
    value: doublePrecision('value'),
    /** When the next revision replaced this one. */
    supersededAt: instant('superseded_at').notNull().defaultNow(),
    /** Refers to series.id (copied from a checked observations row). */
    seriesId: integer('series_id').notNull(),
    uploadId: integer('upload_id'),
    supersededByUploadId: integer('superseded_by_upload_id'),
    quality: smallint('quality').notNull(),
    revision: smallint('revision').notNull(),
    estimated: doublePrecision('estimated'),
  },
  (t) => [primaryKey({ name: 'observation_revisions_pkey', columns: [t.seriesId, t.ts, t.revision] })],
);
