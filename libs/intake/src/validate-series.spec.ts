import { qualityFlag } from '@loadwright/db';
import { describe, expect, it } from 'vitest';
import { intervalGrid } from './interval-grid';
import { ReadingColumns } from './reading-columns';
import { validateSeries } from './validate-series';

const hour = 3_600_000;
const grid = intervalGrid(60, 'UTC');
const daily = (h: number) => 500 + 120 * Math.sin((2 * Math.PI * h) / 24);

/** Hourly readings at the given hours, values from `value`. */
function readings(hours: number[], value: (h: number) => number = daily): ReadingColumns {
  const columns = new ReadingColumns();
  for (const h of hours) columns.push(h * hour, value(h), h + 2);
  return columns;
}

const range = (from: number, to: number) => Array.from({ length: to - from }, (_, i) => from + i);
const base = { seriesId: 1, grid, kind: 'load' as const, unit: 'kW' };

describe('validateSeries', () => {
  it('fills a gap of 3 intervals with a straight line and only reports one of 4', () => {
    const { rows, findings } = validateSeries(readings([...range(0, 20), ...range(23, 40), ...range(44, 60)]), base);
    const added = Array.from({ length: rows.length }, (_, i) => i).filter((i) => Number.isNaN(rows.values[i]!));
    expect(added.map((i) => rows.ts[i]! / hour)).toEqual([20, 21, 22]);
    expect(added.map((i) => rows.quality[i])).toEqual([3, 3, 3]);
    // A quarter of the way from hour 19 to hour 23 for hour 20.
    expect(rows.estimated[added[0]!]).toBe(Math.round((daily(19) + (daily(23) - daily(19)) / 4) * 1e6) / 1e6);
    expect(findings.filter((f) => f.rule === 'gap').map((f) => [f.tsMs! / hour, f.detail['intervals'], f.detail['estimated']])).toEqual([
      [20, 3, true],
      [40, 4, false],
    ]);
  });

  it('does not fill gaps when told not to (maxEstimatedGap 0), and does not count stored intervals as missing', () => {
    const { rows, findings } = validateSeries(readings([...range(0, 20), ...range(22, 40)]), { ...base, maxEstimatedGap: 0 });
    expect(rows.length).toBe(38);
    expect(findings.map((f) => f.rule)).toEqual(['gap']);
    expect(validateSeries(readings([...range(0, 20), ...range(22, 40)]), { ...base, stored: new Set([20, 21]) }).findings).toEqual([]);
  });

  it('keeps a negative raw value, flags it and estimates it from the clean neighbours', () => {
    const { rows, findings } = validateSeries(
      readings(range(0, 40), (h) => (h === 10 ? -daily(h) : daily(h))),
      base,
    );
    expect(rows.values[10]).toBe(-daily(10));
    expect(rows.quality[10]).toBe(qualityFlag.negative | qualityFlag.estimated);
    expect(rows.estimated[10]).toBe(Math.round(((daily(9) + daily(11)) / 2) * 1e6) / 1e6);
    expect(findings.map((f) => f.rule)).toEqual(['negative', 'estimated']);
  });

  it('flags a temperature outside −76…140 °F as impossible', () => {
    const { findings } = validateSeries(
      readings(range(0, 30), (h) => (h === 15 ? 150 : 50 + (h % 5))),
      { ...base, kind: 'temperature', unit: 'degF' },
    );
    expect(findings.filter((f) => f.rule === 'impossible').map((f) => [f.tsMs! / hour, f.detail])).toEqual([[15, { low: -76, high: 140 }]]);
  });

  it('flags a load over ten times its robust maximum as impossible, not as a spike', () => {
    const { findings } = validateSeries(
      readings(range(0, 60), (h) => (h === 30 ? 50_000 : daily(h))),
      base,
    );
    expect(findings.map((f) => f.rule)).toEqual(['impossible', 'estimated']);
  });
});
