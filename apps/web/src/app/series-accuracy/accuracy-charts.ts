/** The accuracy section's three charts as Chart.js data: error by horizon, achieved against nominal coverage, recent days. */
import type { ChartData } from 'chart.js';
import type { SeriesAccuracy } from '@loadwright/contracts';
import { chartColours } from '../series-page/chart-theme';

/** Plain names of the band kinds a version can carry. */
export const bandKindLabels: Record<'empirical' | 'gaussian', string> = {
  empirical: 'calibrated on past errors',
  gaussian: 'from the model’s standard errors',
};

/** Colour of the seasonal-naive benchmark line. */
const naiveColour = '#7a7f85';

/** Mean absolute error by hours ahead, beside the same-hour-last-week benchmark's. */
export function horizonChartData(report: SeriesAccuracy): ChartData<'line', { x: number; y: number | null }[]> {
  return {
    datasets: [
      {
        label: 'Forecast',
        data: report.byHorizon.map((h) => ({ x: h.horizon, y: h.mae })),
        borderColor: chartColours.forecast,
        backgroundColor: chartColours.forecast,
        borderWidth: 2,
        pointRadius: 0,
      },
      {
        label: 'Same hour last week',
        data: report.byHorizon.map((h) => ({ x: h.horizon, y: h.naiveMae })),
        borderColor: naiveColour,
        backgroundColor: naiveColour,
        borderDash: [6, 4],
        borderWidth: 1.5,
        pointRadius: 0,
        spanGaps: false,
      },
    ],
  };
}

/** Share of actuals inside each band, in percent: the nominal level, then what each kind of band achieved. */
export function coverageChartData(report: SeriesAccuracy): ChartData<'bar', number[], string> {
  const fills = ['rgba(42, 102, 113, 0.85)', 'rgba(168, 102, 28, 0.85)'];
  return {
    labels: ['80 % band', '95 % band'],
    datasets: [
      {
        label: 'Nominal (what the band promises)',
        data: [80, 95],
        backgroundColor: 'rgba(122, 127, 133, 0.35)',
        borderColor: naiveColour,
        borderWidth: 1,
      },
      ...report.byBandKind.map((kind, i) => ({
        label: `Achieved, bands ${bandKindLabels[kind.bandKind]}`,
        data: [round1(kind.coverage80 * 100), round1(kind.coverage95 * 100)],
        backgroundColor: fills[i % fills.length],
      })),
    ],
  };
}

/** The recent days: actual, the forecast in force and its 80 % band, on a time axis. */
export function recentChartData(report: SeriesAccuracy): ChartData<'line', { x: number; y: number }[]> {
  const points = report.recentHours.map((h) => ({ ...h, x: Date.parse(h.ts) }));
  return {
    datasets: [
      {
        label: '80 % band (low)',
        data: points.map((p) => ({ x: p.x, y: p.lower80 })),
        borderWidth: 0,
        pointRadius: 0,
        backgroundColor: chartColours.band80,
      },
      {
        label: '80 % band',
        data: points.map((p) => ({ x: p.x, y: p.upper80 })),
        borderWidth: 0,
        pointRadius: 0,
        backgroundColor: chartColours.band80,
        fill: '-1',
      },
      {
        label: 'Forecast in force',
        data: points.map((p) => ({ x: p.x, y: p.forecast })),
        borderColor: chartColours.forecast,
        backgroundColor: chartColours.forecast,
        borderDash: [5, 3],
        borderWidth: 2,
        pointRadius: 0,
      },
      {
        label: 'Actual',
        data: points.map((p) => ({ x: p.x, y: p.actual })),
        borderColor: chartColours.actual,
        backgroundColor: chartColours.actual,
        borderWidth: 2,
        pointRadius: 0,
      },
    ],
  };
}

function round1(value: number): number {
  return Math.round(value * 10) / 10;
}
