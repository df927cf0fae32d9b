import { describe, expect, it } from 'vitest';
import { intervalGrid } from './interval-grid';
import { instantsForWallClock } from './time-zone-offset';

const wall = (iso: string) => Date.parse(`${iso}Z`);

describe('instantsForWallClock', () => {
  it('finds no instant in the spring-forward gap and two in the fall-back hour (America/Chicago, 2026)', () => {
    expect(instantsForWallClock('America/Chicago', wall('2026-03-08T02:30:00'))).toEqual([]);
    expect(instantsForWallClock('America/Chicago', wall('2026-11-01T01:30:00'))).toEqual([
      Date.parse('2026-11-01T06:30:00Z'),
      Date.parse('2026-11-01T07:30:00Z'),
    ]);
    expect(instantsForWallClock('America/Chicago', wall('2026-07-01T12:00:00'))).toEqual([Date.parse('2026-07-01T17:00:00Z')]);
  });

  it('finds exactly one instant for every hour in a zone without daylight saving (America/Phoenix)', () => {
    expect(instantsForWallClock('America/Phoenix', wall('2026-03-08T02:30:00'))).toEqual([Date.parse('2026-03-08T09:30:00Z')]);
    expect(instantsForWallClock('America/Phoenix', wall('2026-11-01T01:30:00'))).toEqual([Date.parse('2026-11-01T08:30:00Z')]);
  });
});

describe('intervalGrid', () => {
  it('puts an hourly grid of a UTC+05:30 zone on the local hour', () => {
    const grid = intervalGrid(60, 'Asia/Kolkata');
    expect(Number.isInteger(grid.indexOf(Date.parse('2026-01-01T00:30:00Z')))).toBe(true);
    expect(Number.isInteger(grid.indexOf(Date.parse('2026-01-01T01:00:00Z')))).toBe(false);
  });

  it('numbers local midnights consecutively across a 23-hour day', () => {
    const grid = intervalGrid(1440, 'America/Chicago');
    const before = grid.indexOf(Date.parse('2026-03-08T06:00:00Z'));
    const after = grid.indexOf(Date.parse('2026-03-09T05:00:00Z'));
    expect([Number.isInteger(before), after - before]).toEqual([true, 1]);
    expect(grid.instantOf(after)).toBe(Date.parse('2026-03-09T05:00:00Z'));
  });
});
