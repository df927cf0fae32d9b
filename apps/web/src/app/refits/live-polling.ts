import { Observable, catchError, expand, map, of, startWith, switchMap, timer } from 'rxjs';

/** Cadence of a live view: fast while something is running, slow when idle, backing off on failures. */
export interface PollTiming {
  /** Milliseconds between reads while a run is active. */
  readonly activeMs: number;
  /** Milliseconds between reads while nothing runs. */
  readonly idleMs: number;
  /** Wait after the first failure; each further failure in a row doubles it. */
  readonly firstRetryMs: number;
  /** The longest wait after failures. */
  readonly maxRetryMs: number;
}

/** One second while a run moves, fifteen when idle, 2 s doubling to 60 s after failures. */
export const REFIT_POLL_TIMING: PollTiming = { activeMs: 1_000, idleMs: 15_000, firstRetryMs: 2_000, maxRetryMs: 60_000 };

/** What a live view knows after each read. */
export type LiveReading<T> =
  | { readonly state: 'loading' }
  | { readonly state: 'answered'; readonly value: T; readonly active: boolean; readonly checkedAt: Date; readonly nextInMs: number }
  | {
      readonly state: 'failed';
      readonly problem: string;
      /** Failures in a row so far. */
      readonly failures: number;
      /** The last good value, so the page keeps showing how things stood. */
      readonly lastValue: T | null;
      readonly checkedAt: Date;
      readonly nextInMs: number;
    };

/** Milliseconds to wait after `failures` failed reads in a row (1, 2, 3 …): doubling from the first retry, capped. */
export function retryDelay(failures: number, timing: PollTiming): number {
  return Math.min(timing.maxRetryMs, timing.firstRetryMs * 2 ** Math.max(0, failures - 1));
}

/** What {@link pollWhileActive} needs. */
export interface LiveSource<T> {
  /** Reads the view's data once. */
  readonly read: () => Observable<T>;
  /** True when the value shows work in progress (the next read then comes fast). */
  readonly isActive: (value: T) => boolean;
  /** Each emission reads at once and restarts the cadence (e.g. after starting a run). */
  readonly refresh: Observable<void>;
  readonly timing?: PollTiming;
  /** Clock for `checkedAt`; replaceable in tests. */
  readonly now?: () => Date;
}

/**
 * Reads at once, then again after a delay chosen by what the last read said: `activeMs` while work is
 * in progress, `idleMs` when idle, and a doubling back-off after failures. Each read waits for the
 * previous one (expand), so answers never arrive out of order; `refresh` starts over at once (switchMap).
 * Unsubscribing — leaving the page — stops it.
 */
export function pollWhileActive<T>({
  read,
  isActive,
  refresh,
  timing = REFIT_POLL_TIMING,
  now = () => new Date(),
}: LiveSource<T>): Observable<LiveReading<T>> {
  const readOnce = (previous: LiveReading<T> | null): Observable<LiveReading<T>> =>
    read().pipe(
      map((value): LiveReading<T> => {
        const active = isActive(value);
        return { state: 'answered', value, active, checkedAt: now(), nextInMs: active ? timing.activeMs : timing.idleMs };
      }),
      catchError((error: unknown) => {
        const failures = previous?.state === 'failed' ? previous.failures + 1 : 1;
        const lastValue = previous?.state === 'answered' ? previous.value : previous?.state === 'failed' ? previous.lastValue : null;
        return of<LiveReading<T>>({
          state: 'failed',
          problem: messageOf(error),
          failures,
          lastValue,
          checkedAt: now(),
          nextInMs: retryDelay(failures, timing),
        });
      }),
    );
  return refresh.pipe(
    startWith(undefined),
    switchMap(() =>
      readOnce(null).pipe(
        expand((reading) =>
          reading.state === 'loading' ? of<LiveReading<T>>() : timer(reading.nextInMs).pipe(switchMap(() => readOnce(reading))),
        ),
      ),
    ),
    startWith<LiveReading<T>>({ state: 'loading' }),
  );
}

/** The value to show: the answer, or the last good one while reads fail. */
export function latestValue<T>(reading: LiveReading<T>): T | null {
  return reading.state === 'answered' ? reading.value : reading.state === 'failed' ? reading.lastValue : null;
}

/** The error's own message when it has one; ApiProblem messages are fit to show. */
function messageOf(error: unknown): string {
  return error instanceof Error && error.message ? error.message : 'The refit status could not be read.';
}
