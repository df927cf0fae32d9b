import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartData, ChartDataset, ChartOptions, TooltipItem } from 'chart.js';
import type { AssumedTemperatures, ForecastReview, TemperatureScenario } from '@loadwright/contracts';
import { BaseChartDirective } from 'ng2-charts';
import { scenarioStyle } from '../weather-scenarios/scenario-style';
import { bandTooltipText, fanChartData, reviewedVersion } from './chart-data';
import { chartColours, timeChartOptions, unitLabel, withUnit } from './chart-theme';

/**
 * The forecast fan chart: actuals so far, the version under review with its 95 % and 80 % bands
 * (filled, the 80 % band darker, each named in the legend), the approved version as a dashed line,
 * and the adjusted mean as a dotted line where a planner adjusted the draft; weather scenarios a planner chose
 * as extra lines.
 */
@Component({
  selector: 'lw-forecast-chart',
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
      height: 380px;
      padding: 12px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-large);
      background: var(--mat-sys-surface-container-lowest);
    }
  `,
})
export class ForecastChart {
  /** Everything the review shows. */
  readonly review = input.required<ForecastReview>();
  /** The temperatures the forecast assumed, drawn against a right-hand axis; null or unused draws none. */
  readonly temperatures = input<AssumedTemperatures | null>(null);
  /** Weather scenarios to draw as extra lines (the forecast re-run with other temperatures). */
  readonly scenarios = input<readonly TemperatureScenario[]>([]);
  /** True when there are assumed temperatures to draw. */
  protected readonly withTemperature = computed(() => (this.temperatures()?.hours.length ?? 0) > 0);

  /** Datasets in drawing order; each band is a lower line and an upper line filled down to it. */
  protected readonly chartData = computed<ChartData<'line'>>(() => {
    const review = this.review();
    const fan = fanChartData(review);
    const name = review.draft ? 'Draft' : 'Approved';
    const hidden = { pointRadius: 0, borderWidth: 0, pointStyle: false as const };
    const datasets: ChartDataset<'line'>[] = [
      { label: '95 % lower', data: fan.lower95, ...hidden, fill: false },
      {
        label: `${name}: 95 % interval (light fill)`,
        data: fan.upper95,
        ...hidden,
        fill: '-1',
        backgroundColor: chartColours.band95,
        pointStyle: 'rect',
      },
      { label: '80 % lower', data: fan.lower80, ...hidden, fill: false },
      {
        label: `${name}: 80 % interval (darker fill)`,
        data: fan.upper80,
        ...hidden,
        fill: '-1',
        backgroundColor: chartColours.band80,
        pointStyle: 'rect',
      },
      {
        label: `${name}: model mean (solid)`,
        data: fan.mean,
        borderColor: chartColours.forecast,
        borderWidth: 2,
        pointRadius: 0,
        pointStyle: 'line',
      },
    ];
    if (fan.hasAdjustments) {
      datasets.push({
        label: `${name}: adjusted mean (dotted)`,
        data: fan.adjusted,
        borderColor: chartColours.adjusted,
        borderWidth: 2.5,
        borderDash: [2, 3],
        pointRadius: 0,
        pointStyle: 'line',
        spanGaps: false,
      });
    }
    if (fan.approved.length) {
      datasets.push({
        label: 'Approved (dashed)',
        data: fan.approved,
        borderColor: chartColours.approved,
        borderWidth: 2,
        borderDash: [8, 5],
        pointRadius: 0,
        pointStyle: 'line',
      });
    }
    datasets.push({
      label: 'Actual load',
      data: fan.actuals,
      borderColor: chartColours.actual,
      borderWidth: 2,
      pointRadius: 0,
      pointStyle: 'line',
    });
    let pastYear = 0;
    for (const scenario of this.scenarios()) {
      const style = scenarioStyle(scenario, scenario.kind === 'past-year' ? pastYear++ : 0);
      datasets.push({
        label: `Scenario: ${scenario.label}`,
        data: scenario.points.map((point) => ({ x: Date.parse(point.ts), y: point.value })),
        borderColor: style.colour,
        borderWidth: 2,
        borderDash: style.dash,
        pointRadius: 0,
        pointStyle: 'line',
      });
    }
    const temperatures = this.temperatures();
    if (temperatures && temperatures.hours.length && temperatures.station) {
      const unit = temperatures.station.unit === 'degC' ? '°C' : '°F';
      datasets.push({
        label: `Temperature assumed, ${unit} (grey, right axis: observed solid, forecast dotted)`,
        data: temperatures.hours.map((h) => ({ x: Date.parse(h.ts), y: h.value })),
        yAxisID: 'temperature',
        borderColor: chartColours.temperature,
        borderWidth: 1.5,
        pointRadius: 0,
        pointStyle: 'line',
        segment: { borderDash: (ctx) => (temperatures.hours[ctx.p1DataIndex]?.source === 'forecast' ? [2, 3] : undefined) },
      });
    }
    return { datasets };
  });

  /**
   * Axes in the series' time zone and unit; the bands' lower lines stay out of the legend and tooltips,
   * and a band's tooltip line gives both its bounds (the lower line is the dataset just before it).
   */
  protected readonly options = computed<ChartOptions<'line'>>(() => {
    const series = this.review().series;
    const base = timeChartOptions(series.timeZone, series.unit, false);
    const unnamed = (label: string | undefined) => !label || label.endsWith(' lower');
    const temperatures = this.temperatures();
    const scales =
      temperatures?.hours.length && temperatures.station
        ? {
            ...base.scales,
            temperature: {
              position: 'right' as const,
              grid: { drawOnChartArea: false },
              ticks: { color: '#3f484a' },
              title: { display: true, text: `Temperature (${temperatures.station.unit === 'degC' ? '°C' : '°F'})`, color: '#3f484a' },
            },
          }
        : base.scales;
    const baseLabel = base.plugins!.tooltip!.callbacks!.label!;
    return {
      ...base,
      scales,
      plugins: {
        ...base.plugins,
        legend: { ...base.plugins!.legend, labels: { ...base.plugins!.legend!.labels, filter: (item) => !unnamed(item.text) } },
        tooltip: {
          ...base.plugins!.tooltip,
          filter: (item) => !unnamed(item.dataset.label),
          callbacks: {
            ...base.plugins!.tooltip!.callbacks,
            label: function (this: unknown, item: TooltipItem<'line'>) {
              const label = item.dataset.label ?? '';
              if (!label.includes('% interval')) return baseLabel.call(this as never, item);
              const lower = item.chart.data.datasets[item.datasetIndex - 1]?.data[item.dataIndex] as { y: number | null } | undefined;
              return bandTooltipText(label, lower?.y ?? null, item.parsed.y, (value) => withUnit(value, series.unit));
            },
          },
        },
      },
    };
  });

  /** A sentence for screen readers; the tables below give the numbers. */
  protected readonly description = computed(() => {
    const review = this.review();
    const version = reviewedVersion(review);
    if (!version) return 'No forecast yet.';
    return `Forecast fan chart of ${review.series.name} in ${unitLabel(review.series.unit)}: ${version.state} version with 80 % and 95 % intervals${review.draft && review.approved ? ', the approved version' : ''} and actual load so far${this.scenarios().length ? `, with ${this.scenarios().length} weather scenario lines` : ''}. Daily peaks are listed in the tables below.`;
  });
}
