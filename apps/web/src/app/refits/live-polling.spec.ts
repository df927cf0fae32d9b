import { Subject, type Observable, Subscription, of, throwError } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { type LiveReading, type PollTiming, latestValue, pollWhileActive, retryDelay } from './live-polling';

const timing: PollTiming = { activeMs: 1_000, idleMs: 15_000, firstRetryMs: 2_000, maxRetryMs: 60_000 };

describe('retryDelay', () => {
  it('doubles from the first retry and stops at the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 7].map((n) => retryDelay(n, timing))).toEqual([2_000, 4_000, 8_000, 16_000, 32_000, 60_000, 60_000]);
  });
});

describe('pollWhileActive', () => {
  let subscription: Subscription | undefined;
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => {
    subscription?.unsubscribe();
    vi.useRealTimers();
  });

  /** Subscribes to a feed whose reads answer from `answers` in turn, counting reads. */
  function follow(answers: (() => Observable<{ running: boolean }>)[], refresh = new Subject<void>()) {
    const readings: LiveReading<{ running: boolean }>[] = [];
    let reads = 0;
    subscription = pollWhileActive({
      read: () => answers[Math.min(reads++, answers.length - 1)]!(),
      isActive: (value) => value.running,
      refresh,
      timing,
    }).subscribe((reading) => readings.push(reading));
    return { readings, reads: () => reads, refresh };
  }

  it('reads every second while a run is active and every 15 s once idle', () => {
    const feed = follow([() => of({ running: true }), () => of({ running: true }), () => of({ running: false })]);
    expect(feed.reads()).toBe(1);
    vi.advanceTimersByTime(999);
    expect(feed.reads()).toBe(1);
    vi.advanceTimersByTime(1);
    expect(feed.reads()).toBe(2);
    vi.advanceTimersByTime(1_000);
    expect(feed.reads()).toBe(3);
    vi.advanceTimersByTime(14_999);
    expect(feed.reads()).toBe(3);
    vi.advanceTimersByTime(1);
    expect(feed.reads()).toBe(4);
    expect(feed.readings[0]).toEqual({ state: 'loading' });
  });

  it('backs off after failures, keeping the last good value, and returns to the normal cadence', () => {
    const failing = () => throwError(() => new Error('The Loadwright API cannot be reached.'));
    const feed = follow([() => of({ running: true }), failing, failing, failing, () => of({ running: true })]);
    vi.advanceTimersByTime(1_000); // second read fails
    const firstFailure = feed.readings.at(-1)!;
    expect(firstFailure).toMatchObject({ state: 'failed', failures: 1, nextInMs: 2_000, lastValue: { running: true } });
    vi.advanceTimersByTime(2_000);
    expect(feed.readings.at(-1)).toMatchObject({ state: 'failed', failures: 2, nextInMs: 4_000 });
    vi.advanceTimersByTime(3_999);
    expect(feed.reads()).toBe(3);
    vi.advanceTimersByTime(1);
    expect(feed.readings.at(-1)).toMatchObject({ state: 'failed', failures: 3, nextInMs: 8_000 });
    expect(latestValue(feed.readings.at(-1)!)).toEqual({ running: true });
    vi.advanceTimersByTime(8_000);
    expect(feed.readings.at(-1)).toMatchObject({ state: 'answered', active: true, nextInMs: 1_000 });
  });

  it('reads at once on refresh and stops reading when unsubscribed', () => {
    const feed = follow([() => of({ running: false })]);
    expect(feed.reads()).toBe(1);
    feed.refresh.next();
    expect(feed.reads()).toBe(2);
    subscription!.unsubscribe();
    vi.advanceTimersByTime(120_000);
    expect(feed.reads()).toBe(2);
  });
});
