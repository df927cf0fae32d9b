import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { MissDetail } from '@loadwright/contracts';

const width = 720;
const height = 260;
const pad = { left: 64, right: 56, top: 12, bottom: 28 };

/**
 * The miss period drawn as an SVG: the 95 % band as a shaded area, the forecast dashed, the actual
 * solid, the missed hours marked, and the temperature on its own scale at the right.
 */
@Component({
  selector: 'lw-miss-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure>
      <svg [attr.viewBox]="'0 0 ' + w + ' ' + h" role="img" [attr.aria-label]="label()">
        @for (tick of drawing().yTicks; track tick.y) {
          <line class="grid" [attr.x1]="left" [attr.x2]="w - right" [attr.y1]="tick.y" [attr.y2]="tick.y" />
          <text class="axis" [attr.x]="left - 6" [attr.y]="tick.y + 4" text-anchor="end">{{ tick.label }}</text>
        }
        @for (tick of drawing().tTicks; track tick.y) {
          <text class="axis temp" [attr.x]="w - right + 6" [attr.y]="tick.y + 4">{{ tick.label }}</text>
        }
        @for (tick of drawing().xTicks; track tick.x) {
          <text class="axis" [attr.x]="tick.x" [attr.y]="h - 8" text-anchor="middle">{{ tick.label }}</text>
        }
        <rect class="missed" [attr.x]="drawing().missX" [attr.width]="drawing().missW" [attr.y]="top" [attr.height]="h - top - bottom" />
        <path class="band" [attr.d]="drawing().band" />
        <path class="forecast" [attr.d]="drawing().forecast" />
        <path class="temperature" [attr.d]="drawing().temperature" />
        <path class="actual" [attr.d]="drawing().actual" />
      </svg>
      <figcaption>
        <span class="key actual">Actual</span><span class="key forecast">Forecast</span><span class="key band">95 % band</span>
        @if (detail().temperatureUnit) {
          <span class="key temperature">Temperature ({{ detail().temperatureUnit === 'degF' ? '°F' : '°C' }})</span>
        }
        <span class="key missed">Missed hours</span>
      </figcaption>
    </figure>
  `,
  styles: `
    figure {
      margin: 0;
    }
    svg {
      width: 100%;
      height: auto;
      font: var(--mat-sys-body-small);
    }
    .grid {
      stroke: var(--mat-sys-outline-variant);
      stroke-width: 1;
    }
    .axis {
      fill: var(--mat-sys-on-surface-variant);
      font-size: 11px;
    }
    .axis.temp {
      fill: #8a4b08;
    }
    .band {
      fill: rgba(13, 92, 99, 0.16);
      stroke: none;
    }
    .forecast {
      fill: none;
      stroke: #0d5c63;
      stroke-width: 2;
      stroke-dasharray: 6 4;
    }
    .actual {
      fill: none;
      stroke: #1d2a33;
      stroke-width: 2.2;
    }
    .temperature {
      fill: none;
      stroke: #b35c00;
      stroke-width: 1.5;
    }
    .missed {
      fill: rgba(186, 26, 26, 0.1);
    }
    figcaption {
      display: flex;
      flex-wrap: wrap;
      gap: 16px;
      font: var(--mat-sys-body-small);
      margin-top: 4px;
    }
    .key::before {
      content: '';
      display: inline-block;
      width: 18px;
      height: 4px;
      margin-right: 6px;
      vertical-align: middle;
    }
    .key.actual::before {
      background: #1d2a33;
    }
    .key.forecast::before {
      background: repeating-linear-gradient(90deg, #0d5c63 0 6px, transparent 6px 10px);
    }
    .key.band::before {
      background: rgba(13, 92, 99, 0.3);
      height: 10px;
    }
    .key.temperature::before {
      background: #b35c00;
    }
    .key.missed::before {
      background: rgba(186, 26, 26, 0.25);
      height: 10px;
    }
  `,
})
export class MissChart {
  /** The miss to draw. */
  readonly detail = input.required<MissDetail>();

  protected readonly w = width;
  protected readonly h = height;
  protected readonly left = pad.left;
  protected readonly right = pad.right;
  protected readonly top = pad.top;
  protected readonly bottom = pad.bottom;

  /** What a screen reader hears instead of the picture. */
  protected readonly label = computed(
    () =>
      `Chart of ${this.detail().seriesName} around the miss: actual, forecast and 95 % band${this.detail().temperatureUnit ? ', and temperature' : ''}.`,
  );

  /** Paths and ticks in SVG coordinates. */
  protected readonly drawing = computed(() => {
    const d = this.detail();
    const points = d.chart;
    const times = points.map((p) => Date.parse(p.ts));
    const t0 = times[0] ?? Date.parse(d.periodStart);
    const t1 = Math.max((times.at(-1) ?? t0) + 3_600_000, t0 + 3_600_000);
    const loads = points.flatMap((p) => [p.actual, p.forecast, p.lower95, p.upper95]).filter((v): v is number => v !== null);
    const lo = loads.length ? Math.min(...loads) : 0;
    const hi = loads.length ? Math.max(...loads) : 1;
    const span = hi - lo || 1;
    const yMin = lo - span * 0.08;
    const yMax = hi + span * 0.08;
    const temps = points.map((p) => p.temperature).filter((v): v is number => v !== null);
    const tMin = temps.length ? Math.min(...temps) - 1 : 0;
    const tMax = temps.length ? Math.max(...temps) + 1 : 1;
    const x = (t: number) => pad.left + ((t - t0) / (t1 - t0)) * (width - pad.left - pad.right);
    const y = (v: number) => pad.top + (1 - (v - yMin) / (yMax - yMin)) * (height - pad.top - pad.bottom);
    const yt = (v: number) => pad.top + (1 - (v - tMin) / (tMax - tMin)) * (height - pad.top - pad.bottom);
    const line = (values: (number | null)[], scale: (v: number) => number) => {
      let path = '';
      let pen = false;
      values.forEach((v, i) => {
        if (v === null) {
          pen = false;
          return;
        }
        path += `${pen ? 'L' : 'M'}${x(times[i]!).toFixed(1)},${scale(v).toFixed(1)}`;
        pen = true;
      });
      return path;
    };
    const withBand = points
      .map((p, i) => ({ t: times[i]!, lower: p.lower95, upper: p.upper95 }))
      .filter((p) => p.lower !== null && p.upper !== null);
    const band = withBand.length
      ? `M${withBand.map((p) => `${x(p.t).toFixed(1)},${y(p.upper!).toFixed(1)}`).join('L')}L${[...withBand]
          .reverse()
          .map((p) => `${x(p.t).toFixed(1)},${y(p.lower!).toFixed(1)}`)
          .join('L')}Z`
      : '';
    const format = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: span < 10 ? 1 : 0 });
    const yTicks = [0, 0.25, 0.5, 0.75, 1].map((f) => {
      const v = yMin + f * (yMax - yMin);
      return { y: y(v), label: `${format(v)} ${f === 1 ? d.unit : ''}`.trim() };
    });
    const tTicks = temps.length
      ? [0, 0.5, 1].map((f) => ({ y: yt(tMin + f * (tMax - tMin)), label: `${(tMin + f * (tMax - tMin)).toFixed(0)}°` }))
      : [];
    const clock = new Intl.DateTimeFormat('en-GB', {
      timeZone: d.timeZone,
      hour: '2-digit',
      minute: '2-digit',
      day: 'numeric',
      month: 'short',
    });
    const steps = 6;
    const xTicks = Array.from({ length: steps + 1 }, (_, i) => {
      const t = t0 + ((t1 - t0) * i) / steps;
      return { x: x(t), label: clock.format(t) };
    });
    const missX = x(Date.parse(d.periodStart));
    const missW = Math.max(2, x(Date.parse(d.periodEnd)) - missX);
    return {
      band,
      forecast: line(
        points.map((p) => p.forecast),
        y,
      ),
      actual: line(
        points.map((p) => p.actual),
        y,
      ),
      temperature: temps.length
        ? line(
            points.map((p) => p.temperature),
            yt,
          )
        : '',
      yTicks,
      tTicks,
      xTicks,
      missX,
      missW,
    };
  });
}
