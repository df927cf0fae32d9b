import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { RefitRunSummary } from '@loadwright/contracts';
import { NEVER, map } from 'rxjs';
import { OrganisationZone } from '../core/organisation/organisation-zone';
import { clockText } from '../refits/clock-text';
import { REFIT_POLL_TIMING, latestValue, pollWhileActive } from '../refits/live-polling';
import { RefitsClient } from '../refits/refits-client';
import { countsSentence, durationText, finishedPercent, outcomeText } from '../refits/run-progress';

/** The Overview's refit card: the run in progress with its progress bar, or the last run's outcome; live while open. */
@Component({
  selector: 'lw-refit-status',
  imports: [MatIconModule, MatProgressBarModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="refit-status-heading">
      <h3 id="refit-status-heading"><mat-icon aria-hidden="true" svgIcon="model_training"></mat-icon> Refits</h3>
      @if (run(); as current) {
        <p class="headline" [class.failed]="current.counts.failed > 0">
          {{ current.state === 'finished' ? 'Last run: ' + outcome(current) : 'Run #' + current.id + ' ' + outcome(current).toLowerCase() }}
        </p>
        <mat-progress-bar
          mode="determinate"
          [value]="percent(current)"
          [attr.aria-label]="'Refit run ' + current.id + ' progress'"
          [attr.aria-valuetext]="counts(current)"
        />
        <p class="detail">{{ counts(current) }} · {{ percent(current) }} %</p>
        <p class="detail">
          {{ current.trigger === 'schedule' ? 'Nightly' : 'Manual' }} run #{{ current.id }} started
          {{ clock(current.startedAt ?? current.createdAt) }}
          @if (current.finishedAt) {
            , finished {{ clock(current.finishedAt) }} after {{ duration(current.durationMs) }}
          }
        </p>
      } @else if (reading().state === 'loading') {
        <p class="detail">Reading the refit status…</p>
      } @else if (reading().state === 'answered') {
        <p class="headline">No refit has run yet</p>
        <p class="detail">The nightly schedule starts one at the refit hour.</p>
      }
      @if (reading(); as r) {
        @if (r.state === 'failed') {
          <p class="detail failed" role="status">Could not read the refit status; trying again in {{ r.nextInMs / 1000 }} s.</p>
        }
      }
      <a routerLink="/refits" class="more">Open Refits</a>
    </section>
  `,
  styleUrl: './overview-card.scss',
})
export class RefitStatus {
  private readonly client = inject(RefitsClient);
  /** Times on this screen are in the organisation's zone, named beside each. */
  protected readonly zone = inject(OrganisationZone);

  /** The newest run, polled each second while it moves and every 15 s when idle; stops when the Overview closes. */
  protected readonly reading = toSignal(
    pollWhileActive<RefitRunSummary | null>({
      read: () => this.client.list(1).pipe(map((list) => list.runs[0] ?? null)),
      isActive: (run) => run !== null && run.state !== 'finished',
      refresh: NEVER,
      timing: REFIT_POLL_TIMING,
    }),
    { requireSync: true },
  );
  /** The run shown. */
  protected readonly run = computed(() => latestValue(this.reading()));

  protected readonly clock = (iso: string | null, withSeconds = true) => clockText(iso, this.zone.timeZone(), withSeconds);
  protected readonly duration = durationText;
  protected readonly outcome = outcomeText;
  /** Finished share of a run. */
  protected percent(run: RefitRunSummary): number {
    return finishedPercent(run.counts);
  }
  /** Counts in words. */
  protected counts(run: RefitRunSummary): string {
    return countsSentence(run.counts);
  }
}
