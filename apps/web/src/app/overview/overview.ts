import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Subject } from 'rxjs';
import { HealthClient } from '../core/health/health-client';
import { HEALTH_POLL_INTERVAL_MS, pollHealth } from './health-feed';
import { type HealthReading, databaseLine, queueLine, verdictOf, workersLine } from './health-reading';
import { ComponentStatus } from './component-status';
import { RefitStatus } from './refit-status';
import { SystemPeak } from './system-peak';
import { OpenMisses } from './open-misses';
import { ForecastAccuracy } from './forecast-accuracy';

/** The Overview: the night's refits and the week's system peak, then service health, each kept live while the page is open. */
@Component({
  selector: 'lw-overview',
  imports: [DatePipe, MatButtonModule, MatIconModule, ComponentStatus, RefitStatus, SystemPeak, OpenMisses, ForecastAccuracy],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './overview.html',
  styleUrl: './overview.scss',
})
export class Overview {
  private readonly healthClient = inject(HealthClient);
  private readonly checkRequests = new Subject<void>();

  /** Latest reading; toSignal unsubscribes, and so stops polling, when the page is left. */
  protected readonly reading = toSignal(pollHealth({ read: () => this.healthClient.read(), checkNow: this.checkRequests }), {
    initialValue: { state: 'checking' } satisfies HealthReading as HealthReading,
  });
  /** The headline verdict for the top of the health section. */
  protected readonly verdict = computed(() => verdictOf(this.reading()));
  /** The report of the latest answered check, or null while checking or when unreachable. */
  protected readonly report = computed(() => {
    const reading = this.reading();
    return reading.state === 'answered' ? reading.report : null;
  });
  /** Database line of the latest report. */
  protected readonly database = computed(() => {
    const report = this.report();
    return report ? databaseLine(report) : null;
  });
  /** Job queue line of the latest report. */
  protected readonly queue = computed(() => {
    const report = this.report();
    return report ? queueLine(report) : null;
  });
  /** Workers line of the latest report. */
  protected readonly workers = computed(() => {
    const report = this.report();
    return report ? workersLine(report) : null;
  });
  /** Time of the latest check, answered or not. */
  protected readonly checkedAt = computed(() => {
    const reading = this.reading();
    return reading.state === 'checking' ? null : reading.checkedAt;
  });
  /** When the API is unreachable: when it last answered, if it ever did since the page opened. */
  protected readonly lastAnswerAt = computed(() => {
    const reading = this.reading();
    return reading.state === 'unreachable' && reading.lastReport ? new Date(reading.lastReport.checkedAt) : null;
  });
  /** Seconds between checks, for the page to state. */
  protected readonly intervalSeconds = HEALTH_POLL_INTERVAL_MS / 1000;

  /** Checks health at once and restarts the 10-second cadence. */
  protected checkNow(): void {
    this.checkRequests.next();
  }
}
