import type { HealthReport } from '@loadwright/contracts';
import { Observable, catchError, map, of, scan, startWith, switchMap, throwError, timeout, timer } from 'rxjs';
import type { HealthReading } from './health-reading';

/** How often the Overview asks for health; the page says this number to its readers. */
export const HEALTH_POLL_INTERVAL_MS = 10_000;

/** How long one check may take before the API counts as unreachable; shorter than the interval. */
export const HEALTH_ANSWER_WITHIN_MS = 8_000;

/** What {@link pollHealth} needs: one read of the report, and a signal to check again now. */
export interface HealthFeedSource {
  /** Reads the report once; fails with an Error whose message is fit to show. */
  readonly read: () => Observable<HealthReport>;
  /** Each emission checks at once and restarts the interval. */
  readonly checkNow: Observable<void>;
  /** Milliseconds between checks. */
  readonly intervalMs?: number;
  /** Milliseconds one check may take; a hung API then reads as unreachable instead of stale. */
  readonly answerWithinMs?: number;
  /** Clock for `checkedAt`; replaceable in tests. */
  readonly now?: () => Date;
}

/**
 * Polls health: checks at once, then every interval, and again whenever `checkNow` emits. A check that
 * takes too long counts as unreachable, and one still running is abandoned when the next starts
 * (switchMap), so readings never arrive out of order.
 * Unsubscribing (leaving the page) stops the polling.
 */
export function pollHealth({
  read,
  checkNow,
  intervalMs = HEALTH_POLL_INTERVAL_MS,
  answerWithinMs = HEALTH_ANSWER_WITHIN_MS,
  now = () => new Date(),
}: HealthFeedSource): Observable<HealthReading> {
  const tooSlow = () => throwError(() => new Error(`The Loadwright API did not answer within ${answerWithinMs / 1000} seconds.`));
  return checkNow.pipe(
    startWith(undefined),
    switchMap(() => timer(0, intervalMs)),
    switchMap(() =>
      read().pipe(
        timeout({ first: answerWithinMs, with: tooSlow }),
        map((report): HealthReading => ({ state: 'answered', report, checkedAt: now() })),
        catchError((error: unknown) =>
          of<HealthReading>({ state: 'unreachable', problem: messageOf(error), checkedAt: now(), lastReport: null }),
        ),
      ),
    ),
    // Carry the last good report into failures, so the page can say how things stood.
    scan(
      (previous: HealthReading, next: HealthReading): HealthReading => {
        if (next.state !== 'unreachable') return next;
        const lastReport = previous.state === 'answered' ? previous.report : previous.state === 'unreachable' ? previous.lastReport : null;
        return { ...next, lastReport };
      },
      { state: 'checking' } as HealthReading,
    ),
    startWith<HealthReading>({ state: 'checking' }),
  );
}

/** The error's own message when it has one; errors from HealthClient carry planner-ready text. */
function messageOf(error: unknown): string {
  return error instanceof Error && error.message ? error.message : 'The health check failed unexpectedly.';
}
