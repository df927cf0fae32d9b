import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { HttpClient } from '@angular/common/http';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import type { ChartOptions } from 'chart.js';
import type { SeriesAccuracy as SeriesAccuracyReport, SeriesDetail } from '@loadwright/contracts';
import { BaseChartDirective } from 'ng2-charts';
import { catchError, combineLatest, map, of, startWith, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { chartColours, timeChartOptions, unitLabel, withUnit } from '../series-page/chart-theme';
import { bandKindLabels, coverageChartData, horizonChartData, recentChartData } from './accuracy-charts';
import { coverageVerdict, hoursText, percentOf, percentValue, skillShort } from './accuracy-words';

/** Windows the section offers, in days up to the newest scored hour. */
export const accuracyWindows = [7, 28, 90] as const;

/** What the section knows. */
type AccuracyState =
  | { readonly state: 'loading' }
  | { readonly state: 'ready'; readonly report: SeriesAccuracyReport }
  | { readonly state: 'failed'; readonly problem: string };

/** Plain names of day types. */
const dayTypeLabels = { weekday: 'Weekdays', weekend: 'Weekends', holiday: 'Holidays' } as const;

/**
 * A series' forecast accuracy: every version scored against the actuals that arrived, error by hours
 * ahead against the same hour last week, how each kind of band covered, the recent days, and each
 * version's own figures.
 */
@Component({
  selector: 'lw-series-accuracy',
  imports: [BaseChartDirective, MatButtonToggleModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './series-accuracy.html',
  styleUrl: './series-accuracy.scss',
})
export class SeriesAccuracy {
  private readonly http = inject(HttpClient);

  /** The series whose accuracy is shown. */
  readonly series = input.required<SeriesDetail>();

  /** Windows to choose from. */
  protected readonly windows = accuracyWindows;
  /** The chosen window in days. */
  protected readonly days = signal<number>(28);

  /** The report for the chosen window; a newer choice abandons an older request. */
  protected readonly data = toSignal(
    combineLatest([toObservable(this.series), toObservable(this.days)]).pipe(
      switchMap(([series, days]) =>
        this.http.get<SeriesAccuracyReport>(`/api/series/${series.id}/accuracy`, { params: { days } }).pipe(
          map((report): AccuracyState => ({ state: 'ready', report })),
          catchError((error: unknown) => of<AccuracyState>({ state: 'failed', problem: problemMessage(error) })),
          startWith<AccuracyState>({ state: 'loading' }),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } as AccuracyState },
  );

  /** The report, once read and holding scored hours. */
  protected readonly report = computed(() => {
    const data = this.data();
    return data.state === 'ready' && data.report.overall ? data.report : null;
  });
  /** True once read with nothing scored yet. */
  protected readonly empty = computed(() => {
    const data = this.data();
    return data.state === 'ready' && !data.report.overall;
  });

  protected readonly horizonData = computed(() => {
    const report = this.report();
    return report ? horizonChartData(report) : null;
  });
  protected readonly coverageData = computed(() => {
    const report = this.report();
    return report ? coverageChartData(report) : null;
  });
  protected readonly recentData = computed(() => {
    const report = this.report();
    return report ? recentChartData(report) : null;
  });

  /** Axes of the error-by-horizon chart: hours ahead against mean absolute error in the series' unit. */
  protected readonly horizonOptions = computed((): ChartOptions<'line'> => {
    const unit = this.series().unit;
    return {
      responsive: true,
      maintainAspectRatio: false,
      animation: false,
      parsing: false,
      interaction: { mode: 'nearest', axis: 'x', intersect: false },
      scales: {
        x: {
          type: 'linear',
          min: 1,
          max: 168,
          grid: { color: chartColours.grid },
          ticks: { stepSize: 24, color: '#3f484a', callback: (value) => (Number(value) % 24 === 0 ? `${value} h` : '') },
          title: { display: true, text: 'Hours ahead of the forecast’s start', color: '#3f484a' },
        },
        y: {
          beginAtZero: true,
          grid: { color: chartColours.grid },
          ticks: { color: '#3f484a' },
          title: { display: true, text: `Mean absolute error (${unitLabel(unit)})`, color: '#3f484a' },
        },
      },
      plugins: {
        legend: { position: 'bottom', labels: { usePointStyle: true, color: '#1b1f24', boxHeight: 8, padding: 16 } },
        tooltip: {
          callbacks: {
            title: (items) => (items[0] ? `${items[0].parsed.x} hours ahead` : ''),
            label: (item) => `${item.dataset.label}: ${withUnit(item.parsed.y, unit)}`,
          },
        },
      },
    };
  });

  /** Axes of the coverage chart: percent of actuals inside each band. */
  protected readonly coverageOptions: ChartOptions<'bar'> = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    scales: {
      x: { grid: { display: false }, ticks: { color: '#3f484a' } },
      y: {
        min: 0,
        max: 100,
        grid: { color: chartColours.grid },
        ticks: { color: '#3f484a', callback: (value) => `${value} %` },
        title: { display: true, text: 'Actuals inside the band (%)', color: '#3f484a' },
      },
    },
    plugins: {
      legend: { position: 'bottom', labels: { color: '#1b1f24', boxHeight: 10, padding: 16 } },
      tooltip: { callbacks: { label: (item) => `${item.dataset.label}: ${item.parsed.y} %` } },
    },
  };

  /** The recent-days chart on the series' local time axis; the band's lower edge stays out of the legend. */
  protected readonly recentOptions = computed((): ChartOptions<'line'> => {
    const series = this.series();
    const options = timeChartOptions(series.timeZone, series.unit, false);
    return {
      ...options,
      plugins: {
        ...options.plugins,
        legend: {
          ...options.plugins!.legend,
          labels: { ...options.plugins!.legend!.labels, filter: (item) => !item.text.includes('(low)') },
        },
      },
    };
  });

  /** Skill against the same hour last week in words. */
  protected readonly skill = computed(() => skillShort(this.report()?.overall?.skill));

  protected readonly dayTypeLabels = dayTypeLabels;
  protected readonly bandKindLabels = bandKindLabels;
  protected readonly amount = withUnit;
  protected readonly percent = percentOf;
  protected readonly percentValue = percentValue;
  protected readonly hours = hoursText;
  protected readonly verdict = coverageVerdict;

  /** Shows another window. */
  protected chooseWindow(days: number): void {
    this.days.set(days);
  }

  /** A local date and time of the series, "Mon 30 Nov 23:00". */
  protected localTime(iso: string): string {
    return new Intl.DateTimeFormat('en-GB', {
      timeZone: this.series().timeZone,
      weekday: 'short',
      day: 'numeric',
      month: 'short',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .format(new Date(iso))
      .replace(',', '');
  }
}
