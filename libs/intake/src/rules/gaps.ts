/**
 * Gaps: missing intervals between consecutive readings, in grid indexes. Intervals that already
 * hold a stored raw reading (from an earlier upload) are not missing, so they split a gap.
 */

/** One run of missing intervals. */
export interface Gap {
  /** Grid index of the first missing interval. */
  firstIndex: number;
  /** Missing intervals in the run. */
  count: number;
  /** Position of the reading before the gap. */
  before: number;
  /** Position of the reading after the gap. */
  after: number;
  /** True when the run lies directly between the two readings (no stored reading splits it). */
  bounded: boolean;
}

/** Missing runs between consecutive readings; `stored` holds grid indexes already covered. Pure. */
export function findGaps(gridIndex: Float64Array, length: number, stored: ReadonlySet<number> = new Set()): Gap[] {
  const gaps: Gap[] = [];
  for (let p = 1; p < length; p++) {
    const from = gridIndex[p - 1]! + 1;
    const to = gridIndex[p]! - 1;
    let runStart = -1;
    for (let index = from; index <= to + 1; index++) {
      const missing = index <= to && !stored.has(index);
      if (missing && runStart < 0) runStart = index;
      if (!missing && runStart >= 0) {
        gaps.push({
          firstIndex: runStart,
          count: index - runStart,
          before: p - 1,
          after: p,
          bounded: runStart === from && index === to + 1,
        });
        runStart = -1;
      }
    }
  }
  return gaps;
}
