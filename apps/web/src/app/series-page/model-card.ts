import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';
import { type FitSummary, modelMethodLabels } from '@loadwright/contracts';
import { BaseChartDirective } from 'ng2-charts';
import { chartColours, unitLabel, withUnit } from './chart-theme';
import { clockText } from '../refits/clock-text';
import { coefficientRows } from './coefficients';

/** The model card: method and orders, coefficients, σ², AIC/BIC, why auto chose it, and residual diagnostics. */
@Component({
  selector: 'lw-model-card',
  imports: [BaseChartDirective, DecimalPipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './model-card.html',
  styleUrl: './model-card.scss',
})
export class ModelCard {
  /** The newest fit. */
  readonly fit = input.required<FitSummary>();
  /** The series' unit, for σ and backtest errors. */
  readonly unit = input.required<string>();
  /** The series' time zone: times on the series page are its local times. */
  readonly timeZone = input.required<string>();

  /** Method name in words. */
  protected readonly methodName = computed(() => modelMethodLabels[this.fit().method]);
  /** "ARMA(2,1)" or "AR(3)". */
  protected readonly orders = computed(() => {
    const fit = this.fit();
    if (fit.method === 'seasonal-naive') return 'Same hour last week';
    return fit.maOrder > 0 ? `ARMA(${fit.arOrder},${fit.maOrder})` : `AR(${fit.arOrder})`;
  });
  /** Coefficients with standard errors. */
  protected readonly coefficients = computed(() => coefficientRows(this.fit().parameters));
  /** True when at least one coefficient has a standard error. */
  protected readonly hasStandardErrors = computed(() => this.coefficients().rows.some((row) => row.standardError !== null));
  /** True when the model works on log load (σ² is then on the log scale, not in the series' unit). */
  protected readonly logScale = computed(() => this.fit().diagnostics.bands?.scale === 'log' || this.fit().parameters['log'] === true);
  /** Innovation standard deviation (in the series' unit, or on the log scale for a log model). */
  protected readonly sigma = computed(() => {
    const sigma2 = this.fit().sigma2;
    return sigma2 === null ? null : Math.sqrt(sigma2);
  });

  /** Residual ACF bars with the ±1.96/√n lines. */
  protected readonly acfData = computed<ChartData<'bar' | 'line'>>(() => {
    const { residualAcf, acfBand } = this.fit().diagnostics;
    const labels = residualAcf.map((_, index) => String(index + 1));
    const line = (value: number, label: string) => ({
      type: 'line' as const,
      label,
      data: labels.map(() => value),
      borderColor: '#ba1a1a',
      borderWidth: 1.5,
      borderDash: [6, 4],
      pointRadius: 0,
      pointStyle: 'line' as const,
    });
    return {
      labels,
      datasets: [
        {
          type: 'bar' as const,
          label: 'Residual autocorrelation',
          data: residualAcf,
          backgroundColor: chartColours.forecast,
          barPercentage: 0.6,
          pointStyle: 'rect' as const,
        },
        line(acfBand, `±1.96/√n = ±${acfBand.toFixed(3)} (dashed)`),
        line(-acfBand, 'lower band'),
      ],
    };
  });

  /** Bar chart options: lags on x, correlation on y. */
  protected readonly acfOptions: ChartOptions<'bar' | 'line'> = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    scales: {
      x: {
        title: { display: true, text: 'Lag (hours)', color: '#3f484a' },
        ticks: { color: '#3f484a', autoSkipPadding: 8 },
        grid: { display: false },
      },
      y: {
        title: { display: true, text: 'Autocorrelation', color: '#3f484a' },
        ticks: { color: '#3f484a' },
        suggestedMin: -0.2,
        suggestedMax: 0.2,
      },
    },
    plugins: {
      legend: { position: 'bottom', labels: { usePointStyle: true, color: '#1b1f24', filter: (item) => item.text !== 'lower band' } },
      tooltip: { filter: (item) => item.dataset.label !== 'lower band' },
    },
  };

  /** Lags whose residual autocorrelation lies outside the band. */
  protected readonly lagsOutside = computed(() => {
    const { residualAcf, acfBand } = this.fit().diagnostics;
    return residualAcf.map((value, index) => ({ lag: index + 1, value })).filter((entry) => Math.abs(entry.value) > acfBand);
  });

  /** The first lags outside the band, listed. */
  protected readonly outsideText = computed(() => {
    const lags = this.lagsOutside().map((entry) => entry.lag);
    return lags.slice(0, 8).join(', ') + (lags.length > 8 ? ` and ${lags.length - 8} more` : '');
  });

  protected readonly clock = (iso: string | null, withSeconds = true) => clockText(iso, this.timeZone(), withSeconds);
  protected readonly amount = withUnit;
  protected readonly unitName = unitLabel;
}
