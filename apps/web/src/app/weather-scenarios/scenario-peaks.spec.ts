import type { DailyPeak, TemperatureScenarios } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { scenarioPeakRows } from './scenario-peaks';

const peak = (date: string, ts: string, value: number): DailyPeak => ({
  date,
  ts,
  localTime: ts.slice(11, 16),
  utcOffset: '+00:00',
  value,
  intervals: 24,
  complete: true,
});

const scenarios = {
  base: {
    dailyPeaks: [peak('2026-12-01', '2026-12-01T18:00:00.000Z', 100), peak('2026-12-02', '2026-12-02T18:00:00.000Z', 110)],
    peak: null,
  },
  scenarios: [
    {
      key: 'hotter',
      dailyPeaks: [peak('2026-12-01', '2026-12-01T18:00:00.000Z', 96), peak('2026-12-02', '2026-12-02T19:00:00.000Z', 104.5)],
    },
    { key: 'colder', dailyPeaks: [peak('2026-12-01', '2026-12-01T18:00:00.000Z', 110)] },
  ],
} as unknown as TemperatureScenarios;

describe('scenarioPeakRows', () => {
  it('gives each day the change of every chosen scenario and whether its peak hour moved', () => {
    const rows = scenarioPeakRows(scenarios, ['hotter', 'colder']);
    expect(rows.map((row) => row.date)).toEqual(['2026-12-01', '2026-12-02']);
    expect(rows[0]!.cells.map((cell) => [cell.key, cell.change, cell.moved])).toEqual([
      ['hotter', -4, false],
      ['colder', 10, false],
    ]);
    // 104.5 − 110 = −5.5, an hour later; the colder scenario has no peak that day.
    expect(rows[1]!.cells.map((cell) => [cell.key, cell.change, cell.moved])).toEqual([
      ['hotter', -5.5, true],
      ['colder', null, false],
    ]);
  });

  it('leaves out scenarios not chosen', () => {
    expect(scenarioPeakRows(scenarios, ['colder'])[0]!.cells.map((cell) => cell.key)).toEqual(['colder']);
  });
});
