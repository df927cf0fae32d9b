import type { Series } from '@loadwright/db';
import { describe, expect, it } from 'vitest';
import { greenButtonReadings } from './green-button-readings';
import type { GreenButtonUsage } from './parse-green-button';

const series = (overrides: Partial<Series>): Series =>
  ({
    id: 1,
    key: 'meter-a',
    name: 'Meter A',
    kind: 'load',
    level: 'feeder',
    unit: 'kW',
    intervalMinutes: 60,
    timeZone: 'America/Chicago',
    timestampsMark: 'start',
    ...overrides,
  }) as Series;

const usage = (uom: 72 | 38, durationSeconds: number, values: number[]): GreenButtonUsage => ({
  readingType: { uom, powerOfTenMultiplier: 0, intervalLengthSeconds: durationSeconds, accumulationBehaviour: uom === 72 ? 4 : 12 },
  localTime: null,
  usagePointTitle: null,
  intervals: values.map((value, i) => ({ startSeconds: 1_780_000_000 + i * durationSeconds, durationSeconds, value })),
});

describe('greenButtonReadings', () => {
  it('turns Wh per hour into mean kW (1 kWh in an hour is 1 kW)', () => {
    const readings = greenButtonReadings(usage(72, 3600, [1000, 2500]), series({}));
    expect(readings.map((r) => r.value)).toEqual([1, 2.5]);
    expect(readings[0]!.ts.toISOString()).toBe(new Date(1_780_000_000_000).toISOString());
  });

  it('turns Wh per 15 minutes into mean demand (250 Wh in a quarter hour is 1 kW)', () => {
    expect(greenButtonReadings(usage(72, 900, [250]), series({ intervalMinutes: 15 }))[0]!.value).toBeCloseTo(1, 12);
  });

  it('takes W demand as given and converts to MW', () => {
    expect(greenButtonReadings(usage(38, 3600, [1_523_000]), series({ unit: 'MW' }))[0]!.value).toBeCloseTo(1.523, 12);
  });

  it('keeps interval starts even for a series whose timestamps mark the end (the store keeps starts)', () => {
    const readings = greenButtonReadings(usage(72, 3600, [1000]), series({ timestampsMark: 'end' }));
    expect(readings[0]!.ts.getTime()).toBe(1_780_000_000_000);
  });

  it('refuses intervals of another length than the series takes, and temperature series', () => {
    expect(() => greenButtonReadings(usage(72, 900, [250]), series({}))).toThrow(
      /intervals are 900 s \(15 minutes\) long.*meter-a takes 60-minute readings/,
    );
    expect(() => greenButtonReadings(usage(72, 3600, [250]), series({ kind: 'temperature', unit: 'degF', level: null }))).toThrow(
      /temperature series; Green Button files hold electricity usage/,
    );
  });
});
