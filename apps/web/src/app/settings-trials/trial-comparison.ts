import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { SettingsTrial, TrialSide } from '@loadwright/contracts';
import { withUnit } from '../series-page/chart-theme';
import { zonedClock } from '../series-page/zoned-time';
import { comparisonRows, verdictSummary } from './comparison-rows';
import { settingChanges } from './settings-changes';

/** One finished trial side by side: what changed, both sides' errors, coverage and peaks at both horizons, and what was fitted. */
@Component({
  selector: 'lw-trial-comparison',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './trial-comparison.html',
  styleUrl: './trial-comparison.scss',
})
export class TrialComparison {
  /** A finished trial. */
  readonly trial = input.required<SettingsTrial>();
  /** The series' unit and time zone. */
  readonly unit = input.required<string>();
  readonly timeZone = input.required<string>();

  /** The settings the proposal changes. */
  protected readonly changes = computed(() => settingChanges(this.trial().currentSettings, this.trial().proposedSettings));
  /** Both horizons' rows. */
  protected readonly horizons = computed(() => {
    const results = this.trial().results;
    if (!results) return [];
    return [
      { key: 'day', title: 'Day-ahead (the first 24 hours from each origin)', rows: comparisonRows(results, 'dayAhead', this.unit()) },
      { key: 'week', title: 'Week-ahead (all 168 hours from each origin)', rows: comparisonRows(results, 'weekAhead', this.unit()) },
    ].map((horizon) => ({ ...horizon, summary: verdictSummary(horizon.rows) }));
  });
  /** The origins in the series' time zone. */
  protected readonly originSpan = computed(() => {
    const { firstOrigin, lastOrigin } = this.trial();
    return firstOrigin && lastOrigin ? `${zonedClock(firstOrigin, this.timeZone())} to ${zonedClock(lastOrigin, this.timeZone())}` : null;
  });

  /** Whether each side used temperatures, in one sentence (one clause when both sides say the same). */
  protected readonly temperatureText = computed(() => {
    const results = this.trial().results;
    if (!results) return '';
    const text = (side: TrialSide) => `${side.temperature.used ? 'used' : 'not used'}, ${side.temperature.reason}`;
    const [current, proposed] = [text(results.current), text(results.proposed)];
    return current === proposed ? `Both sides: ${current}.` : `Current: ${current}. Proposed: ${proposed}.`;
  });
  /** The seasonal-naive benchmark's MAE at both horizons, in the series' unit. */
  protected readonly naiveText = computed(() => {
    const results = this.trial().results;
    if (!results) return '';
    return `${withUnit(results.current.dayAhead.naive.mae, this.unit(), 2)} day-ahead, ${withUnit(results.current.weekAhead.naive.mae, this.unit(), 2)} week-ahead`;
  });

  /** What a side fitted at the origins, e.g. "AR by Yule-Walker at 14 origins". */
  protected fittedText(side: TrialSide): string {
    return Object.entries(side.fitted)
      .sort(([, a], [, b]) => b - a)
      .map(([label, count]) => `${label} at ${count} origin${count === 1 ? '' : 's'}`)
      .join('; ');
  }
}
