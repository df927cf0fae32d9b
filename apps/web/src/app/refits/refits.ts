import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { RefitRunDetail, RefitRunSummary } from '@loadwright/contracts';
import { type Observable, Subject, map, of, switchMap } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { methodName } from '../series-page/chart-data';
import { OrganisationZone } from '../core/organisation/organisation-zone';
import { clockText } from './clock-text';
import { REFIT_POLL_TIMING, latestValue, pollWhileActive } from './live-polling';
import { RefitNow } from './refit-now';
import { RefitsClient } from './refits-client';
import { countsSentence, durationText, finishedPercent, outcomeText, scopeText } from './run-progress';

/** A run's summary, from its detail. */
function summaryOf(detail: RefitRunDetail): RefitRunSummary {
  const { series: _series, ...summary } = detail;
  return summary;
}

/** What the Refits page reads on every poll. */
interface RefitsView {
  readonly runs: RefitRunSummary[];
  readonly detail: RefitRunDetail | null;
}

/** The Refits page: runs with live progress, one run's series in detail, and "Refit now" for planners. */
@Component({
  selector: 'lw-refits',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, RefitNow],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './refits.html',
  styleUrl: './refits.scss',
})
export class Refits {
  private readonly client = inject(RefitsClient);
  /** Times on this screen are in the organisation's zone, named beside each. */
  protected readonly zone = inject(OrganisationZone);
  private readonly session = inject(SessionStore);
  private readonly refresh = new Subject<void>();

  /** The run whose series are listed; null follows the newest run. */
  protected readonly chosenRunId = signal<number | null>(null);
  /** True when the person may start runs. */
  protected readonly canRefit = computed(() => this.session.permissions().has('models.edit'));

  /** Polls fast while a run is active and slowly when idle; toSignal stops it when the page is left. */
  protected readonly reading = toSignal(
    pollWhileActive<RefitsView>({
      read: () => this.readView(),
      isActive: (view) => view.runs.some((run) => run.state !== 'finished'),
      refresh: this.refresh,
    }),
    { requireSync: true },
  );
  /** The latest view, kept while reads fail. */
  protected readonly view = computed(() => latestValue(this.reading()));
  /** The run listed in detail. */
  protected readonly detail = computed(() => this.view()?.detail ?? null);
  /** How often the page reads now, in words. */
  protected readonly cadence = computed(() => {
    const reading = this.reading();
    if (reading.state === 'loading') return 'Reading…';
    if (reading.state === 'failed')
      return `Could not read the refit status (${reading.failures} ${reading.failures === 1 ? 'try' : 'tries'}); trying again in ${reading.nextInMs / 1000} s`;
    return reading.active
      ? `A run is going: updating every ${REFIT_POLL_TIMING.activeMs / 1000} s`
      : `Idle: checking every ${REFIT_POLL_TIMING.idleMs / 1000} s`;
  });

  protected readonly clock = (iso: string | null, withSeconds = true) => clockText(iso, this.zone.timeZone(), withSeconds);
  protected readonly duration = durationText;
  protected readonly percent = finishedPercent;
  protected readonly countsText = countsSentence;
  protected readonly outcome = outcomeText;
  protected readonly methodOf = methodName;

  /** What a run covered, in words. */
  protected scopeOf(run: RefitRunSummary): string {
    return scopeText(run);
  }

  /** Lists one run's series. */
  protected showRun(id: number): void {
    this.chosenRunId.set(id);
    this.refresh.next();
  }

  /** A run was started: follow it at once. */
  protected followStartedRun(run: RefitRunSummary): void {
    this.chosenRunId.set(run.id);
    this.refresh.next();
  }

  /** Reads the run list and the detail of the chosen (or newest) run. */
  private readView(): Observable<RefitsView> {
    return this.client.list(20).pipe(
      switchMap(({ runs }) => {
        const id = this.chosenRunId() ?? runs[0]?.id ?? null;
        const detail: Observable<RefitRunDetail | null> = id === null ? of(null) : this.client.detail(id);
        // The detail is read after the list: its counts are the newer ones, so the chosen row shows them too.
        return detail.pipe(
          map((found) => ({ runs: runs.map((run) => (found && run.id === found.id ? summaryOf(found) : run)), detail: found })),
        );
      }),
    );
  }
}
