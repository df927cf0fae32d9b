/**
 * Order statistics of a sample without sorting it: the values a full sort would put at a few ranks.
 *
 * Method: Hoare's FIND (quickselect; Hoare 1961, Communications of the ACM 4(7), Algorithm 65) with a
 * median-of-three pivot, extended to several ranks at once by following every side of a partition that
 * still holds a wanted rank (multiple selection, expected linear time for a fixed number of ranks). A range
 * that partitions badly too often is sorted outright, so the worst case stays O(n log n).
 *
 * Conventions: ranks are 0-based; the values are rearranged in place. Ties between −0 and +0 are resolved as
 * TypedArray sort does (−0 first), so the answer is bit for bit that of `Float64Array.from(values).sort()`.
 * Values must not be NaN.
 */

/** Ranges this short are finished by insertion sort. */
const SHORT = 16;

/**
 * The values at 0-based `ranks` (increasing, distinct, each in 0..n − 1) of `values` in increasing order;
 * `values` is rearranged.
 */
export function selectOrderStatistics(values: Float64Array, ranks: readonly number[]): Float64Array {
  const n = values.length;
  // About 2·log2(n) partitions deep is far beyond what random pivots need; past it a range is sorted.
  const depthLimit = 2 * Math.ceil(Math.log2(n + 1)) + 4;
  selectRanks(values, 0, n, ranks, 0, ranks.length, depthLimit);
  const out = new Float64Array(ranks.length);
  for (let r = 0; r < ranks.length; r++) {
    const value = values[ranks[r]];
    // −0 and +0 compare equal, so partitions may mix them; sorted order puts every −0 first.
    out[r] = value === 0 ? signedZeroAt(values, ranks[r]) : value;
  }
  return out;
}

/** Places the sorted order's values at ranks[rlo..rhi) (all inside [lo, hi)) of values[lo..hi). */
function selectRanks(a: Float64Array, lo: number, hi: number, ranks: readonly number[], rlo: number, rhi: number, depth: number): void {
  while (rlo < rhi) {
    if (hi - lo <= SHORT) {
      insertionSort(a, lo, hi);
      return;
    }
    if (depth-- <= 0) {
      a.subarray(lo, hi).sort();
      return;
    }
    const mid = (lo + hi) >>> 1;
    const x = a[lo];
    const y = a[mid];
    const w = a[hi - 1];
    const pivot = x < y ? (y < w ? y : x < w ? w : x) : x < w ? x : y < w ? w : y;
    // Hoare partition: afterwards a[lo..j] ≤ pivot, a[i..hi) ≥ pivot, and anything between equals it.
    let i = lo;
    let j = hi - 1;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    let left = rlo;
    while (left < rhi && ranks[left] <= j) left++;
    let right = left;
    while (right < rhi && ranks[right] < i) right++;
    // ranks[rlo..left) lie left, ranks[left..right) hold the pivot already, ranks[right..rhi) lie right.
    if (left - rlo < rhi - right) {
      selectRanks(a, lo, j + 1, ranks, rlo, left, depth);
      lo = i;
      rlo = right;
    } else {
      selectRanks(a, i, hi, ranks, right, rhi, depth);
      hi = j + 1;
      rhi = left;
    }
  }
}

function insertionSort(a: Float64Array, lo: number, hi: number): void {
  for (let i = lo + 1; i < hi; i++) {
    const v = a[i];
    let j = i - 1;
    while (j >= lo && a[j] > v) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = v;
  }
}

/** −0 or +0: which one sorted order puts at `rank`, knowing a zero belongs there. */
function signedZeroAt(values: Float64Array, rank: number): number {
  let belowOrNegativeZero = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v < 0 || (v === 0 && 1 / v < 0)) belowOrNegativeZero++;
  }
  return rank < belowOrNegativeZero ? -0 : 0;
}
