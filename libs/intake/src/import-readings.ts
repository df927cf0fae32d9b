/**
 * The public import core: validates, estimates and stores one series' readings inside the caller's
 * transaction, with the same rules as a file upload. Used by the upload job and by the push API.
 *
 * @example
 *   await db.transaction((tx) => importReadings(tx, {
 *     seriesId: 7, readings: [{ ts: new Date('2026-11-30T10:00:00Z'), value: 812.4 }],
 *     uploadId: null, intervalMinutes: 60, kind: 'load', unit: 'kW',
 *   }));
 */
import type { FindingTally } from './findings';
import { importSeries } from './import-series';
import { ReadingColumns } from './reading-columns';
import type { SqlExecutor } from './write-observations';

/** What to import. Values are in the series' stored unit; instants are UTC interval starts. */
export interface ImportReadingsInput {
  seriesId: number;
  readings: readonly { ts: Date; value: number; sourceRow?: number }[];
  /** The upload the readings belong to; findings are stored only when there is one. */
  uploadId: number | null;
  intervalMinutes: number;
  kind: 'load' | 'temperature';
  /** Stored unit of the series (W, kW, MW, degC, degF); sets temperature bounds. Default kW / degC. */
  unit?: string;
  /** IANA zone of the series (daily grids sit on local midnight). Default UTC. */
  timeZone?: string;
  /** Readings after this are rejected as future ones (default: now). */
  now?: Date;
}

/** Counts of what happened to the readings, and the findings (counts and first examples per rule). */
export interface ImportReadingsResult {
  /** New instants stored (including estimate-only rows for short gaps). */
  inserted: number;
  /** Readings equal to what was stored already. */
  unchanged: number;
  /** Readings that replaced a different stored value (the old one kept as a revision). */
  revised: number;
  /** Readings not stored: repeated instants, off-grid and future readings. */
  rejected: number;
  findings: FindingTally;
}

/** Imports one series' readings; see the file comment. */
export async function importReadings(tx: SqlExecutor, input: ImportReadingsInput): Promise<ImportReadingsResult> {
  const target = {
    seriesId: input.seriesId,
    kind: input.kind,
    unit: input.unit ?? (input.kind === 'load' ? 'kW' : 'degC'),
    intervalMinutes: input.intervalMinutes,
    timeZone: input.timeZone,
  };
  return importSeries(tx, target, ReadingColumns.from(input.readings), { uploadId: input.uploadId, now: input.now });
}
