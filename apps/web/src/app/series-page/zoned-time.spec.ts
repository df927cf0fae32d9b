import { describe, expect, it } from 'vitest';
import { instantOfLocal, localOfInstant, zoneAbbreviation, zonedClock } from './zoned-time';

describe('zoned time', () => {
  it('reads wall-clock times in the series zone on both sides of a clock change (America/Chicago, 2026)', () => {
    expect(instantOfLocal('2026-01-15T17:00', 'America/Chicago')).toBe('2026-01-15T23:00:00.000Z'); // CST, UTC−6
    expect(instantOfLocal('2026-07-15T17:00', 'America/Chicago')).toBe('2026-07-15T22:00:00.000Z'); // CDT, UTC−5
    expect(instantOfLocal('2026-07-15T17:00', 'America/Phoenix')).toBe('2026-07-16T00:00:00.000Z'); // MST all year
    expect(instantOfLocal('17:00', 'America/Chicago')).toBeNull();
  });

  it('writes instants back as wall-clock times and round-trips', () => {
    expect(localOfInstant('2026-01-15T23:00:00.000Z', 'America/Chicago')).toBe('2026-01-15T17:00');
    // Fall-back day: 01:30 happens twice, first in CDT (06:30Z), then in CST (07:30Z).
    expect(localOfInstant('2026-11-01T06:30:00.000Z', 'America/Chicago')).toBe('2026-11-01T01:30');
    expect(localOfInstant('2026-11-01T07:30:00.000Z', 'America/Chicago')).toBe('2026-11-01T01:30');
    expect(instantOfLocal(localOfInstant('2026-03-10T12:00:00.000Z', 'Europe/Berlin'), 'Europe/Berlin')).toBe('2026-03-10T12:00:00.000Z');
  });

  it('names the zone in force', () => {
    expect(zoneAbbreviation('2026-01-15T23:00:00.000Z', 'America/Chicago')).toBe('CST');
    expect(zoneAbbreviation('2026-07-15T22:00:00.000Z', 'America/Chicago')).toBe('CDT');
    expect(zonedClock('2026-01-15T23:00:00.000Z', 'America/Chicago')).toBe('Thu Jan 15 17:00 CST');
  });
});
