import { describe, expect, it } from 'vitest';
import type { AccuracySummaryBody, SeriesAccuracy } from '@loadwright/contracts';
import { coverageChartData, horizonChartData, recentChartData } from './accuracy-charts';

const summary: AccuracySummaryBody = {
  hours: 4,
  mae: 10,
  rmse: 12,
  mape: 5,
  mase: 0.8,
  naiveMae: 12.5,
  skill: 0.2,
  coverage80: 0.75,
  coverage95: 0.875,
  winkler80: 40,
  winkler95: 60,
  pinball: 2,
};

const report: SeriesAccuracy = {
  seriesId: 1,
  unit: 'kW',
  timeZone: 'UTC',
  window: { from: '2026-11-01T00:00:00.000Z', to: '2026-11-29T00:00:00.000Z', days: 28 },
  overall: summary,
  peaks: null,
  byHorizon: [
    { horizon: 1, ...summary, mae: 4, naiveMae: 6 },
    { horizon: 2, ...summary, mae: 5, naiveMae: null },
  ],
  byDayType: [],
  byBandKind: [
    { bandKind: 'empirical', versions: 3, ...summary, coverage80: 0.7912, coverage95: 0.9487 },
    { bandKind: 'gaussian', versions: 1, ...summary },
  ],
  versions: [],
  recentHours: [{ ts: '2026-11-28T23:00:00.000Z', actual: 100, forecast: 98, lower80: 90, upper80: 106, versionId: 7 }],
};

describe('accuracy charts', () => {
  it('draws error by hours ahead beside the same hour last week, leaving gaps where no benchmark exists', () => {
    const data = horizonChartData(report);
    expect(data.datasets.map((d) => d.label)).toEqual(['Forecast', 'Same hour last week']);
    expect(data.datasets[0]!.data).toEqual([
      { x: 1, y: 4 },
      { x: 2, y: 5 },
    ]);
    expect(data.datasets[1]!.data).toEqual([
      { x: 1, y: 6 },
      { x: 2, y: null },
    ]);
  });

  it('sets the nominal levels beside what each band kind achieved, in percent to one decimal', () => {
    const data = coverageChartData(report);
    expect(data.labels).toEqual(['80 % band', '95 % band']);
    expect(data.datasets.map((d) => d.data)).toEqual([
      [80, 95],
      [79.1, 94.9],
      [75, 87.5],
    ]);
    expect(data.datasets[1]!.label).toBe('Achieved, bands calibrated on past errors');
  });

  it('draws the recent days with the band first, filled between its edges', () => {
    const data = recentChartData(report);
    const at = Date.parse('2026-11-28T23:00:00.000Z');
    expect(data.datasets.map((d) => [d.label, d.data[0]])).toEqual([
      ['80 % band (low)', { x: at, y: 90 }],
      ['80 % band', { x: at, y: 106 }],
      ['Forecast in force', { x: at, y: 98 }],
      ['Actual', { x: at, y: 100 }],
    ]);
    expect(data.datasets[1]!.fill).toBe('-1');
  });
});
