/**
 * The kinds of miss, in our own plain words, with what each parameter means and the defaults an
 * admin starts from. A rule is one kind with its parameters, a severity and recipients.
 */

/** Every kind of miss (the miss_rule_kind enum). */
export const missRuleKinds = [
  'outside_band',
  'error_over_threshold',
  'daily_peak_missed',
  'creeping_bias',
  'actuals_late',
  'forecast_late',
  'estimated_hours',
] as const;
export type MissRuleKind = (typeof missRuleKinds)[number];

/** How urgent a miss is. */
export const missSeverities = ['low', 'medium', 'high'] as const;
export type MissSeverity = (typeof missSeverities)[number];

/** The parameters of a rule; each kind reads the ones it needs (see ruleKindInfo). */
export interface RuleSettings {
  kind: MissRuleKind;
  /** Consecutive hours that must break the rule (k). */
  hours: number;
  /** The kind's threshold (see ruleKindInfo[kind].threshold). */
  threshold: number | null;
  /** Interval level (percent) of the band, for outside_band. */
  bandLevel: number | null;
  /** Hours with both actual and forecast below this load (kW) are not judged by percentage rules. */
  floorKw: number | null;
  /** Hours the daily peak's time may be off, for daily_peak_missed. */
  peakHourTolerance: number | null;
}

/** The parameters a person sets on a rule. */
export type RuleParameter = 'hours' | 'threshold' | 'bandLevel' | 'floorKw' | 'peakHourTolerance';

/** A rule kind's name, what it watches, what its threshold means, and the parameters its check reads. */
export interface RuleKindInfo {
  name: string;
  watches: string;
  /** What `threshold` means for this kind, or null when it takes none. */
  threshold: string | null;
  /** The parameters the kind's check reads (the others are ignored, so a rule must leave them empty). */
  reads: readonly RuleParameter[];
}

/** Names and meanings shown in Settings, on the Misses page and in e-mail. */
export const ruleKindInfo: Record<MissRuleKind, RuleKindInfo> = {
  outside_band: {
    name: 'Outside the band',
    watches: 'Actual load outside the forecast band for consecutive hours.',
    threshold: null,
    reads: ['hours', 'bandLevel'],
  },
  error_over_threshold: {
    name: 'Error over threshold',
    watches: 'Absolute percentage error above the threshold for consecutive hours, ignoring hours below the load floor.',
    threshold: 'percent error',
    reads: ['hours', 'threshold', 'floorKw'],
  },
  daily_peak_missed: {
    name: 'Daily peak missed',
    watches: "The day's peak off by more than the threshold, or its hour off by more than the tolerance.",
    threshold: 'percent peak error',
    reads: ['threshold', 'floorKw', 'peakHourTolerance'],
  },
  creeping_bias: {
    name: 'Creeping bias',
    watches:
      "Errors piling up on one side: the tracking signal (the sum of the last day's errors over their mean absolute error) beyond the limit.",
    threshold: 'tracking signal limit',
    reads: ['hours', 'threshold'],
  },
  actuals_late: {
    name: 'Actuals late',
    watches: 'No new actuals for longer than expected.',
    threshold: 'hours without actuals',
    reads: ['threshold'],
  },
  forecast_late: {
    name: 'No forecast by the deadline',
    watches: 'No forecast written for the series by the morning deadline.',
    threshold: null,
    reads: [],
  },
  estimated_hours: {
    name: 'Too many estimated hours',
    watches: "More estimated hours in a day's actuals than the threshold.",
    threshold: 'estimated hours in a day',
    reads: ['threshold'],
  },
};

/**
 * The defaults an installation starts from. The tracking-signal limit of ±4 is common practice (a
 * forecast is reviewed once the running sum of errors passes about four mean absolute errors).
 */
export const defaultRules: (RuleSettings & { severity: MissSeverity })[] = [
  { kind: 'outside_band', hours: 3, threshold: null, bandLevel: 95, floorKw: null, peakHourTolerance: null, severity: 'high' },
  { kind: 'error_over_threshold', hours: 3, threshold: 10, bandLevel: null, floorKw: 50, peakHourTolerance: null, severity: 'medium' },
  { kind: 'daily_peak_missed', hours: 1, threshold: 5, bandLevel: null, floorKw: 50, peakHourTolerance: 2, severity: 'high' },
  { kind: 'creeping_bias', hours: 3, threshold: 4, bandLevel: null, floorKw: null, peakHourTolerance: null, severity: 'medium' },
  { kind: 'actuals_late', hours: 1, threshold: 6, bandLevel: null, floorKw: null, peakHourTolerance: null, severity: 'medium' },
  { kind: 'forecast_late', hours: 1, threshold: null, bandLevel: null, floorKw: null, peakHourTolerance: null, severity: 'high' },
  { kind: 'estimated_hours', hours: 1, threshold: 4, bandLevel: null, floorKw: null, peakHourTolerance: null, severity: 'low' },
];

/** kW in one unit of a load series. */
export const kilowattsPer = { W: 0.001, kW: 1, MW: 1000 } as const;
export type LoadUnit = keyof typeof kilowattsPer;

/** The rule's load floor in the series' own unit (0 when the rule has none). */
export function floorInUnit(rule: Pick<RuleSettings, 'floorKw'>, unit: LoadUnit): number {
  return rule.floorKw === null ? 0 : rule.floorKw / kilowattsPer[unit];
}
