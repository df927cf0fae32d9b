/**
 * Daily peak error and peak-hour error of each version on each whole local day it forecast: the
 * engine's dailyPeaks on the day's 24 hours (peak error = forecast peak − actual peak, positive means
 * over-forecast; peak-hour error = forecast peak hour − actual peak hour). Common practice in load
 * forecasting (Hong & Fan 2016, Int. J. Forecasting 32(3)).
 * Conventions: only days with all 24 local hours scored by the version count, so the 23- and 25-hour
 * days of daylight-saving changes and partly forecast days are left out; ties go to the earliest hour.
 */
import { dailyPeaks } from '@loadwright/forecasting';
import type { ScoredHour } from './scored-hour';

/** One version's peak on one local day. */
export interface DayPeakScore {
  versionId: number;
  localDate: string;
  actualPeak: number;
  forecastPeak: number;
  /** forecastPeak − actualPeak. */
  peakError: number;
  actualHour: number;
  forecastHour: number;
  /** forecastHour − actualHour. */
  peakHourError: number;
}

/** Summary of day peak scores. */
export interface PeakSummary {
  days: number;
  /** Mean |forecast peak − actual peak|, in the series' unit. */
  meanAbsolutePeakError: number;
  /** Mean forecast peak − actual peak (positive: peaks over-forecast). */
  meanPeakError: number;
  /** Mean |forecast peak hour − actual peak hour|, in hours. */
  meanAbsolutePeakHourError: number;
  /** Share of days whose peak hour was forecast exactly. */
  exactPeakHourShare: number;
}

/** The peak scores of every (version, local day) with all 24 hours scored, in date then version order. */
export function dayPeakScores(hours: readonly ScoredHour[]): DayPeakScore[] {
  const days = new Map<string, ScoredHour[]>();
  for (const hour of hours) {
    const key = `${hour.localDate}|${hour.versionId}`;
    const day = days.get(key) ?? [];
    day.push(hour);
    days.set(key, day);
  }
  const scores: DayPeakScore[] = [];
  for (const day of days.values()) {
    const byHour = [...day].sort((a, b) => a.localHour - b.localHour);
    if (byHour.length !== 24 || byHour.some((h, i) => h.localHour !== i)) continue;
    const [peak] = dailyPeaks(
      byHour.map((h) => h.actual),
      byHour.map((h) => h.forecast),
    );
    scores.push({
      versionId: byHour[0]!.versionId,
      localDate: byHour[0]!.localDate,
      actualPeak: peak!.actualPeak,
      forecastPeak: peak!.forecastPeak,
      peakError: peak!.error,
      actualHour: peak!.actualHour,
      forecastHour: peak!.forecastHour,
      peakHourError: peak!.hourError,
    });
  }
  return scores.sort((a, b) => a.localDate.localeCompare(b.localDate) || a.versionId - b.versionId);
}

/** Means over day peak scores, or null when there are none. */
export function summarisePeaks(scores: readonly DayPeakScore[]): PeakSummary | null {
  if (scores.length === 0) return null;
  const n = scores.length;
  const sum = (f: (s: DayPeakScore) => number) => scores.reduce((total, s) => total + f(s), 0);
  return {
    days: n,
    meanAbsolutePeakError: sum((s) => Math.abs(s.peakError)) / n,
    meanPeakError: sum((s) => s.peakError) / n,
    meanAbsolutePeakHourError: sum((s) => Math.abs(s.peakHourError)) / n,
    exactPeakHourShare: scores.filter((s) => s.peakHourError === 0).length / n,
  };
}
