import type { MissRule, MissRuleParameter } from '@loadwright/contracts';

/** How one rule parameter is shown and edited: Settings and the Rules view both render from this list. */
export interface RuleParameterField {
  readonly key: MissRuleParameter;
  /** Column heading in a rules table. */
  readonly heading: string;
  /** Field label, read after the kind's name by screen readers ("Outside the band hours"). */
  readonly label: string;
  /** The parameter as the subject of a sentence ("The number of hours in a row"). */
  readonly name: string;
  /** Smallest and largest values the API accepts (libs/contracts misses.ts). */
  readonly min: number;
  readonly max: number | null;
  /** Whole numbers only, or any decimal. */
  readonly whole: boolean;
  /** False when the field may be left empty (the kind's own default then applies). */
  readonly required: boolean;
}

/** The five parameters a person sets on a rule, in table order. */
export const RULE_PARAMETER_FIELDS: readonly RuleParameterField[] = [
  {
    key: 'hours',
    heading: 'Hours in a row',
    label: 'hours',
    name: 'The number of hours in a row',
    min: 1,
    max: 168,
    whole: true,
    required: true,
  },
  { key: 'threshold', heading: 'Threshold', label: 'threshold', name: 'The threshold', min: 0, max: null, whole: false, required: false },
  { key: 'bandLevel', heading: 'Band %', label: 'band level', name: 'The band level', min: 1, max: 99, whole: true, required: false },
  {
    key: 'floorKw',
    heading: 'Floor kW',
    label: 'floor in kW',
    name: 'The load floor (kW)',
    min: 0,
    max: null,
    whole: false,
    required: false,
  },
  {
    key: 'peakHourTolerance',
    heading: 'Peak hour ±',
    label: 'peak hour tolerance',
    name: 'The peak hour tolerance',
    min: 0,
    max: 23,
    whole: true,
    required: false,
  },
];

/** The fields a rule's kind reads, in table order. */
export function fieldsOf(rule: Pick<MissRule, 'reads'>): RuleParameterField[] {
  return RULE_PARAMETER_FIELDS.filter((field) => rule.reads.includes(field.key));
}

/** A rule's settings in a few words, e.g. "3 hours in a row outside the 95 % band; high; to role:planner". */
export function describeRule(rule: MissRule): string {
  const parts: string[] = [];
  for (const field of fieldsOf(rule)) {
    const value = rule[field.key];
    if (value === null) continue;
    if (field.key === 'hours') parts.push(value === 1 ? '1 hour' : `${value} hours in a row`);
    // The tracking signal limit is a bound either side, read better after its name.
    else if (field.key === 'threshold' && rule.kind === 'creeping_bias') parts.push(`tracking signal beyond ±${value}`);
    else if (field.key === 'threshold') parts.push(`${value} ${rule.thresholdMeaning ?? ''}`.trim());
    else if (field.key === 'bandLevel') parts.push(`${value} % band`);
    else if (field.key === 'floorKw') parts.push(`floor ${value} kW`);
    else parts.push(`peak hour ±${value}`);
  }
  parts.push(`${rule.severity} severity`);
  parts.push(rule.recipients.length ? `to ${rule.recipients.join(', ')}` : 'no e-mail');
  return parts.join('; ');
}

/** A number typed in a field, or null when left empty or not a number. */
export function numberOrNull(value: string | number | null | undefined): number | null {
  if (value === null || value === undefined || value === '') return null;
  const n = Number(value);
  return Number.isFinite(n) ? n : null;
}
