/**
 * How a draft differs from the approved version: interval by interval where both have a value, at
 * the daily peaks of each local day, and in energy over the common intervals.
 */
import type { EnergyDifference, PeakDifference, VersionComparison } from '@loadwright/contracts';
import { dailyPeaks, type TimedValue } from './daily-peaks';

/** (a − b) / |b| × 100, or null when b is 0. */
export function percentDifference(a: number, b: number): number | null {
  return b === 0 ? null : ((a - b) / Math.abs(b)) * 100;
}

/**
 * Energy of both over the intervals both cover, in unit·hours: each mean demand times the interval
 * length in hours (a 60-minute interval of 10 MW is 10 MWh).
 */
export function energyDifference(draft: readonly TimedValue[], approved: readonly TimedValue[], intervalMinutes: number): EnergyDifference {
  const approvedByTs = new Map(approved.map((point) => [point.ts.getTime(), point.value]));
  const hours = intervalMinutes / 60;
  let intervals = 0;
  let draftEnergy = 0;
  let approvedEnergy = 0;
  for (const point of draft) {
    const other = approvedByTs.get(point.ts.getTime());
    if (other === undefined) continue;
    intervals++;
    draftEnergy += point.value * hours;
    approvedEnergy += other * hours;
  }
  const difference = draftEnergy - approvedEnergy;
  return {
    intervals,
    draft: draftEnergy,
    approved: approvedEnergy,
    difference,
    differencePercent: intervals === 0 ? null : percentDifference(draftEnergy, approvedEnergy),
  };
}

/** The full comparison of two versions' effective values (adjusted where adjusted). */
export function compareVersions(
  draft: readonly TimedValue[],
  approved: readonly TimedValue[],
  timeZone: string,
  intervalMinutes: number,
): VersionComparison {
  const approvedByTs = new Map(approved.map((point) => [point.ts.getTime(), point.value]));
  const intervals = draft.flatMap((point) => {
    const other = approvedByTs.get(point.ts.getTime());
    if (other === undefined) return [];
    return [
      {
        ts: point.ts.toISOString(),
        draft: point.value,
        approved: other,
        difference: point.value - other,
        differencePercent: percentDifference(point.value, other),
      },
    ];
  });

  const draftPeaks = new Map(dailyPeaks(draft, timeZone, intervalMinutes).map((peak) => [peak.date, peak]));
  const approvedPeaks = new Map(dailyPeaks(approved, timeZone, intervalMinutes).map((peak) => [peak.date, peak]));
  const dates = [...new Set([...draftPeaks.keys(), ...approvedPeaks.keys()])].sort();
  const peaks: PeakDifference[] = dates.map((date) => {
    const d = draftPeaks.get(date) ?? null;
    const a = approvedPeaks.get(date) ?? null;
    const both = d !== null && a !== null;
    return {
      date,
      draft: d,
      approved: a,
      difference: both ? d.value - a.value : null,
      differencePercent: both ? percentDifference(d.value, a.value) : null,
      peakShiftMinutes: both ? Math.round((Date.parse(d.ts) - Date.parse(a.ts)) / 60_000) : null,
    };
  });

  return { intervals, dailyPeaks: peaks, energy: energyDifference(draft, approved, intervalMinutes) };
}
