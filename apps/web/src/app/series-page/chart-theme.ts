import 'chartjs-adapter-date-fns';
import type { ChartOptions, TooltipItem } from 'chart.js';
import { localTicks } from './local-ticks';

/** Colours of the charts' lines, from the product palette; each line also differs by dash or width. */
export const chartColours = {
  actual: '#1b1f24',
  forecast: '#2a6671',
  band80: 'rgba(42, 102, 113, 0.38)',
  band95: 'rgba(42, 102, 113, 0.14)',
  approved: '#6a3f9a',
  adjusted: '#a8661c',
  temperature: '#7a7f85',
  grid: 'rgba(0, 0, 0, 0.08)',
} as const;

/** "Tue 2 Dec 17:00" (or "Tue 2 Dec 2026", "Tue 2 Dec", "Dec 2026") in the given IANA time zone. */
export function zonedLabel(ms: number, timeZone: string, withTime = true, shape: 'full' | 'day' | 'month' = 'full'): string {
  if (shape === 'month') return new Intl.DateTimeFormat('en-GB', { timeZone, month: 'short', year: 'numeric' }).format(new Date(ms));
  return new Intl.DateTimeFormat('en-GB', {
    timeZone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    ...(withTime ? { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' as const } : shape === 'day' ? {} : { year: 'numeric' as const }),
  })
    .format(new Date(ms))
    .replace(',', '');
}

/** A number with the unit, e.g. "1,234.5 MW". */
export function withUnit(value: number | null | undefined, unit: string, digits = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return `${value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })} ${unitLabel(unit)}`;
}

/** The unit as people write it (°C rather than degC). */
export function unitLabel(unit: string): string {
  return unit === 'degC' ? '°C' : unit === 'degF' ? '°F' : unit;
}

/** Options of a time-axis line chart whose ticks and tooltips speak the series' own time zone. */
export function timeChartOptions(timeZone: string, unit: string, daily: boolean): ChartOptions<'line'> {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    parsing: false,
    normalized: true,
    interaction: { mode: 'nearest', axis: 'x', intersect: false },
    scales: {
      x: {
        type: 'time',
        // The unit only seeds Chart.js' own ticks, which afterBuildTicks replaces with local midnights.
        time: { unit: 'day' },
        grid: { color: chartColours.grid },
        // Ticks at the series' local midnights, labelled in its zone, whatever zone the browser is in.
        afterBuildTicks: (axis) => {
          const ticks = localTicks(axis.min, axis.max, timeZone);
          axis.ticks = ticks.values.map((value) => ({
            value,
            label: ticks.label === 'day' ? zonedLabel(value, timeZone, false, 'day') : zonedLabel(value, timeZone, false, 'month'),
          }));
        },
        ticks: { maxRotation: 0, autoSkip: false, color: '#3f484a', callback: (_value, index, ticks) => String(ticks[index]?.label ?? '') },
        title: { display: true, text: `Local time (${timeZone})`, color: '#3f484a' },
      },
      y: {
        grid: { color: chartColours.grid },
        ticks: { color: '#3f484a' },
        title: { display: true, text: `Load (${unitLabel(unit)})`, color: '#3f484a' },
      },
    },
    plugins: {
      legend: { position: 'bottom', labels: { usePointStyle: true, color: '#1b1f24', boxHeight: 8, padding: 16 } },
      tooltip: {
        callbacks: {
          title: (items: TooltipItem<'line'>[]) => (items[0] ? zonedLabel(items[0].parsed.x ?? 0, timeZone, !daily) : ''),
          label: (item: TooltipItem<'line'>) => `${item.dataset.label}: ${withUnit(item.parsed.y, unit)}`,
        },
      },
    },
  };
}
