import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { chartColours, timeChartOptions, unitLabel, withUnit } from '../series-page/chart-theme';

/** One hour of a line: when, and the temperature. */
export interface TemperatureHour {
  ts: string;
  value: number;
}

/** A station's observed temperatures (solid) beside one forecast issue (dotted), in the station's zone and unit. */
@Component({
  selector: 'lw-station-chart',
  imports: [BaseChartDirective],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="chart-box">
      <canvas baseChart type="line" [data]="chartData()" [options]="options()" role="img" [attr.aria-label]="description()"></canvas>
    </div>
  `,
  styles: `
    .chart-box {
      position: relative;
      height: 320px;
      padding: 12px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
      background: var(--mat-sys-surface-container-lowest);
    }
  `,
})
export class StationChart {
  /** Observed temperatures. */
  readonly observed = input.required<readonly TemperatureHour[]>();
  /** The chosen issue's valid hours. */
  readonly forecast = input.required<readonly TemperatureHour[]>();
  /** Words for the issue in the legend, e.g. "Forecast issued Tue 1 Dec 06:00". */
  readonly forecastLabel = input.required<string>();
  /** The station's unit and zone. */
  readonly unit = input.required<string>();
  readonly timeZone = input.required<string>();

  /** The two lines. */
  protected readonly chartData = computed<ChartData<'line'>>(() => ({
    datasets: [
      {
        label: 'Observed (solid)',
        data: this.observed().map((hour) => ({ x: Date.parse(hour.ts), y: hour.value })),
        borderColor: chartColours.actual,
        borderWidth: 2,
        pointRadius: 0,
        pointStyle: 'line',
      },
      {
        label: `${this.forecastLabel()} (dotted)`,
        data: this.forecast().map((hour) => ({ x: Date.parse(hour.ts), y: hour.value })),
        borderColor: chartColours.forecast,
        borderWidth: 2.5,
        borderDash: [2, 3],
        pointRadius: 0,
        pointStyle: 'line',
      },
    ],
  }));

  /** Time axis in the station's zone; the value axis says temperature. */
  protected readonly options = computed<ChartOptions<'line'>>(() => {
    const base = timeChartOptions(this.timeZone(), this.unit(), false);
    const unit = this.unit();
    return {
      ...base,
      scales: {
        ...base.scales,
        y: { ...base.scales!['y'], title: { display: true, text: `Temperature (${unitLabel(unit)})`, color: '#3f484a' } },
      },
      plugins: {
        ...base.plugins,
        tooltip: {
          ...base.plugins!.tooltip,
          callbacks: { ...base.plugins!.tooltip!.callbacks, label: (item) => `${item.dataset.label}: ${withUnit(item.parsed.y, unit)}` },
        },
      },
    };
  });

  /** A sentence for screen readers; the table above gives the issues. */
  protected readonly description = computed(
    () =>
      `Temperatures in ${unitLabel(this.unit())}: ${this.observed().length} observed hours and the ${this.forecast().length} hours of the ${this.forecastLabel().toLowerCase()}.`,
  );
}
