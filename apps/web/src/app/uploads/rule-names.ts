import { validationRuleSeverity, validationRules, type ValidationRule } from '@loadwright/contracts';

/** Short headings of the validation rules, as the report lists them. */
export const ruleNames: Record<ValidationRule, string> = {
  gap: 'Gaps',
  spike: 'Spikes',
  flat_line: 'Flat lines',
  negative: 'Negative values',
  impossible: 'Impossible values',
  duplicate_equal: 'Repeated readings (same value)',
  duplicate_conflict: 'Repeated readings (conflicting values)',
  off_grid: 'Off the interval grid',
  future: 'In the future',
  dst_repeated_hour: 'Repeated daylight-saving hour',
  dst_missing_hour: 'Missing daylight-saving hour',
  unparseable: 'Unreadable cells',
  unknown_series: 'Unknown series',
  estimated: 'Estimates stored',
  dst_resolved: 'Repeated daylight-saving hour placed by order',
  partial_interval: 'Intervals the file covers only in part',
  mixed_interval: 'Mixed intervals',
};

/** Rules that record what Loadwright did rather than something wrong with the file (the contracts' severity). */
export const informationalRules: ReadonlySet<ValidationRule> = new Set(
  validationRules.filter((rule) => validationRuleSeverity[rule] === 'information'),
);

/**
 * A finding's rule-specific facts in words, e.g. "intervals 3 · estimated yes". Instants are written
 * by `instant` (the screen's stated time base); without it, in UTC named as such.
 */
export function detailWords(detail: Record<string, unknown>, instant?: (iso: string) => string): string {
  return Object.entries(detail)
    .map(
      ([key, value]) =>
        `${spaced(key)} ${typeof value === 'boolean' ? (value ? 'yes' : 'no') : typeof value === 'number' ? roundish(value) : instantOrText(String(value), instant)}`,
    )
    .join(' · ');
}

/** An ISO instant through `format`, or in UTC as "2026-12-01 11:00 UTC"; other text as it is. */
function instantOrText(text: string, format?: (iso: string) => string): string {
  const instant = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2})(?::00(?:\.0+)?)?Z$/.exec(text);
  if (!instant) return text;
  return format ? format(text) : `${instant[1]} ${instant[2]} UTC`;
}

/** camelCase or snake_case to plain words. */
function spaced(key: string): string {
  return key
    .replace(/_/g, ' ')
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase();
}

/** Numbers to at most four significant decimals, so limits read cleanly. */
function roundish(value: number): string {
  return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
}
