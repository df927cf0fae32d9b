/** Gap filling of hourly arrays where NaN marks a missing hour. */

/**
 * Fills interior runs of at most `maxGap` NaNs by straight lines between their neighbours, in place;
 * returns the number of hours filled. Leading and trailing NaNs stay.
 */
export function fillInteriorGaps(values: Float64Array, maxGap: number): number {
  let filled = 0;
  let t = 0;
  const n = values.length;
  while (t < n) {
    if (!Number.isNaN(values[t])) {
      t++;
      continue;
    }
    const start = t;
    while (t < n && Number.isNaN(values[t])) t++;
    const length = t - start;
    if (start === 0 || t === n || length > maxGap) continue;
    const before = values[start - 1];
    const after = values[t];
    for (let k = 0; k < length; k++) values[start + k] = before + ((after - before) * (k + 1)) / (length + 1);
    filled += length;
  }
  return filled;
}

/** Number of NaNs in the array. */
export function countMissing(values: Float64Array): number {
  let missing = 0;
  for (let t = 0; t < values.length; t++) if (Number.isNaN(values[t])) missing++;
  return missing;
}
