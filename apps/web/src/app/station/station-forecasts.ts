import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { ReadingHistory, SeriesDetail, TemperatureForecastIssueList } from '@loadwright/contracts';
import { Subject, catchError, combineLatest, forkJoin, map, of, startWith, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { unitLabel } from '../series-page/chart-theme';
import { zonedClock } from '../series-page/zoned-time';
import { ForecastUpload } from './forecast-upload';
import { StationChart, type TemperatureHour } from './station-chart';
import { StationClient } from './station-client';

const hourMs = 3_600_000;
/** Observed hours shown before the chosen issue's first valid hour. */
const lookBackHours = 72;

/** The list of issues: loading, a problem, or the list. */
type IssuesState =
  | { readonly state: 'loading' }
  | { readonly state: 'failed'; readonly problem: string }
  | { readonly state: 'ready'; readonly list: TemperatureForecastIssueList };

/** The chart's two lines for the chosen issue. */
type LinesState =
  | { readonly state: 'none' }
  | { readonly state: 'loading' }
  | { readonly state: 'failed'; readonly problem: string }
  | { readonly state: 'ready'; readonly observed: TemperatureHour[]; readonly forecast: TemperatureHour[] };

/** The hours of a reading history that hold a temperature (estimates where there are some). */
function observedHours(history: ReadingHistory): TemperatureHour[] {
  if (history.resolution === 'interval')
    return history.points.flatMap((point) => {
      const value = point.estimated ?? point.value;
      return value === null ? [] : [{ ts: point.ts, value }];
    });
  return history.buckets.flatMap((bucket) => (bucket.meanUsed === null ? [] : [{ ts: bucket.ts, value: bucket.meanUsed }]));
}

/**
 * A weather station's forecasts: every issue kept (issue time, where it came from, the hours it covers), the
 * observed temperatures beside the chosen issue on a chart, and for stewards the upload of a forecast file.
 */
@Component({
  selector: 'lw-station-forecasts',
  imports: [ForecastUpload, MatButtonModule, MatIconModule, StationChart],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './station-forecasts.html',
  styleUrl: './station-forecasts.scss',
})
export class StationForecasts {
  private readonly client = inject(StationClient);
  private readonly reloads = new Subject<void>();

  /** The station (a temperature series). */
  readonly series = input.required<SeriesDetail>();
  /** Whether the person looking may upload forecast files (stewards, admins). */
  readonly canUpload = input(false);

  /** The issue time chosen for the chart; the newest when none is chosen. */
  protected readonly chosen = signal<string | null>(null);
  /** What the last upload stored, announced. */
  protected readonly outcome = signal<string | null>(null);

  /** The station's issues, read again after an upload. */
  protected readonly issuesView = toSignal(
    combineLatest([toObservable(this.series), this.reloads.pipe(startWith(undefined))]).pipe(
      switchMap(([series]) =>
        this.client.issues(series.id).pipe(
          map((list): IssuesState => ({ state: 'ready', list })),
          catchError((error: unknown) => of<IssuesState>({ state: 'failed', problem: problemMessage(error) })),
          startWith<IssuesState>({ state: 'loading' }),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } as IssuesState },
  );
  /** The issues once read, newest first. */
  protected readonly issues = computed(() => {
    const view = this.issuesView();
    return view.state === 'ready' ? view.list.issues : [];
  });
  /** The issue drawn on the chart. */
  protected readonly selected = computed((): TemperatureForecastIssueList['issues'][number] | null => {
    const issues = this.issues();
    return issues.find((issue) => issue.issuedAt === this.chosen()) ?? issues[0] ?? null;
  });

  /** Observed temperatures around the selected issue and the issue's hours. */
  protected readonly lines = toSignal(
    toObservable(this.selected).pipe(
      switchMap((issue) => {
        if (!issue) return of<LinesState>({ state: 'none' });
        const station = this.series().id;
        const from = new Date(Date.parse(issue.from) - lookBackHours * hourMs).toISOString();
        const to = new Date(Date.parse(issue.to) + hourMs).toISOString();
        return forkJoin({ observed: this.client.observed(station, from, to), forecast: this.client.hours(station, issue.issuedAt) }).pipe(
          map(({ observed, forecast }): LinesState => ({ state: 'ready', observed: observedHours(observed), forecast: forecast.hours })),
          catchError((error: unknown) => of<LinesState>({ state: 'failed', problem: problemMessage(error) })),
          startWith<LinesState>({ state: 'loading' }),
        );
      }),
    ),
    { initialValue: { state: 'none' } as LinesState },
  );

  protected readonly degrees = computed(() => unitLabel(this.series().unit));
  protected readonly clock = zonedClock;

  /** Words for an issue in the chart's legend. */
  protected issueLabel(issuedAt: string): string {
    return `Forecast issued ${zonedClock(issuedAt, this.series().timeZone)}`;
  }

  /** A forecast file was stored: say so and read the issues again, showing the newest. */
  protected stored(message: string): void {
    this.outcome.set(message);
    this.chosen.set(null);
    this.reloads.next();
  }
}
