import type { Series } from '@loadwright/db';
import { describe, expect, it } from 'vitest';
import { pushedIntervalReadings } from './push-readings';

const series = (overrides: Partial<Series> = {}): Series =>
  ({ id: 3, key: 'fdr-n1', kind: 'load', unit: 'kW', intervalMinutes: 15, timestampsMark: 'start', ...overrides }) as Series;

describe('pushedIntervalReadings', () => {
  it('reads offsets, numbers readings from 1 and converts units', () => {
    const { readings, unit } = pushedIntervalReadings(series(), {
      unit: 'MW',
      readings: [{ ts: '2026-01-15T08:00:00-06:00', value: 1.2 }],
    });
    expect(unit).toBe('MW');
    expect(readings).toEqual([{ ts: new Date('2026-01-15T14:00:00Z'), value: 1200, sourceRow: 1 }]);
  });

  it('moves end-marked readings back one interval to the interval start', () => {
    const { readings } = pushedIntervalReadings(series({ timestampsMark: 'end' }), {
      readings: [{ ts: '2026-01-15T14:15:00Z', value: 5 }],
    });
    expect(readings[0]!.ts.toISOString()).toBe('2026-01-15T14:00:00.000Z');
  });

  it('hashes the same instants and values the same however the offsets are written', () => {
    const a = pushedIntervalReadings(series(), { readings: [{ ts: '2026-01-15T08:00:00-06:00', value: 5 }] }).canonical;
    const b = pushedIntervalReadings(series(), { readings: [{ ts: '2026-01-15T14:00:00.000Z', value: 5 }] }).canonical;
    const c = pushedIntervalReadings(series(), { readings: [{ ts: '2026-01-15T14:00:00Z', value: 5.5 }] }).canonical;
    expect(a).toBe(b);
    expect(c).not.toBe(a);
  });

  it('refuses a unit of the other kind', () => {
    expect(() => pushedIntervalReadings(series(), { unit: 'degC', readings: [{ ts: '2026-01-15T14:00:00Z', value: 5 }] })).toThrow(
      'fdr-n1 is a load series stored in kW; readings in degC cannot be converted to it.',
    );
  });
});
