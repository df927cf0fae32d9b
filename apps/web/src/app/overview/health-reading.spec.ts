import type { HealthReport } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { databaseLine, failingComponents, formatLatency, queueLine, verdictOf, workersLine } from './health-reading';

/** A report as the API writes it when everything answers. */
function healthyReport(): HealthReport {
  return {
    status: 'ok',
    version: '0.1.0',
    checkedAt: '2026-12-02T07:00:00.000Z',
    database: { ok: true, latencyMs: 1.84, detail: 'connected' },
    queue: { ok: true, latencyMs: 12.6, detail: '2 queues', queues: [{ name: 'refit-series', queued: 3, active: 1, failed: 0 }] },
    workers: {
      ok: true,
      latencyMs: 2.1,
      detail: '1 worker running, 1 job in hand',
      processes: [
        {
          name: 'worker-1',
          host: 'planning-01',
          pid: 4242,
          startedAt: '2026-12-02T06:00:00.000Z',
          lastBeatAt: '2026-12-02T06:59:55.000Z',
          beatSeconds: 10,
          live: true,
          jobsInHand: 1,
        },
      ],
    },
  };
}

describe('verdictOf', () => {
  it('is pending while the first check runs', () => {
    expect(verdictOf({ state: 'checking' })).toMatchObject({ tone: 'pending', headline: 'Checking service health…' });
  });

  it('reports all services working on a healthy report', () => {
    expect(verdictOf({ state: 'answered', report: healthyReport(), checkedAt: new Date() })).toMatchObject({
      tone: 'good',
      icon: 'check_circle',
      headline: 'All services working',
    });
  });

  it('names the one failing component of a degraded report', () => {
    const report: HealthReport = {
      ...healthyReport(),
      status: 'degraded',
      queue: { ok: false, latencyMs: null, detail: 'job queue not installed yet', queues: [] },
    };
    const verdict = verdictOf({ state: 'answered', report, checkedAt: new Date() });
    expect(verdict).toMatchObject({ tone: 'warning', headline: 'Service degraded' });
    expect(verdict.detail).toMatch(/^The job queue is not working\./);
  });

  it('names both failing components with a plural verb', () => {
    const report: HealthReport = {
      ...healthyReport(),
      status: 'degraded',
      database: { ok: false, latencyMs: null, detail: 'connection refused' },
      queue: { ok: false, latencyMs: null, detail: 'database unreachable', queues: [] },
    };
    expect(verdictOf({ state: 'answered', report, checkedAt: new Date() }).detail).toBe(
      'The database and the job queue are not working. Uploads, refits and forecasts may wait until they recover.',
    );
  });

  it('names the worker when the database answers but no worker beats, and lists three components in one sentence', () => {
    const healthy = healthyReport();
    const stopped = { ...healthy.workers.processes[0]!, live: false, jobsInHand: 0 };
    const noWorker: HealthReport = {
      ...healthy,
      status: 'degraded',
      workers: { ok: false, latencyMs: 1, detail: '0 workers running: a worker stopped sending heartbeats', processes: [stopped] },
    };
    expect(verdictOf({ state: 'answered', report: noWorker, checkedAt: new Date() }).detail).toBe(
      'The worker is not working. Uploads, refits and forecasts may wait until it recovers.',
    );
    const all: HealthReport = { ...noWorker, queue: { ...healthy.queue, ok: false } };
    expect(failingComponents(all)).toEqual(['the job queue', 'the worker']);
  });

  it('passes the reason through when the API is unreachable', () => {
    const verdict = verdictOf({
      state: 'unreachable',
      problem: 'The Loadwright API cannot be reached.',
      checkedAt: new Date(),
      lastReport: null,
    });
    expect(verdict).toEqual({
      tone: 'problem',
      icon: 'cloud_off',
      headline: 'API unreachable',
      detail: 'The Loadwright API cannot be reached.',
    });
  });
});

describe('component lines', () => {
  it('say the state in words, not only with an icon', () => {
    const report = healthyReport();
    expect(databaseLine(report)).toMatchObject({ ok: true, icon: 'check_circle', text: 'Database: connected', latency: '1.8 ms' });
    expect(queueLine(report)).toMatchObject({ ok: true, text: 'Job queue: ready', detail: '2 queues', latency: '13 ms' });
  });

  it('show the API detail when a component fails', () => {
    const report: HealthReport = {
      ...healthyReport(),
      status: 'degraded',
      database: { ok: false, latencyMs: null, detail: 'connection refused' },
    };
    expect(databaseLine(report)).toEqual({
      ok: false,
      icon: 'error',
      text: 'Database: not responding',
      detail: 'connection refused',
      latency: null,
    });
    expect(failingComponents(report)).toEqual(['the database']);
  });
});

describe('formatLatency', () => {
  it('keeps one decimal below 10 ms and rounds above', () => {
    expect(formatLatency(0.04)).toBe('0.0 ms');
    expect(formatLatency(9.94)).toBe('9.9 ms');
    expect(formatLatency(10.4)).toBe('10 ms');
    expect(formatLatency(null)).toBeNull();
  });
});

describe('workersLine', () => {
  it('counts the live workers', () => {
    expect(workersLine(healthyReport())).toEqual({
      ok: true,
      icon: 'check_circle',
      text: 'Workers: 1 running',
      detail: '1 worker running, 1 job in hand',
      latency: '2.1 ms',
    });
  });

  it('says none runs when every heartbeat is stale, and unknown while the database is away', () => {
    const report = healthyReport();
    const stopped: HealthReport = { ...report, workers: { ...report.workers, ok: false, processes: [] } };
    expect(workersLine(stopped).text).toBe('Workers: none running');
    const noDatabase: HealthReport = { ...stopped, database: { ok: false, latencyMs: null, detail: 'connection refused' } };
    expect(workersLine(noDatabase).text).toBe('Workers: unknown');
  });
});
