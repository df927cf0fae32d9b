import type { ForecastPoint, ForecastReview, ForecastVersion, ReadingHistory } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { bandTooltipText, fanChartData, historyChartData, horizonPeak, methodName, peakAhead, peakRows, peakShiftText } from './chart-data';

const base = {
  seriesId: 1,
  key: 'sys',
  unit: 'MW',
  intervalMinutes: 60,
  timeZone: 'America/Chicago',
  from: '2026-01-01T00:00:00.000Z',
  to: '2026-01-01T03:00:00.000Z',
  readingCount: 3,
  qualitySummary: {},
} as const;

describe('historyChartData', () => {
  it('charts the value to use and marks flagged readings where their raw value was', () => {
    const history: ReadingHistory = {
      ...base,
      resolution: 'interval',
      points: [
        { ts: '2026-01-01T00:00:00.000Z', value: 100, estimated: null, quality: 0, flags: [] },
        { ts: '2026-01-01T01:00:00.000Z', value: 900, estimated: 104, quality: 5, flags: ['estimated', 'spike'] },
        { ts: '2026-01-01T02:00:00.000Z', value: null, estimated: 102, quality: 3, flags: ['estimated', 'missing'] },
      ],
    };
    const data = historyChartData(history);
    expect(data.line.map((p) => p.y)).toEqual([100, 104, 102]);
    expect(data.markers.map((m) => [m.label, m.points.map((p) => p.y)])).toEqual([
      ['Estimated', [900, 102]],
      ['Spike', [900]],
    ]);
  });

  it('charts daily buckets by their mean of values to use', () => {
    const history: ReadingHistory = {
      ...base,
      resolution: 'day',
      buckets: [
        {
          ts: '2026-01-01T06:00:00.000Z',
          day: '2026-01-01',
          mean: 90,
          min: 80,
          max: 120,
          meanUsed: 95,
          count: 24,
          estimatedCount: 1,
          quality: 8,
          flags: ['flatLine'],
        },
      ],
    };
    expect(historyChartData(history)).toEqual({
      line: [{ x: Date.parse('2026-01-01T06:00:00.000Z'), y: 95 }],
      markers: [{ flag: 'flatLine', label: 'Flat line', points: [{ x: Date.parse('2026-01-01T06:00:00.000Z'), y: 95 }] }],
    });
  });
});

/** A forecast point with bounds ±10/±20 around `mean`. */
const point = (ts: string, mean: number, adjusted: number | null = null): ForecastPoint => ({
  ts,
  mean,
  lower80: mean - 10,
  upper80: mean + 10,
  lower95: mean - 20,
  upper95: mean + 20,
  stdError: 7.8,
  adjusted:
    adjusted === null
      ? null
      : { mean: adjusted, lower80: adjusted - 10, upper80: adjusted + 10, lower95: adjusted - 20, upper95: adjusted + 20 },
});

const peak = (date: string, localTime: string, value: number) => ({
  date,
  ts: `${date}T23:00:00.000Z`,
  localTime,
  utcOffset: '-06:00',
  value,
  intervals: 24,
  complete: true,
});

const version = (state: 'draft' | 'approved', points: ForecastPoint[], dailyPeaks = [peak('2026-01-02', '17:00', 500)]) =>
  ({ id: state === 'draft' ? 2 : 1, state, points, dailyPeaks, adjustments: [] }) as unknown as ForecastVersion;

describe('fanChartData', () => {
  it('draws the draft with bands that follow adjustments, and the approved mean beside it', () => {
    const review = {
      draft: version('draft', [point('2026-01-02T00:00:00.000Z', 100), point('2026-01-02T01:00:00.000Z', 110, 130)]),
      approved: version('approved', [point('2026-01-02T00:00:00.000Z', 90, 95)]),
      actuals: { from: null, to: null, points: [{ ts: '2026-01-02T00:00:00.000Z', value: 97, estimated: false }], dailyPeaks: [] },
      comparison: null,
    } as unknown as ForecastReview;
    const fan = fanChartData(review);
    expect(fan.mean.map((p) => p.y)).toEqual([100, 110]);
    expect(fan.adjusted.map((p) => p.y)).toEqual([null, 130]);
    expect(fan.upper80.map((p) => p.y)).toEqual([110, 140]);
    expect(fan.lower95.map((p) => p.y)).toEqual([80, 110]);
    expect(fan.approved.map((p) => p.y)).toEqual([95]);
    expect(fan.actuals.map((p) => p.y)).toEqual([97]);
    expect(fan.hasAdjustments).toBe(true);
  });

  it('shows the approved version alone when no draft waits', () => {
    const review = {
      draft: null,
      approved: version('approved', [point('2026-01-02T00:00:00.000Z', 90)]),
      actuals: { points: [], dailyPeaks: [] },
      comparison: null,
    } as unknown as ForecastReview;
    const fan = fanChartData(review);
    expect(fan.mean.map((p) => p.y)).toEqual([90]);
    expect(fan.approved).toEqual([]);
    expect(fan.hasAdjustments).toBe(false);
  });
});

describe('peaks', () => {
  it('lines up draft, approved and actual peaks by local date, with the comparison', () => {
    const review = {
      draft: version('draft', [], [peak('2026-01-02', '17:00', 520), peak('2026-01-03', '18:00', 530)]),
      approved: version('approved', [], [peak('2026-01-01', '17:00', 480), peak('2026-01-02', '16:00', 500)]),
      actuals: { points: [], dailyPeaks: [peak('2026-01-01', '17:00', 470)] },
      comparison: {
        intervals: [],
        energy: {},
        dailyPeaks: [{ date: '2026-01-02', draft: null, approved: null, difference: 20, differencePercent: 4, peakShiftMinutes: 60 }],
      },
    } as unknown as ForecastReview;
    const rows = peakRows(review);
    expect(rows.map((r) => [r.date, r.draft?.value ?? null, r.approved?.value ?? null, r.actual?.value ?? null, r.difference])).toEqual([
      ['2026-01-01', null, 480, 470, null],
      ['2026-01-02', 520, 500, null, 20],
      ['2026-01-03', 530, null, null, null],
    ]);
    expect(horizonPeak(review.draft)?.value).toBe(530);
    expect(horizonPeak(null)).toBeNull();
  });

  it('says how far a peak moved', () => {
    expect([null, 0, 60, -15, 90].map(peakShiftText)).toEqual(['—', 'same time', '1 h later', '15 min earlier', '1 h 30 min later']);
  });
});

describe('methodName', () => {
  it('names a fit whether the database or the contract names its method', () => {
    expect(methodName('conditional_mle')).toBe('AR by conditional maximum likelihood');
    expect(methodName('cmle')).toBe('AR by conditional maximum likelihood');
    expect(methodName('seasonal_naive')).toBe('Seasonal naive (same hour last week)');
    expect(methodName('something-new')).toBe('something-new');
  });
});

describe('bandTooltipText', () => {
  it('gives both bounds of a band, not only its upper edge', () => {
    const kw = (value: number) => `${value.toFixed(0)} kW`;
    expect(bandTooltipText('Draft: 80 % interval (darker fill)', 812.4, 947.2, kw)).toBe('Draft: 80 % interval: 812 kW – 947 kW');
    expect(bandTooltipText('Approved: 95 % interval (light fill)', 700, 1010, kw)).toBe('Approved: 95 % interval: 700 kW – 1010 kW');
    expect(bandTooltipText('Draft: 95 % interval (light fill)', null, 1010, kw)).toBe('Draft: 95 % interval: —');
  });
});

describe('peakAhead', () => {
  const point = (ts: string, mean: number, adjusted: number | null = null) =>
    ({ ts, mean, adjusted: adjusted === null ? null : { mean: adjusted } }) as unknown as ForecastPoint;
  const version = {
    points: [point('2026-12-01T17:00:00Z', 990), point('2026-12-03T17:00:00Z', 900), point('2026-12-04T17:00:00Z', 850, 940)],
  };

  it('looks only at the hours still ahead, using adjusted means', () => {
    // 990 on 1 December has passed by 3 December 08:00; of the rest, the adjusted 940 beats 900.
    expect(peakAhead(version, 60, new Date('2026-12-03T08:00:00Z'))).toEqual({ ts: '2026-12-04T17:00:00Z', value: 940, hoursAhead: 2 });
    // The hour under way still counts: 17:30 is inside the 17:00 interval.
    expect(peakAhead(version, 60, new Date('2026-12-04T17:30:00Z'))?.ts).toBe('2026-12-04T17:00:00Z');
    expect(peakAhead(version, 60, new Date('2026-12-05T00:00:00Z'))).toBeNull();
    expect(peakAhead(null, 60)).toBeNull();
  });
});
