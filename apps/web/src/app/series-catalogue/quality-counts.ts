import { type QualityFlagName, type SeriesReadingStats, qualityFlagLabels, qualityFlagNames } from '@loadwright/contracts';

/** One quality flag with the number of readings carrying it. */
export interface QualityCount {
  readonly flag: QualityFlagName;
  readonly label: string;
  readonly count: number;
}

/** The flags a series' readings carry, in bit order, leaving out those with no readings. */
export function flaggedCounts(stats: SeriesReadingStats): QualityCount[] {
  return qualityFlagNames
    .map((flag) => ({ flag, label: qualityFlagLabels[flag], count: stats.byQuality[flag] ?? 0 }))
    .filter((entry) => entry.count > 0);
}

/** A one-line summary for a screen reader or a tooltip, e.g. "17,520 readings: 17,509 clean, 3 Missing, 1 Spike". */
export function qualitySentence(stats: SeriesReadingStats, formatNumber: (n: number) => string = (n) => n.toLocaleString('en-GB')): string {
  if (stats.count === 0) return 'No readings stored';
  const flagged = flaggedCounts(stats).map((entry) => `${formatNumber(entry.count)} ${entry.label}`);
  return `${formatNumber(stats.count)} readings: ${[`${formatNumber(stats.clean)} clean`, ...flagged].join(', ')}`;
}
