import { describe, expect, it } from 'vitest';
import { intervalsInLocalDay, localClock, localIso, startOfLocalDay } from './local-time';

describe('local time in America/Chicago', () => {
  const zone = 'America/Chicago';

  it('shows the two 01:00s of the fall-back day with their own offsets', () => {
    // 2026-11-01: clocks go back at 02:00 CDT (07:00Z) to 01:00 CST.
    expect(localIso(Date.parse('2026-11-01T06:00:00Z'), zone)).toBe('2026-11-01T01:00:00-05:00');
    expect(localIso(Date.parse('2026-11-01T07:00:00Z'), zone)).toBe('2026-11-01T01:00:00-06:00');
  });

  it('ends UTC times in Z', () => {
    expect(localIso(Date.parse('2026-11-01T06:00:00Z'), 'UTC')).toBe('2026-11-01T06:00:00Z');
  });

  it('finds local midnight on both sides of a change', () => {
    expect(new Date(startOfLocalDay('2026-11-01', zone)).toISOString()).toBe('2026-11-01T05:00:00.000Z');
    expect(new Date(startOfLocalDay('2026-11-02', zone)).toISOString()).toBe('2026-11-02T06:00:00.000Z');
    expect(new Date(startOfLocalDay('2026-03-08', zone)).toISOString()).toBe('2026-03-08T06:00:00.000Z');
  });

  it('counts 25 hours on the fall-back day, 23 on the spring-forward day, 24 otherwise', () => {
    expect(intervalsInLocalDay('2026-11-01', zone, 60)).toBe(25);
    expect(intervalsInLocalDay('2026-03-08', zone, 60)).toBe(23);
    expect(intervalsInLocalDay('2026-11-02', zone, 60)).toBe(24);
    expect(intervalsInLocalDay('2026-11-01', zone, 15)).toBe(100);
    expect(intervalsInLocalDay('2026-11-01', 'UTC', 60)).toBe(24);
  });

  it('reads the offset in minutes east of UTC', () => {
    expect(localClock(Date.parse('2026-07-01T12:00:00Z'), zone)).toEqual({ date: '2026-07-01', time: '07:00:00', offsetMinutes: -300 });
    expect(localClock(Date.parse('2026-07-01T12:00:00Z'), 'Asia/Kolkata').offsetMinutes).toBe(330);
  });
});
