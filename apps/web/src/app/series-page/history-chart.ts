import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import type { ChartData, ChartOptions, PointStyle } from 'chart.js';
import { type QualityFlagName, type ReadingHistory, type SeriesDetail, qualityFlagLabels } from '@loadwright/contracts';
import { BaseChartDirective } from 'ng2-charts';
import { catchError, combineLatest, map, of, startWith, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { historyChartData } from './chart-data';
import { chartColours, timeChartOptions, unitLabel } from './chart-theme';
import { SeriesPageClient } from './series-page-client';

/** Ranges the history chart offers, ending at the newest reading. */
export const historyRanges = [
  { id: '7d', label: 'Last 7 days', days: 7 },
  { id: '30d', label: '30 days', days: 30 },
  { id: '1y', label: '1 year', days: 365 },
  { id: 'all', label: 'All', days: null },
] as const;
/** One of historyRanges' ids. */
type HistoryRangeId = (typeof historyRanges)[number]['id'];

/** Marker shape and colour of each quality flag: shapes differ so colour is never the only cue. */
const flagStyles: Record<QualityFlagName, { style: PointStyle; colour: string }> = {
  estimated: { style: 'circle', colour: '#2a6671' },
  missing: { style: 'circle', colour: '#2a6671' },
  spike: { style: 'triangle', colour: '#ba1a1a' },
  flatLine: { style: 'rect', colour: '#4f6470' },
  negative: { style: 'rectRot', colour: '#a8661c' },
  impossible: { style: 'crossRot', colour: '#ba1a1a' },
  duplicateConflict: { style: 'star', colour: '#6a3f9a' },
  dstAmbiguous: { style: 'cross', colour: '#6a3f9a' },
  manualEdit: { style: 'rectRounded', colour: '#054e59' },
  excluded: { style: 'line', colour: '#3f484a' },
};

/** The state of the chart's data. */
type HistoryState =
  | { readonly state: 'loading' }
  | { readonly state: 'ready'; readonly history: ReadingHistory }
  | { readonly state: 'failed'; readonly problem: string };

/** A series' reading history over a chosen range, with quality flags as markers. */
@Component({
  selector: 'lw-history-chart',
  imports: [BaseChartDirective, MatButtonToggleModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './history-chart.html',
  styleUrl: './history-chart.scss',
})
export class HistoryChart {
  private readonly client = inject(SeriesPageClient);

  /** The series to chart. */
  readonly series = input.required<SeriesDetail>();

  /** Ranges to choose from. */
  protected readonly ranges = historyRanges;
  /** The chosen range. */
  protected readonly range = signal<HistoryRangeId>('30d');

  /** The readings of the chosen range; a newer choice abandons an older request (switchMap). */
  protected readonly data = toSignal(
    combineLatest([toObservable(this.series), toObservable(this.range)]).pipe(
      switchMap(([series, range]) => {
        const { from, to } = rangeBounds(series, range);
        return this.client.readings(series.id, from, to).pipe(
          map((history): HistoryState => ({ state: 'ready', history })),
          catchError((error: unknown) => of<HistoryState>({ state: 'failed', problem: problemMessage(error) })),
          startWith<HistoryState>({ state: 'loading' }),
        );
      }),
    ),
    { initialValue: { state: 'loading' } as HistoryState },
  );

  /** The history, once read. */
  protected readonly history = computed(() => {
    const data = this.data();
    return data.state === 'ready' ? data.history : null;
  });

  /** Chart datasets: the line of values to use, then one marker set per flag present. */
  protected readonly chartData = computed<ChartData<'line'> | null>(() => {
    const history = this.history();
    if (!history) return null;
    const { line, markers } = historyChartData(history);
    return {
      datasets: [
        {
          label: `Load (${history.resolution === 'day' ? 'daily mean' : history.resolution === 'hour' ? 'hourly mean' : 'each reading'})`,
          data: line,
          borderColor: chartColours.actual,
          borderWidth: 1.25,
          pointRadius: 0,
          pointStyle: 'line',
        },
        ...markers.map((marker) => ({
          label: `${marker.label} (${marker.points.length})`,
          data: marker.points,
          showLine: false,
          pointStyle: flagStyles[marker.flag].style,
          pointRadius: 5,
          pointHoverRadius: 7,
          borderColor: flagStyles[marker.flag].colour,
          backgroundColor: flagStyles[marker.flag].colour,
        })),
      ],
    };
  });

  /** Axes in the series' time zone and unit. */
  protected readonly options = computed<ChartOptions<'line'>>(() => {
    const history = this.history();
    return timeChartOptions(this.series().timeZone, this.series().unit, history?.resolution === 'day');
  });

  /** Counts of flagged readings in the range, for the text beside the chart. */
  protected readonly flagSummary = computed(() => {
    const history = this.history();
    if (!history) return [];
    return Object.entries(history.qualitySummary)
      .filter(([, count]) => count > 0)
      .map(([flag, count]) => ({ flag, count, label: (qualityFlagLabels[flag as QualityFlagName] ?? flag).toLowerCase() }));
  });

  protected readonly unit = unitLabel;

  /** Shows another range. */
  protected chooseRange(range: HistoryRangeId): void {
    this.range.set(range);
  }
}

/** From and to of a range ending just after the newest reading; null bounds let the API choose. */
function rangeBounds(series: SeriesDetail, range: HistoryRangeId): { from: string | null; to: string | null } {
  const latest = series.readings.latestAt ?? series.latestReadingAt;
  const first = series.readings.firstAt;
  if (!latest) return { from: null, to: null };
  const end = Date.parse(latest) + series.intervalMinutes * 60_000;
  const days = historyRanges.find((r) => r.id === range)!.days;
  const start = days === null ? Date.parse(first ?? latest) : Math.max(end - days * 86_400_000, Date.parse(first ?? latest));
  // The API answers at most ten years at once.
  const from = Math.max(start, end - 3_660 * 86_400_000);
  return { from: new Date(from).toISOString(), to: new Date(end).toISOString() };
}
