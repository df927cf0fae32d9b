/**
 * Readings of one series held column-wise in typed arrays (20 bytes a reading instead of a few
 * hundred for objects), growing by doubling. The import job collects a file's readings this way.
 */

/** Growable columns of readings: UTC epoch ms, value, source row and quality bits set while parsing. */
export class ReadingColumns {
  /** UTC epoch ms of each reading. */
  ts: Float64Array;
  /** Raw value in the series' unit. */
  values: Float64Array;
  /** 1-based source line, 0 when the reading did not come from a file. */
  sourceRows: Int32Array;
  /** Quality bits known before validation (e.g. dstAmbiguous). */
  flags: Uint16Array;
  /** Readings held. */
  length = 0;

  constructor(capacity = 1024) {
    this.ts = new Float64Array(capacity);
    this.values = new Float64Array(capacity);
    this.sourceRows = new Int32Array(capacity);
    this.flags = new Uint16Array(capacity);
  }

  /** Appends one reading. */
  push(tsMs: number, value: number, sourceRow = 0, flags = 0): void {
    if (this.length === this.ts.length) this.grow();
    const i = this.length++;
    this.ts[i] = tsMs;
    this.values[i] = value;
    this.sourceRows[i] = sourceRow;
    this.flags[i] = flags;
  }

  /** Columns from plain readings (the push API's shape). */
  static from(readings: readonly { ts: Date; value: number; sourceRow?: number }[]): ReadingColumns {
    const columns = new ReadingColumns(Math.max(1, readings.length));
    for (const reading of readings) columns.push(reading.ts.getTime(), reading.value, reading.sourceRow ?? 0);
    return columns;
  }

  private grow(): void {
    const capacity = this.ts.length * 2;
    const ts = new Float64Array(capacity);
    ts.set(this.ts);
    const values = new Float64Array(capacity);
    values.set(this.values);
    const sourceRows = new Int32Array(capacity);
    sourceRows.set(this.sourceRows);
    const flags = new Uint16Array(capacity);
    flags.set(this.flags);
    Object.assign(this, { ts, values, sourceRows, flags });
  }
}
