import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { HttpClient } from '@angular/common/http';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { AccuracyOverview } from '@loadwright/contracts';
import { catchError, map, of } from 'rxjs';

/** What the card knows. */
type AccuracyState =
  { readonly state: 'loading' } | { readonly state: 'failed' } | { readonly state: 'ready'; readonly overview: AccuracyOverview };

/** "12 % better than", "5 % worse than" or "no better than" the same hour last week. */
function skillWords(skill: number): string {
  const percent = Math.round(Math.abs(skill) * 100);
  if (percent === 0) return 'No better than';
  return `${percent} % ${skill > 0 ? 'better' : 'worse'} than`;
}

/** The Overview's forecast accuracy over the last 28 days: skill against the same hour last week, and the series that miss most. */
@Component({
  selector: 'lw-forecast-accuracy',
  imports: [MatIconModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="forecast-accuracy-heading">
      <h3 id="forecast-accuracy-heading"><mat-icon aria-hidden="true" svgIcon="stacked_line_chart"></mat-icon> Forecast accuracy</h3>
      @switch (data().state) {
        @case ('loading') {
          <p class="detail">Reading accuracy…</p>
        }
        @case ('failed') {
          <p class="detail">Accuracy could not be read.</p>
        }
      }
      @if (overview(); as o) {
        @if (o.skill !== null) {
          <p class="headline">{{ skill() }} the same hour last week</p>
          <p class="detail">
            Over the last {{ o.window!.days }} days with actuals: {{ o.hours.toLocaleString('en-GB') }} forecast hours of
            {{ o.seriesCount }} series, errors scaled so kW feeders and MW zones weigh alike.
          </p>
        } @else if (o.hours > 0) {
          <p class="detail">
            {{ o.hours.toLocaleString('en-GB') }} forecast hours scored; no week of actuals before them to compare with yet.
          </p>
        } @else {
          <p class="detail">No forecast hour has an actual yet.</p>
        }
        @if (o.worst.length) {
          <p class="detail">Missing most (scaled error, MASE: above 1 is worse than repeating last week):</p>
          <ol class="worst">
            @for (s of o.worst; track s.seriesId) {
              <li>
                <a [routerLink]="['/series', s.seriesId]" fragment="accuracy-heading">{{ s.name }}</a>
                <span class="when"
                  >MASE {{ s.mase!.toFixed(2) }}{{ s.mape !== null ? ', MAPE ' + s.mape.toFixed(1) + ' %' : '' }}, 95 % band held
                  {{ (s.coverage95 * 100).toFixed(0) }} %</span
                >
              </li>
            }
          </ol>
        }
      }
    </section>
  `,
  styleUrl: './overview-card.scss',
  styles: `
    .worst {
      margin: 0;
      padding-left: 20px;
    }
    .worst li + li {
      margin-top: 4px;
    }
    .worst .when {
      display: block;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class ForecastAccuracy {
  private readonly http = inject(HttpClient);

  /** The summary, read once when the Overview opens. */
  protected readonly data = toSignal(
    this.http.get<AccuracyOverview>('/api/accuracy/overview').pipe(
      map((overview): AccuracyState => ({ state: 'ready', overview })),
      catchError(() => of<AccuracyState>({ state: 'failed' })),
    ),
    { initialValue: { state: 'loading' } as AccuracyState },
  );
  /** The summary, once read. */
  protected readonly overview = computed(() => {
    const data = this.data();
    return data.state === 'ready' ? data.overview : null;
  });
  /** The pooled skill in words. */
  protected readonly skill = computed(() => {
    const skill = this.overview()?.skill;
    return skill === null || skill === undefined ? '' : skillWords(skill);
  });
}
