/**
 * Where an import's time goes, stage by stage, so a slow import can be explained from its audit
 * entry and the benchmark can set each stage beside the database's own pace. Writing one series
 * overlaps validating the next, so `validate` and `write` may add up to more than the transaction.
 */

/** Seconds per stage of one import. */
export interface ImportStages {
  /** Streaming the file: parsing CSV, timestamps and numbers, unit conversion, daylight-saving placement. */
  read: number;
  /** Collapsing duplicates, dropping off-grid and future readings, looking up stored intervals in gaps. */
  screen: number;
  /** The validation rules and gap estimates, in JavaScript. */
  validate: number;
  /** Inserting or merging into observations (the index and reference checks included). */
  write: number;
  /** Storing the findings and the upload's own row. */
  findings: number;
  /** The whole transaction (screen, validate, write and findings, less their overlap), with its commit. */
  transaction: number;
  /** From the start of the import to its end. */
  total: number;
}

/** Adds up the time spent in each stage. */
export class StageClock {
  private readonly started = performance.now();
  private readonly seconds: Omit<ImportStages, 'total'> = { read: 0, screen: 0, validate: 0, write: 0, findings: 0, transaction: 0 };

  /** Runs `work`, adding its duration to `stage`. */
  async time<T>(stage: keyof Omit<ImportStages, 'total'>, work: () => Promise<T>): Promise<T> {
    const began = performance.now();
    try {
      return await work();
    } finally {
      this.seconds[stage] += (performance.now() - began) / 1000;
    }
  }

  /** Runs a synchronous `work`, adding its duration to `stage`. */
  timeSync<T>(stage: keyof Omit<ImportStages, 'total'>, work: () => T): T {
    const began = performance.now();
    try {
      return work();
    } finally {
      this.seconds[stage] += (performance.now() - began) / 1000;
    }
  }

  /** The stages of the work itself (read, screen, validate, write, findings), as known before the transaction ends. */
  work(): Omit<ImportStages, 'transaction' | 'total'> {
    const { read, screen, validate, write, findings } = this.read();
    return { read, screen, validate, write, findings };
  }

  /** The stages so far, to the millisecond. */
  read(): ImportStages {
    const round = (value: number) => Math.round(value * 1000) / 1000;
    const entries = Object.entries(this.seconds).map(([stage, value]) => [stage, round(value)]);
    return { ...(Object.fromEntries(entries) as Omit<ImportStages, 'total'>), total: round((performance.now() - this.started) / 1000) };
  }
}
