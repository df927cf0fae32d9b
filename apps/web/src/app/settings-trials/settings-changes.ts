import { type ModelSettingsRequest, type SeasonalTreatment, modelMethodLabels } from '@loadwright/contracts';

/** One setting that differs between two sets of settings, in words. */
export interface SettingChange {
  readonly setting: string;
  readonly from: string;
  readonly to: string;
}

/** A seasonal treatment in words. */
function seasonalText(seasonal: SeasonalTreatment): string {
  if (seasonal.kind === 'none') return 'none';
  if (seasonal.kind === 'difference') return `differencing at ${seasonal.lag} hours`;
  return `${seasonal.slot} profile, ${seasonal.form}`;
}

/** An order that may be left to the method. */
function orderText(order: number | null): string {
  return order === null ? 'chosen by the method' : String(order);
}

/** What each setting reads as, in the order the settings form shows them. */
const describedSettings: ReadonlyArray<[string, (s: ModelSettingsRequest) => string]> = [
  ['Method', (s) => modelMethodLabels[s.method]],
  ['AR order', (s) => orderText(s.arOrder)],
  ['Largest AR order', (s) => String(s.maxArOrder)],
  ['MA order', (s) => orderText(s.maOrder)],
  ['Largest MA order', (s) => String(s.maxMaOrder)],
  ['Extra lags', (s) => (s.extraLags.length ? s.extraLags.join(', ') : 'none')],
  ['Seasonal treatment', (s) => seasonalText(s.seasonal)],
  ['Log of load', (s) => (s.log ? 'yes' : 'no')],
  ['Temperature regressors', (s) => (s.temperature.enabled ? 'on' : 'off')],
  ['Heating balance point', (s) => (s.temperature.heatingBase === null ? 'default' : String(s.temperature.heatingBase))],
  ['Cooling balance point', (s) => (s.temperature.coolingBase === null ? 'default' : String(s.temperature.coolingBase))],
  ['Saturday, Sunday and holiday regressors', (s) => (s.dayTypes ? 'on' : 'off')],
  ['Training window', (s) => `${s.trainingWindowDays} days`],
  ['Horizon', (s) => `${s.horizonHours} hours`],
  ['Interval levels', (s) => s.levels.map((level) => `${level} %`).join(', ')],
];

/** The settings that differ from `current` in `proposed`, in words. */
export function settingChanges(current: ModelSettingsRequest, proposed: ModelSettingsRequest): SettingChange[] {
  return describedSettings
    .map(([setting, text]) => ({ setting, from: text(current), to: text(proposed) }))
    .filter((change) => change.from !== change.to);
}

/** The changes in one line, e.g. "Method: Automatic choice → AR by Yule-Walker; Training window: 365 days → 90 days". */
export function changesInOneLine(changes: readonly SettingChange[]): string {
  return changes.length ? changes.map((c) => `${c.setting}: ${c.from} → ${c.to}`).join('; ') : 'no setting differs';
}
