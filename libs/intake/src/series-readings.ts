/** The column-wise shape every rule reads: readings of one series, usually sorted by time. */
export interface SeriesReadings {
  /** UTC epoch ms. */
  ts: Float64Array;
  /** Raw values in the series' unit. */
  values: Float64Array;
  /** 1-based source lines (0 when not from a file). */
  sourceRows: Int32Array;
  /** Quality bits already known. */
  flags: Uint16Array;
  /** Readings held (the arrays may be longer). */
  length: number;
}

/** Copies the readings at the given positions, in that order, into fresh arrays. */
export function pickReadings(source: SeriesReadings, positions: ArrayLike<number>, count = positions.length): SeriesReadings {
  const ts = new Float64Array(count);
  const values = new Float64Array(count);
  const sourceRows = new Int32Array(count);
  const flags = new Uint16Array(count);
  for (let k = 0; k < count; k++) {
    const i = positions[k]!;
    ts[k] = source.ts[i]!;
    values[k] = source.values[i]!;
    sourceRows[k] = source.sourceRows[i]!;
    flags[k] = source.flags[i]!;
  }
  return { ts, values, sourceRows, flags, length: count };
}
