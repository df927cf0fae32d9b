import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import type { ForecastSeries, TemperatureScenario, TemperatureScenarios } from '@loadwright/contracts';
import { catchError, combineLatest, map, of, startWith, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { unitLabel, withUnit } from '../series-page/chart-theme';
import { scenarioPeakRows } from './scenario-peaks';
import { scenarioStyle } from './scenario-style';
import { WeatherScenariosClient } from './weather-scenarios-client';

/** What the section shows: loading, a problem, or the scenarios. */
type ScenarioState =
  | { readonly state: 'loading' }
  | { readonly state: 'failed'; readonly problem: string }
  | { readonly state: 'ready'; readonly scenarios: TemperatureScenarios };

/** Shifts a planner may choose, in whole degrees of the station's unit. */
const shifts = [2, 3, 5, 8, 10, 15, 20] as const;

/**
 * Weather scenarios of a load series' forecast: how next week's load and its daily peaks move if it runs N
 * degrees hotter or colder than the temperatures assumed, or brings the weather of the same weeks of past
 * years. The chosen scenarios go to the fan chart as extra lines; the table gives each day's peak change.
 */
@Component({
  selector: 'lw-weather-scenarios',
  imports: [MatCheckboxModule, MatFormFieldModule, MatIconModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './weather-scenarios.html',
  styleUrl: './weather-scenarios.scss',
})
export class WeatherScenarios {
  private readonly client = inject(WeatherScenariosClient);

  /** The load series whose forecast is re-run. */
  readonly series = input.required<ForecastSeries>();
  /** Changes whenever the reviewed version or its adjustments change, so the scenarios are read again. */
  readonly revision = input<string>('');
  /** The scenarios chosen for the fan chart. */
  readonly linesChange = output<TemperatureScenario[]>();

  /** Offered shifts. */
  protected readonly shifts = shifts;
  /** The chosen shift in degrees. */
  protected readonly shift = signal<number>(5);
  /** Keys of the scenarios drawn and tabled; hotter and colder to begin with. */
  protected readonly chosen = signal<readonly string[]>(['hotter', 'colder']);

  /** The scenarios as read for the series, revision and shift. */
  protected readonly view = toSignal(
    combineLatest([toObservable(this.series), toObservable(this.revision), toObservable(this.shift)]).pipe(
      switchMap(([series, , shift]) =>
        this.client.scenarios(series.id, shift).pipe(
          map((scenarios): ScenarioState => ({ state: 'ready', scenarios })),
          catchError((error: unknown) => of<ScenarioState>({ state: 'failed', problem: problemMessage(error) })),
          startWith<ScenarioState>({ state: 'loading' }),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } as ScenarioState },
  );

  /** The scenarios once read. */
  protected readonly scenarios = computed(() => {
    const view = this.view();
    return view.state === 'ready' ? view.scenarios : null;
  });
  /** Every scenario with its legend style, in the API's order. */
  protected readonly options = computed(() => {
    let pastYear = 0;
    return (this.scenarios()?.scenarios ?? []).map((scenario) => ({
      scenario,
      style: scenarioStyle(scenario, scenario.kind === 'past-year' ? pastYear++ : 0),
    }));
  });
  /** The chosen scenarios, in the API's order. */
  protected readonly chosenScenarios = computed(() =>
    (this.scenarios()?.scenarios ?? []).filter((scenario) => this.chosen().includes(scenario.key)),
  );
  /** The daily peak table of the chosen scenarios. */
  protected readonly rows = computed(() => {
    const scenarios = this.scenarios();
    return scenarios
      ? scenarioPeakRows(
          scenarios,
          this.chosenScenarios().map((scenario) => scenario.key),
        )
      : [];
  });
  /** The station's unit as written. */
  protected readonly degrees = computed(() => unitLabel(this.scenarios()?.station?.unit ?? 'degF'));

  protected readonly amount = withUnit;

  constructor() {
    // The chart draws what is chosen; nothing while the scenarios are read again.
    effect(() => this.linesChange.emit(this.chosenScenarios()));
  }

  /** Draws or hides one scenario. */
  protected toggle(key: string, on: boolean): void {
    this.chosen.update((keys) => (on ? [...keys.filter((k) => k !== key), key] : keys.filter((k) => k !== key)));
  }

  /** A signed temperature difference, e.g. "−14.0 °F". */
  protected signedDegrees(value: number): string {
    return `${value > 0 ? '+' : value < 0 ? '−' : '±'}${Math.abs(value).toFixed(1)} ${this.degrees()}`;
  }

  /** A signed change with the series' unit, e.g. "+12.0 MW". */
  protected change(value: number | null): string {
    if (value === null) return '—';
    return `${value > 0 ? '+' : value < 0 ? '−' : '±'}${withUnit(Math.abs(value), this.series().unit)}`;
  }
}
