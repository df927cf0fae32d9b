/** Accuracy figures in plain words for planners. */

/** "12 % better", "5 % worse" or "No better": skill against the same hour last week, for a tile headed by the benchmark. */
export function skillShort(skill: number | null | undefined): string | null {
  if (skill === null || skill === undefined) return null;
  const percent = Math.round(Math.abs(skill) * 100);
  if (percent === 0) return 'No better';
  return `${percent} % ${skill > 0 ? 'better' : 'worse'}`;
}

/** A share (0–1) as a whole percentage, "87 %". */
export function percentOf(share: number | null | undefined): string {
  return share === null || share === undefined ? '—' : `${Math.round(share * 100)} %`;
}

/** A percentage with one decimal, "4.2 %". */
export function percentValue(value: number | null | undefined): string {
  return value === null || value === undefined ? '—' : `${value.toFixed(1)} %`;
}

/**
 * How a band held against its promise: within 5 points of the level reads "as promised"; below it the
 * band was too narrow, above it wider than needed (a tolerance of our own choosing for plain words).
 */
export function coverageVerdict(achieved: number, nominal: number): string {
  const gap = (achieved - nominal) * 100;
  if (Math.abs(gap) <= 5) return 'held as promised';
  return gap < 0 ? 'too narrow: actuals fell outside more often than promised' : 'wider than needed';
}

/** "1.5 hours" or "1 hour". */
export function hoursText(value: number): string {
  const rounded = Math.round(value * 10) / 10;
  return `${rounded} ${rounded === 1 ? 'hour' : 'hours'}`;
}
