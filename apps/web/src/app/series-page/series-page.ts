import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import {
  type ApprovalResult,
  type AssumedTemperatures,
  type FitSummary,
  type ForecastReview,
  type ForecastVersionPage,
  type ModelSettings,
  type ReconciliationResult,
  type SeriesDetail,
  type TemperatureScenario,
  forecastExportPath,
  modelMethodLabels,
  versionTimeliness,
} from '@loadwright/contracts';
import { provideCharts, withDefaultRegisterables } from 'ng2-charts';
import { type Observable, Subject, catchError, combineLatest, filter, forkJoin, map, of, startWith, switchMap } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { SettingsTrialsPanel } from '../settings-trials/settings-trials-panel';
import { problemMessage } from '../core/problems/api-problem';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { AdjustmentsPanel } from './adjustments-panel';
import { CoherencePanel } from './coherence-panel';
import { horizonPeak, methodName, peakRows, peakShiftText, reviewedVersion } from './chart-data';
import { unitLabel, withUnit } from './chart-theme';
import { ForecastChart } from './forecast-chart';
import { GroupApproval } from './group-approval';
import { HistoryChart } from './history-chart';
import { ModelCard } from './model-card';
import { ModelSettingsDialog, type ModelSettingsDialogData } from './model-settings-dialog';
import { SeriesPageClient } from './series-page-client';
import { zoneAbbreviation, zonedClock } from './zoned-time';
import { WeatherScenarios } from '../weather-scenarios/weather-scenarios';
import { StationForecasts } from '../station/station-forecasts';

/** Everything the page reads about one series. */
type PageState =
  | { readonly state: 'loading' }
  | { readonly state: 'failed'; readonly problem: string }
  | {
      readonly state: 'ready';
      readonly series: SeriesDetail;
      readonly review: ForecastReview | null;
      readonly versions: ForecastVersionPage | null;
      readonly fit: FitSummary | null;
      readonly settings: ModelSettings | null;
      readonly temperatures: AssumedTemperatures | null;
    };

/** Reads an optional part of the page: null when the series has none yet (404) or it fails. */
const optional = <T>(source: Observable<T>): Observable<T | null> => source.pipe(catchError(() => of(null)));

/** One series: history, forecast fan chart with 80/95 % bands, peaks, adjustments, approval, export, model card, versions. */
import { SeriesAccuracy } from '../series-accuracy/series-accuracy';

@Component({
  selector: 'lw-series-page',
  imports: [
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    AdjustmentsPanel,
    CoherencePanel,
    ForecastChart,
    GroupApproval,
    HistoryChart,
    ModelCard,
    SeriesAccuracy,
    SettingsTrialsPanel,
    StationForecasts,
    WeatherScenarios,
  ],
  providers: [
    provideCharts(withDefaultRegisterables(), { defaults: { font: { family: "'Source Sans 3', system-ui, sans-serif", size: 13 } } }),
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './series-page.html',
  styleUrl: './series-page.scss',
})
export class SeriesPage {
  private readonly client = inject(SeriesPageClient);
  private readonly session = inject(SessionStore);
  private readonly dialog = inject(MatDialog);
  private readonly reloads = new Subject<void>();

  /** The series id from the address. */
  readonly id = input.required<string>();

  /** The page's data; reloaded after an adjustment, an approval or new settings. */
  protected readonly page = toSignal(
    combineLatest([toObservable(this.id), this.reloads.pipe(startWith(undefined))]).pipe(
      switchMap(([id]) => {
        const seriesId = Number(id);
        return this.client.series(seriesId).pipe(
          switchMap((series) => {
            // A temperature station has no model, fit or assumed temperatures: asking would only earn 404s.
            const load = series.kind === 'load';
            return forkJoin({
              review: optional(this.client.forecast(seriesId)),
              versions: optional(this.client.versions(seriesId)),
              fit: load ? optional(this.client.fit(seriesId)) : of(null),
              settings: load ? optional(this.client.modelSettings(seriesId)) : of(null),
              temperatures: load ? optional(this.client.assumedTemperatures(seriesId)) : of(null),
            }).pipe(map((data): PageState => ({ state: 'ready', series, ...data })));
          }),
          catchError((error: unknown) => of<PageState>({ state: 'failed', problem: problemMessage(error) })),
        );
      }),
    ),
    { initialValue: { state: 'loading' } as PageState },
  );

  /** The loaded data, or null. */
  protected readonly data = computed(() => {
    const page = this.page();
    return page.state === 'ready' ? page : null;
  });
  /** The version a planner reviews (draft, else approved). */
  protected readonly version = computed(() => {
    const review = this.data()?.review;
    return review ? reviewedVersion(review) : null;
  });
  /** Daily peak rows. */
  protected readonly peaks = computed(() => {
    const review = this.data()?.review;
    return review ? peakRows(review) : [];
  });
  /** Highest peak of the draft and of the approved version over their horizons. */
  protected readonly draftPeak = computed(() => horizonPeak(this.data()?.review?.draft ?? null));
  protected readonly approvedPeak = computed(() => horizonPeak(this.data()?.review?.approved ?? null));

  /** How much of the draft and of the approved version is still ahead; stale when most hours have passed. */
  protected readonly draftTimeliness = computed(() => {
    const draft = this.data()?.review?.draft;
    return draft ? versionTimeliness(draft) : null;
  });
  protected readonly approvedTimeliness = computed(() => {
    const approved = this.data()?.review?.approved;
    return approved ? versionTimeliness(approved) : null;
  });

  /** Permissions of the person looking. */
  protected readonly canApprove = computed(() => this.session.permissions().has('forecasts.approve'));
  protected readonly canEditModel = computed(() => this.session.permissions().has('models.edit'));
  protected readonly canUpload = computed(() => this.session.permissions().has('data.upload'));

  /** Weather scenarios the planner chose to draw on the fan chart. */
  protected readonly scenarioLines = signal<TemperatureScenario[]>([]);
  /** Changes when the reviewed version or its adjustments change, so the scenarios are read again. */
  protected readonly scenarioRevision = computed(() => {
    const version = this.version();
    return version ? `${version.id}:${version.adjustments.map((a) => a.id).join(',')}` : '';
  });

  /** Time zone of the export: UTC or the series' own. */
  protected readonly exportZone = signal<'utc' | 'series'>('series');
  /** The CSV download link of the approved forecast. */
  protected readonly exportLink = computed(() => {
    const series = this.data()?.series;
    if (!series) return null;
    return forecastExportPath({ format: 'csv', seriesIds: [series.id], timeZone: this.exportZone() === 'utc' ? 'UTC' : series.timeZone });
  });

  /** What the last action did, announced. */
  protected readonly outcome = signal<string | null>(null);
  /** Why the last action failed. */
  protected readonly actionProblem = signal<string | null>(null);
  /** True while approving. */
  protected readonly approving = signal(false);

  protected readonly amount = withUnit;
  protected readonly unit = unitLabel;
  protected readonly shiftText = peakShiftText;
  protected readonly methodOf = methodName;
  protected readonly clockIn = zonedClock;
  protected readonly zoneAt = zoneAbbreviation;

  /** Reads the page again. */
  protected reload(): void {
    this.reloads.next();
  }

  /** Asks, then approves the draft; the approved version is superseded. */
  protected approveDraft(): void {
    const review = this.data()?.review;
    const draft = review?.draft;
    if (!review || !draft) return;
    const adjustments = draft.adjustments.length
      ? ` with ${draft.adjustments.length} adjustment${draft.adjustments.length === 1 ? '' : 's'}`
      : '';
    const timeliness = versionTimeliness(draft);
    const staleWarning = timeliness.stale
      ? ` ${timeliness.hoursPassed} of its ${draft.horizonHours} hours have already passed: it no longer describes the week ahead.`
      : '';
    confirmAction(this.dialog, {
      title: timeliness.stale ? `Approve the stale draft of ${review.series.name}?` : `Approve the draft of ${review.series.name}?`,
      consequence: `The draft issued ${zonedClock(draft.issuedAt, review.series.timeZone)}${adjustments} becomes the forecast handed on in exports and the API${review.approved ? ', and the version approved before it is superseded' : ''}. Approved versions cannot be changed.${staleWarning}`,
      confirmLabel: timeliness.stale ? 'Approve anyway' : 'Approve',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => {
          this.approving.set(true);
          this.actionProblem.set(null);
          return this.client.approve(draft.id);
        }),
      )
      .subscribe({
        next: () => {
          this.approving.set(false);
          this.outcome.set(`Approved version ${draft.id}. Exports and the API now hand it on.`);
          this.reload();
        },
        error: (error: unknown) => {
          this.approving.set(false);
          this.actionProblem.set(problemMessage(error));
        },
      });
  }

  /** Opens the model settings dialog and shows the saved settings. */
  protected editModelSettings(): void {
    const data = this.data();
    if (!data?.settings) return;
    this.dialog
      .open<ModelSettingsDialog, ModelSettingsDialogData, ModelSettings>(ModelSettingsDialog, {
        data: { seriesId: data.series.id, settings: data.settings },
        width: '620px',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .pipe(filter((saved): saved is ModelSettings => !!saved))
      .subscribe((saved) => {
        this.outcome.set(`Model settings saved: ${modelMethodLabels[saved.method]}. They apply from the next refit.`);
        this.reload();
      });
  }

  /** A settings trial's proposal became the series' settings: the model settings and the refit follow. */
  protected settingsTrialApplied(): void {
    this.reload();
  }

  /** The group's drafts were approved. */
  protected groupApproved(result: ApprovalResult): void {
    this.outcome.set(`Approved ${result.approved.length} drafts of the group together.`);
    this.reload();
  }

  /** A reconciliation wrote a coherent set of drafts for this series and below. */
  protected hierarchyReconciled(result: ReconciliationResult): void {
    this.outcome.set(`Reconciled ${result.versions.length} drafts (${result.method}); they are approved together.`);
    this.reload();
  }

  /** An adjustment was added or removed. */
  protected adjustmentsChanged(): void {
    this.outcome.set('Adjustments saved; the chart and peaks show the adjusted numbers.');
    this.reload();
  }
}
