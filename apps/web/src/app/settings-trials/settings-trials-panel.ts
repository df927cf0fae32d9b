import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import {
  type ApplySettingsTrialResult,
  type ModelSettings,
  type ModelSettingsRequest,
  type SeriesDetail,
  type SettingsTrial,
  type SettingsTrialList,
  sameModelSettings,
} from '@loadwright/contracts';
import { Subject, filter, switchMap } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { problemMessage } from '../core/problems/api-problem';
import { type PollTiming, latestValue, pollWhileActive } from '../refits/live-polling';
import { ModelSettingsDialog, type ModelSettingsDialogData } from '../series-page/model-settings-dialog';
import { zonedClock } from '../series-page/zoned-time';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { trialHeadline } from './comparison-rows';
import { changesInOneLine, settingChanges } from './settings-changes';
import { SettingsTrialsClient } from './settings-trials-client';
import { TrialComparison } from './trial-comparison';

/** One second while a trial runs (the progress bar moves), a minute otherwise (another planner may start one). */
const TRIAL_POLL_TIMING: PollTiming = { activeMs: 1_000, idleMs: 60_000, firstRetryMs: 2_000, maxRetryMs: 60_000 };

/** The editable part of read settings. */
function editable(settings: ModelSettings): ModelSettingsRequest {
  const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...rest } = settings;
  return rest;
}

/**
 * A series' settings trials: propose settings (the settings form), follow the running trial's progress, read every
 * trial tried so far, compare one side by side, and apply its proposal.
 */
@Component({
  selector: 'lw-settings-trials-panel',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, TrialComparison],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './settings-trials-panel.html',
  styleUrl: './settings-trials-panel.scss',
})
export class SettingsTrialsPanel {
  private readonly client = inject(SettingsTrialsClient);
  private readonly session = inject(SessionStore);
  private readonly dialog = inject(MatDialog);
  private readonly refresh = new Subject<void>();

  /** The load series. */
  readonly series = input.required<SeriesDetail>();
  /** Its settings in force (null when they could not be read). */
  readonly settings = input.required<ModelSettings | null>();
  /** A trial's proposal was applied: the page reads the series again. */
  readonly applied = output<ApplySettingsTrialResult>();

  /** True when the person may start and apply trials. */
  protected readonly canEdit = computed(() => this.session.permissions().has('models.edit'));

  /** The trials, polled fast while one runs; toSignal stops polling when the page is left. */
  private readonly reading = toSignal(
    toObservable(computed(() => this.series().id)).pipe(
      switchMap((seriesId) =>
        pollWhileActive<SettingsTrialList>({
          read: () => this.client.list(seriesId),
          isActive: (list) => list.trials.some((trial) => trial.state === 'queued' || trial.state === 'running'),
          refresh: this.refresh,
          timing: TRIAL_POLL_TIMING,
        }),
      ),
    ),
    { initialValue: { state: 'loading' } as const },
  );
  /** Every trial, newest first (kept while reads fail). */
  protected readonly trials = computed(() => latestValue(this.reading())?.trials ?? []);
  /** True until the first answer. */
  protected readonly loading = computed(() => this.reading().state === 'loading');
  /** Why the list could not be read, if it could not. */
  protected readonly readProblem = computed(() => {
    const reading = this.reading();
    return reading.state === 'failed' ? reading.problem : null;
  });
  /** The trial in progress, if any (one at a time per series). */
  protected readonly running = computed(() => this.trials().find((t) => t.state === 'queued' || t.state === 'running') ?? null);

  /** The trial a planner picked to compare; null follows the newest finished one. */
  private readonly chosenId = signal<number | null>(null);
  /** The trial compared side by side. */
  protected readonly selected = computed(() => {
    const trials = this.trials();
    const chosen = this.chosenId();
    return trials.find((t) => t.id === chosen) ?? trials.find((t) => t.state === 'finished') ?? null;
  });
  /** False when the series' settings changed after the selected trial started (it no longer compares with them). */
  protected readonly baselineCurrent = computed(() => {
    const trial = this.selected();
    const settings = this.settings();
    return !!trial && !!settings && sameModelSettings(editable(settings), trial.currentSettings);
  });

  /** What the last action did, and why the last one failed. */
  protected readonly outcome = signal<string | null>(null);
  protected readonly problem = signal<string | null>(null);
  /** True while applying. */
  protected readonly applying = signal(false);

  protected readonly clock = (iso: string) => zonedClock(iso, this.series().timeZone);
  protected readonly changesOf = (trial: SettingsTrial) => changesInOneLine(settingChanges(trial.currentSettings, trial.proposedSettings));
  protected readonly headlineOf = (trial: SettingsTrial) => (trial.results ? trialHeadline(trial.results, this.series().unit) : '');
  protected readonly percent = (trial: SettingsTrial) => Math.round((100 * trial.progress.done) / Math.max(1, trial.progress.total));

  /** Shows this trial side by side. */
  protected showTrial(trial: SettingsTrial): void {
    this.chosenId.set(trial.id);
  }

  /** Opens the settings form filled with the settings in force; its checked proposal starts a trial. */
  protected proposeSettings(): void {
    const settings = this.settings();
    if (!settings) return;
    const seriesId = this.series().id;
    this.dialog
      .open<ModelSettingsDialog, ModelSettingsDialogData, SettingsTrial>(ModelSettingsDialog, {
        data: {
          seriesId,
          settings,
          submit: {
            title: 'Try other settings',
            hint: 'Nothing changes yet: these settings and the ones in force are both backtested from the same 14 daily origins, and you can apply them afterwards.',
            label: 'Start trial',
            send: (proposed) => this.client.start(seriesId, proposed),
          },
        },
        width: '620px',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .pipe(filter((trial): trial is SettingsTrial => !!trial))
      .subscribe((trial) => {
        this.problem.set(null);
        this.chosenId.set(trial.id);
        this.outcome.set(`Trial ${trial.id} started: ${trial.progress.total} refits, current and proposed settings at each origin.`);
        this.refresh.next();
      });
  }

  /** Asks, then saves the trial's proposal as the series' settings and queues a refit with them. */
  protected applyTrial(trial: SettingsTrial): void {
    const changes = changesInOneLine(settingChanges(trial.currentSettings, trial.proposedSettings));
    confirmAction(this.dialog, {
      title: `Apply the settings of trial ${trial.id}?`,
      consequence: `${this.series().name} will be modelled with them from now on (${changes}). The change is recorded in the audit log and a refit of the series is queued.`,
      confirmLabel: 'Apply these settings',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => {
          this.applying.set(true);
          this.problem.set(null);
          return this.client.apply(trial.id);
        }),
      )
      .subscribe({
        next: (result) => {
          this.applying.set(false);
          this.outcome.set(
            `Applied the settings of trial ${trial.id}.${result.refitRunId ? ` Refit run ${result.refitRunId} is queued with them.` : ' They apply from the next refit.'}`,
          );
          this.refresh.next();
          this.applied.emit(result);
        },
        error: (error: unknown) => {
          this.applying.set(false);
          this.problem.set(problemMessage(error));
        },
      });
  }
}
