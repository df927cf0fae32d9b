import { sql } from 'drizzle-orm';
import { bigint, check, doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { validationRules } from '../../../contracts/src/uploads';
import { apiTokens } from './api-tokens';
import { users } from './people';
import { series } from './series';
import { createdAt, instant, updatedAt } from './timestamps';

/** How the data arrived. */
export const uploadSource = pgEnum('upload_source', ['csv', 'api', 'green_button']);

/** What the readings in an upload are: measured actuals, or a temperature forecast for a station. */
export const uploadContent = pgEnum('upload_content', ['actuals', 'temperature_forecast']);

/**
 * Where an upload stands: received (stored, previewed), queued (mapping confirmed), importing (job
 * running), done (all rows landed), failed (nothing landed; the error says why), cancelled (a steward
 * stopped it; nothing landed), awaiting_choice (the import stopped before writing to ask the steward
 * how to read repeated daylight-saving hours its file order cannot decide).
 */
export const uploadStatus = pgEnum('upload_status', ['received', 'queued', 'importing', 'done', 'failed', 'cancelled', 'awaiting_choice']);

/** A repeated local hour the import could not place, as the steward is asked about it (shape owned by the intake contracts). */
export type RepeatedHourQuestion = Record<string, unknown>;

/** Column mapping confirmed by the steward (shape owned by the intake contracts). */
export type UploadMapping = Record<string, unknown>;

/** Import settings confirmed by the steward: units, time zone, interval convention, estimation. */
export type UploadSettings = Record<string, unknown>;

/**
 * One file or API push of readings. The SHA-256 of the content makes a repeated upload of the
 * same bytes a no-op: at most one upload per content hash that has not failed.
 */
export const uploads = pgTable(
  'uploads',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    source: uploadSource('source').notNull().default('csv'),
    content: uploadContent('content').notNull().default('actuals'),
    fileName: text('file_name').notNull(),
    contentSha256: text('content_sha256').notNull(),
    byteSize: bigint('byte_size', { mode: 'number' }).notNull(),
    uploadedById: integer('uploaded_by_id').references(() => users.id, { onDelete: 'set null' }),
    uploadedByTokenId: integer('uploaded_by_token_id').references(() => apiTokens.id, { onDelete: 'set null' }),
    status: uploadStatus('status').notNull().default('received'),
    mapping: jsonb('mapping').$type<UploadMapping>(),
    settings: jsonb('settings').$type<UploadSettings>(),
    /** Path of the stored file under the data directory while it awaits import. */
    storagePath: text('storage_path'),
    rowsTotal: integer('rows_total'),
    rowsProcessed: integer('rows_processed').notNull().default(0),
    rowsImported: integer('rows_imported').notNull().default(0),
    rowsRejected: integer('rows_rejected').notNull().default(0),
    rowsUnchanged: integer('rows_unchanged').notNull().default(0),
    rowsRevised: integer('rows_revised').notNull().default(0),
    /** Fraction done, 0 to 1, for the progress bar. */
    progress: doublePrecision('progress').notNull().default(0),
    error: text('error'),
    /** While awaiting_choice: the repeated hours the steward is asked about, with their readings. */
    repeatedHourQuestions: jsonb('repeated_hour_questions').$type<RepeatedHourQuestion[]>(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    startedAt: instant('started_at'),
    finishedAt: instant('finished_at'),
  },
  (t) => [
    // The statuses that hold a file's bytes, named among the enum's first values: PostgreSQL refuses a
    // value added by ALTER TYPE in the migration transaction that adds it. An upload awaiting a choice
    // came from a received one, so the duplicate check in uploadWithContent covers it.
    uniqueIndex('uploads_content_sha256_key')
      .on(t.contentSha256)
      .where(sql`${t.status} in ('received', 'queued', 'importing', 'done')`),
    index('uploads_created_at_idx').on(t.createdAt.desc()),
    index('uploads_status_idx').on(t.status),
    check('uploads_progress_check', sql`${t.progress} between 0 and 1`),
  ],
);

/** The validation rules whose findings an import records (the list lives in the shared contracts). */
export const validationRule = pgEnum('validation_rule', validationRules);

/** One thing validation found in an upload, tied to a reading where there is one. */
export const uploadFindings = pgTable(
  'upload_findings',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    uploadId: integer('upload_id')
      .notNull()
      .references(() => uploads.id, { onDelete: 'cascade' }),
    seriesId: integer('series_id').references(() => series.id, { onDelete: 'cascade' }),
    rule: validationRule('rule').notNull(),
    ts: instant('ts'),
    value: doublePrecision('value'),
    /** 1-based line in the source file, when the finding comes from a file. */
    sourceRow: integer('source_row'),
    detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
    /** When a steward marked the finding as dealt with, and how. */
    resolvedAt: instant('resolved_at'),
    resolvedById: integer('resolved_by_id').references(() => users.id, { onDelete: 'set null' }),
    resolution: text('resolution'),
  },
  (t) => [index('upload_findings_upload_rule_idx').on(t.uploadId, t.rule), index('upload_findings_series_ts_idx').on(t.seriesId, t.ts)],
);
