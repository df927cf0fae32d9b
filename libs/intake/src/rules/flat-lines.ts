/**
 * Flat lines: a run of identical values over consecutive intervals longer than a limit, the mark of
 * a stuck meter or a historian repeating its last value. Limits: 6 hours for load (feeder load
 * moves every hour of a normal day) and 12 hours for temperature (calm overcast nights can hold a
 * temperature to the recorded tenth for several hours); never fewer than 3 intervals.
 */

/** Hours of identical values beyond which a series is flagged, by kind. */
export const flatLineHours = { load: 6, temperature: 12 } as const;

/** The run-length limit in intervals for a series kind and interval length. */
export function flatLineLimit(kind: 'load' | 'temperature', intervalMinutes: number): number {
  return Math.max(3, Math.ceil((flatLineHours[kind] * 60) / intervalMinutes));
}

/**
 * Runs longer than `limit` readings, as inclusive position ranges. `gridIndex` gives each reading's
 * grid index, so a run is broken by a missing interval as well as by a change of value. Pure.
 */
export function flatRuns(
  values: Float64Array,
  gridIndex: Float64Array,
  length: number,
  limit: number,
): Array<{ start: number; end: number }> {
  const runs: Array<{ start: number; end: number }> = [];
  let start = 0;
  for (let i = 1; i <= length; i++) {
    const continues = i < length && values[i] === values[i - 1] && gridIndex[i]! - gridIndex[i - 1]! === 1;
    if (continues) continue;
    if (i - start > limit) runs.push({ start, end: i - 1 });
    start = i;
  }
  return runs;
}
