import type { HealthReport } from '@loadwright/contracts';
import { NEVER, Observable, Subject, of, throwError } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { pollHealth } from './health-feed';
import type { HealthReading } from './health-reading';

const report: HealthReport = {
  status: 'ok',
  version: '0.1.0',
  checkedAt: '2026-12-02T07:00:00.000Z',
  database: { ok: true, latencyMs: 1, detail: 'connected' },
  queue: { ok: true, latencyMs: 2, detail: '0 queues', queues: [] },
  workers: { ok: false, latencyMs: 1, detail: '0 workers running', processes: [] },
};

/** A read function that answers from a script, one entry per call, and counts its calls. */
function scriptedRead(answers: Array<() => Observable<HealthReport>>) {
  let calls = 0;
  const read = () => {
    const answer = answers[Math.min(calls, answers.length - 1)]!;
    calls += 1;
    return answer();
  };
  return { read, calls: () => calls };
}

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe('pollHealth', () => {
  it('starts as checking, reads at once and then every interval', () => {
    const source = scriptedRead([() => of(report)]);
    const readings: HealthReading[] = [];
    const subscription = pollHealth({ read: source.read, checkNow: NEVER, intervalMs: 10_000 }).subscribe((reading) =>
      readings.push(reading),
    );
    vi.advanceTimersByTime(0);
    expect(readings.map((reading) => reading.state)).toEqual(['checking', 'answered']);
    vi.advanceTimersByTime(9_999);
    expect(source.calls()).toBe(1);
    vi.advanceTimersByTime(1);
    expect(source.calls()).toBe(2);
    subscription.unsubscribe();
  });

  it('turns a failed read into an unreachable reading that keeps the last report', () => {
    const source = scriptedRead([() => of(report), () => throwError(() => new Error('The Loadwright API cannot be reached.'))]);
    const readings: HealthReading[] = [];
    const subscription = pollHealth({ read: source.read, checkNow: NEVER, intervalMs: 10_000 }).subscribe((reading) =>
      readings.push(reading),
    );
    vi.advanceTimersByTime(10_000);
    expect(readings.at(-1)).toMatchObject({ state: 'unreachable', problem: 'The Loadwright API cannot be reached.', lastReport: report });
    // The feed survives the failure and keeps polling.
    vi.advanceTimersByTime(10_000);
    expect(source.calls()).toBe(3);
    subscription.unsubscribe();
  });

  it('checks at once on request and restarts the interval from there', () => {
    const source = scriptedRead([() => of(report)]);
    const checkNow = new Subject<void>();
    const subscription = pollHealth({ read: source.read, checkNow, intervalMs: 10_000 }).subscribe();
    vi.advanceTimersByTime(6_000);
    checkNow.next();
    vi.advanceTimersByTime(0);
    expect(source.calls()).toBe(2);
    vi.advanceTimersByTime(9_999);
    expect(source.calls()).toBe(2);
    vi.advanceTimersByTime(1);
    expect(source.calls()).toBe(3);
    subscription.unsubscribe();
  });

  it('abandons a slow answer when the next check starts', () => {
    const slow = new Subject<HealthReport>();
    const source = scriptedRead([() => slow, () => of({ ...report, version: '0.2.0' })]);
    const checkNow = new Subject<void>();
    const readings: HealthReading[] = [];
    const subscription = pollHealth({ read: source.read, checkNow, intervalMs: 10_000 }).subscribe((reading) => readings.push(reading));
    vi.advanceTimersByTime(3_000);
    checkNow.next();
    vi.advanceTimersByTime(0);
    slow.next(report);
    expect(readings.map((reading) => (reading.state === 'answered' ? reading.report.version : reading.state))).toEqual([
      'checking',
      '0.2.0',
    ]);
    subscription.unsubscribe();
  });

  it('reads a check that outlasts its time limit as unreachable', () => {
    const source = scriptedRead([() => NEVER]);
    const readings: HealthReading[] = [];
    const subscription = pollHealth({ read: source.read, checkNow: NEVER, intervalMs: 10_000, answerWithinMs: 8_000 }).subscribe(
      (reading) => readings.push(reading),
    );
    vi.advanceTimersByTime(7_999);
    expect(readings.map((reading) => reading.state)).toEqual(['checking']);
    vi.advanceTimersByTime(1);
    expect(readings.at(-1)).toMatchObject({ state: 'unreachable', problem: 'The Loadwright API did not answer within 8 seconds.' });
    subscription.unsubscribe();
  });

  it('stops reading once unsubscribed', () => {
    const source = scriptedRead([() => of(report)]);
    pollHealth({ read: source.read, checkNow: NEVER, intervalMs: 10_000 }).subscribe().unsubscribe();
    vi.advanceTimersByTime(60_000);
    expect(source.calls()).toBeLessThanOrEqual(1);
  });
});
