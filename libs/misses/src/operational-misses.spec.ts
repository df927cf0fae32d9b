import { describe, expect, it } from 'vitest';
import { actualsLate, estimatedHours, forecastLate, localWallInstant } from './operational-misses';
import { hours, rule } from './spec-points';

describe('actualsLate', () => {
  const late6 = rule('actuals_late', { threshold: 6 });
  const last = new Date('2026-06-01T00:00:00Z'); // hourly reading covering 00:00–01:00

  it('does not fire at exactly the limit and fires after it', () => {
    expect(actualsLate(last, 60, new Date('2026-06-01T07:00:00Z'), late6)).toEqual([]);
    const [hit] = actualsLate(last, 60, new Date('2026-06-01T07:30:00Z'), late6);
    expect(hit!.start.toISOString()).toBe('2026-06-01T01:00:00.000Z');
    expect(hit!.end.toISOString()).toBe('2026-06-01T07:00:00.000Z');
    expect(hit!.measures['hoursLate']).toBe(6.5);
  });

  it('has nothing to say about a series that never had actuals', () => {
    expect(actualsLate(null, 60, new Date('2026-06-01T07:30:00Z'), late6)).toEqual([]);
  });
});

describe('forecastLate', () => {
  it('puts 07:00 on the wall on both change days', () => {
    // Spring-forward 2026-03-08: 07:00 CDT = 12:00Z. Fall-back 2026-11-01: 07:00 CST = 13:00Z.
    expect(new Date(localWallInstant('2026-03-08', 420, 'America/Chicago')).toISOString()).toBe('2026-03-08T12:00:00.000Z');
    expect(new Date(localWallInstant('2026-11-01', 420, 'America/Chicago')).toISOString()).toBe('2026-11-01T13:00:00.000Z');
  });

  it('waits for the deadline, accepts a forecast written in the 24 hours before it, and fires otherwise', () => {
    const issuedAtTwo = new Date('2026-03-08T08:00:00Z'); // 02:00 CST… 03:00 CDT that morning
    expect(forecastLate(null, new Date('2026-03-08T11:59:00Z'), 'America/Chicago', 420)).toEqual([]);
    expect(forecastLate(issuedAtTwo, new Date('2026-03-08T12:30:00Z'), 'America/Chicago', 420)).toEqual([]);
    const yesterday = new Date('2026-03-07T08:00:00Z'); // 28 hours before the deadline
    const [hit] = forecastLate(yesterday, new Date('2026-03-08T12:30:00Z'), 'America/Chicago', 420);
    expect(hit!.start.toISOString()).toBe('2026-03-08T12:00:00.000Z');
    expect(hit!.summary).toBe('No forecast written by the 07:00 deadline on 2026-03-08; the newest was issued 2026-03-07T08:00:00.000Z.');
    expect(forecastLate(null, new Date('2026-03-08T12:30:00Z'), 'America/Chicago', 420)).toHaveLength(1);
  });
});

describe('estimatedHours', () => {
  const limit4 = rule('estimated_hours', { threshold: 4 });

  it('does not fire at exactly the limit and fires above it', () => {
    const points = hours('2026-06-15T05:00:00Z', Array(24).fill(500));
    for (const i of [1, 2, 3, 4]) points[i]!.estimated = true;
    expect(estimatedHours(points, limit4, 'America/Chicago')).toEqual([]);
    points[5]!.estimated = true;
    expect(estimatedHours(points, limit4, 'America/Chicago')).toHaveLength(1);
  });

  it('spans the 25 hours of the fall-back day', () => {
    const points = hours('2026-11-01T05:00:00Z', Array(25).fill(500));
    for (const i of [0, 1, 2, 3, 24]) points[i]!.estimated = true;
    const [hit] = estimatedHours(points, limit4, 'America/Chicago');
    expect(hit!.end.getTime() - hit!.start.getTime()).toBe(25 * 3_600_000);
    expect(hit!.measures['estimatedHours']).toBe(5);
  });
});
