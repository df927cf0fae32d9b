/**
 * Imports a batch of one series' readings that arrived through the API (a push or a Green Button
 * file) the way a file upload is imported: recorded as an upload, validated and merged by the intake
 * core in one transaction, and audited. The same batch twice adds nothing: its content hash names an
 * upload that already landed, and the answer says so.
 */
import { createHash } from 'node:crypto';
import { and, eq, notInArray } from 'drizzle-orm';
import type { ImportResult, SeriesUnit, TimestampsMark, UploadMapping, UploadSettings } from '@loadwright/contracts';
import { uploads, type Database, type Series, type UploadSource } from '@loadwright/db';
import type { Actor } from '@loadwright/audit';
import { recordAudit } from '@loadwright/audit';
import type { Finding } from '@loadwright/intake';
import { importReadings } from '@loadwright/intake';

/** One reading as the intake core takes it: the UTC interval start and the value in the series' unit. */
export interface IntervalReading {
  ts: Date;
  value: number;
  /** 1-based position in the request, so findings can point at it. */
  sourceRow?: number;
}

/** A batch to import. */
export interface ReadingBatch {
  series: Series;
  readings: readonly IntervalReading[];
  source: Extract<UploadSource, 'api' | 'green_button'>;
  /** A name for the upload list, e.g. "API push to fdr-n1". */
  fileName: string;
  /** SHA-256 (hex) of the batch's content, the key of "same batch twice". */
  contentSha256: string;
  byteSize: number;
  /** Unit the sender's values were in. */
  unit: SeriesUnit;
  /** What the sender's timestamps marked. */
  timestampsMark: TimestampsMark;
  /** Facts of the source kept with the upload beside the settings (e.g. Green Button local time parameters). */
  sourceDetail?: Record<string, unknown>;
  actor: Actor;
  ip: string;
  /** Audit action, e.g. readings.pushed. */
  auditAction: string;
}

/** SHA-256 hex of a string or bytes. */
export function sha256Hex(content: string | Uint8Array): string {
  return createHash('sha256').update(content).digest('hex');
}

/** Imports the batch; see the file comment. */
export async function importBatch(db: Database, batch: ReadingBatch): Promise<ImportResult> {
  const { series } = batch;
  const earlier = await findLanded(db, batch.contentSha256);
  if (earlier) return alreadyImported(series, earlier);
  try {
    return await db.transaction(async (tx) => {
      const [upload] = await tx
        .insert(uploads)
        .values({
          source: batch.source,
          fileName: batch.fileName,
          contentSha256: batch.contentSha256,
          byteSize: batch.byteSize,
          uploadedById: batch.actor.kind === 'user' ? batch.actor.userId : null,
          uploadedByTokenId: batch.actor.kind === 'token' ? batch.actor.tokenId : null,
          status: 'importing',
          ...uploadRecordOf(batch),
          rowsTotal: batch.readings.length,
          startedAt: new Date(),
        })
        .returning({ id: uploads.id });
      const uploadId = upload!.id;
      const result = await importReadings(tx, {
        seriesId: series.id,
        readings: batch.readings,
        uploadId,
        intervalMinutes: series.intervalMinutes,
        kind: series.kind,
        unit: series.unit,
        timeZone: series.timeZone,
      });
      await tx
        .update(uploads)
        .set({
          status: 'done',
          rowsProcessed: batch.readings.length,
          rowsImported: result.inserted + result.revised,
          rowsRejected: result.rejected,
          rowsUnchanged: result.unchanged,
          rowsRevised: result.revised,
          progress: 1,
          finishedAt: new Date(),
        })
        .where(eq(uploads.id, uploadId));
      const findingCounts = result.findings.countsByRule() as Record<string, number>;
      await recordAudit(tx, {
        actor: batch.actor,
        action: batch.auditAction,
        targetType: 'series',
        targetId: series.id,
        detail: {
          key: series.key,
          uploadId,
          received: batch.readings.length,
          inserted: result.inserted,
          unchanged: result.unchanged,
          revised: result.revised,
          rejected: result.rejected,
          findingCounts,
        },
        ip: batch.ip,
      });
      const findings = [...result.findings.examples.values()].flat().map(toFinding);
      return {
        seriesId: series.id,
        key: series.key,
        uploadId,
        alreadyImported: false,
        received: batch.readings.length,
        inserted: result.inserted,
        unchanged: result.unchanged,
        revised: result.revised,
        rejected: result.rejected,
        findingCounts,
        findings,
      };
    });
  } catch (error) {
    // Two identical batches at once: the second loses the race on the content hash and reports the first.
    if (isUniqueViolation(error, 'uploads_content_sha256_key')) {
      const winner = await findLanded(db, batch.contentSha256);
      if (winner) return alreadyImported(series, winner);
    }
    throw error;
  }
}

/**
 * The mapping and settings recorded with the upload, in the shapes the upload list shows for files:
 * one series, a timestamp and a value per reading, offsets given (so no repeated-hour policy applies).
 */
function uploadRecordOf(batch: ReadingBatch): { mapping: UploadMapping; settings: UploadSettings & Record<string, unknown> } {
  return {
    mapping: { layout: 'long', timestampColumn: 'ts', valueColumn: 'value', seriesKeyColumn: null, seriesKey: batch.series.key },
    settings: {
      unit: batch.unit,
      timeZone: batch.series.timeZone,
      timestampsMark: batch.timestampsMark,
      repeatedHourPolicy: 'reject',
      decimalSeparator: '.',
      estimateShortGaps: true,
      ...(batch.sourceDetail && { [batch.source === 'green_button' ? 'greenButton' : 'source']: batch.sourceDetail }),
    },
  };
}

type LandedUpload = Pick<typeof uploads.$inferSelect, 'id' | 'rowsTotal'>;

/** The upload that already holds this content, unless it failed or was cancelled. */
async function findLanded(db: Database, contentSha256: string): Promise<LandedUpload | undefined> {
  const [row] = await db
    .select({ id: uploads.id, rowsTotal: uploads.rowsTotal })
    .from(uploads)
    .where(and(eq(uploads.contentSha256, contentSha256), notInArray(uploads.status, ['failed', 'cancelled'])));
  return row;
}

/** The answer for a batch that had landed before: every reading unchanged, nothing added. */
function alreadyImported(series: Series, earlier: LandedUpload): ImportResult {
  const received = earlier.rowsTotal ?? 0;
  return {
    seriesId: series.id,
    key: series.key,
    uploadId: earlier.id,
    alreadyImported: true,
    received,
    inserted: 0,
    unchanged: received,
    revised: 0,
    rejected: 0,
    findingCounts: {},
    findings: [],
  };
}

/** A finding in the contract's shape. */
function toFinding(finding: Finding): ImportResult['findings'][number] {
  return {
    rule: finding.rule,
    ts: finding.tsMs === null ? null : new Date(finding.tsMs).toISOString(),
    value: finding.value === null || !Number.isFinite(finding.value) ? null : finding.value,
    position: finding.sourceRow && finding.sourceRow > 0 ? finding.sourceRow : null,
    detail: finding.detail,
  };
}

/** True when the error is PostgreSQL's unique violation of the named constraint. */
function isUniqueViolation(error: unknown, constraint: string): boolean {
  const cause = (error as { cause?: { code?: string; constraint?: string } }).cause ?? (error as { code?: string; constraint?: string });
  return cause.code === '23505' && cause.constraint === constraint;
}
