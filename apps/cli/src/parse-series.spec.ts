import { describe, expect, it } from 'vitest';
import { InputError } from './input-error';
import { parseSeries } from './parse-series';

describe('parseSeries', () => {
  it('reads a JSON array of numbers', () => {
    const series = parseSeries(' [1.5, 2, -3e2] ', 'input');
    expect(Array.from(series.values)).toEqual([1.5, 2, -300]);
    expect(series.timestamps).toBeNull();
  });

  it('reads the value column of a CSV, with timestamps, in any column order and case', () => {
    const series = parseSeries('Value,Timestamp\n10,2026-03-01T00:00:00Z\n11,2026-03-01T01:00:00Z\n', 'input');
    expect(Array.from(series.values)).toEqual([10, 11]);
    expect(Array.from(series.timestamps!)).toEqual([Date.UTC(2026, 2, 1, 0), Date.UTC(2026, 2, 1, 1)]);
  });

  it('reads a single unnamed-series column', () => {
    expect(Array.from(parseSeries('load_mw\n3\n4\n', 'input').values)).toEqual([3, 4]);
  });

  it('takes trailing rows without a value as forecast hours carrying temperatures', () => {
    const text = 'timestamp,value,temp\n2026-01-01T00:00Z,5,1.5\n2026-01-01T01:00Z,6,2\n2026-01-01T02:00Z,,2.5\n2026-01-01T03:00Z,,3\n';
    const series = parseSeries(text, 'input', { temperatureColumn: 'temp' });
    expect(Array.from(series.values)).toEqual([5, 6]);
    expect(Array.from(series.temperature!)).toEqual([1.5, 2]);
    expect(Array.from(series.futureTemperature!)).toEqual([2.5, 3]);
    expect(series.timestamps!.length).toBe(2);
  });

  it('names the line of a bad value, timestamp or temperature', () => {
    expect(() => parseSeries('value\n1\n\n2\nx\n', 'f.csv')).toThrow(/line 4 has value "x"/);
    expect(() => parseSeries('timestamp,value\nsoon,1\n', 'f.csv')).toThrow(/line 2 has timestamp "soon"/);
    expect(() => parseSeries('timestamp,value,t\n2026-01-01T00:00Z,1,\n', 'f.csv', { temperatureColumn: 't' })).toThrow(
      /line 2 has temperature ""/,
    );
    expect(() => parseSeries('value\n1\n\n', 'f.csv')).not.toThrow();
  });

  it('refuses empty input, JSON that is not an array of finite numbers, headerless CSV and decreasing timestamps', () => {
    expect(() => parseSeries('  \n', 'input')).toThrow(InputError);
    expect(() => parseSeries('[1, "2"]', 'input')).toThrow(/element 1/);
    expect(() => parseSeries('[1, 2', 'input')).toThrow(/not valid JSON/);
    expect(() => parseSeries('1\n2\n', 'input')).toThrow(/needs a header row/);
    expect(() => parseSeries('a,b\n1,2\n', 'input')).toThrow(/no "value" column/);
    expect(() => parseSeries('timestamp,value\n2026-01-02T00:00Z,1\n2026-01-01T00:00Z,2\n', 'input')).toThrow(/must increase/);
    expect(() => parseSeries('value\n1\n', 'input', { temperatureColumn: 'temp' })).toThrow(/no column "temp"/);
  });
});
