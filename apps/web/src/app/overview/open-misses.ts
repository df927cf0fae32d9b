import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { HttpClient } from '@angular/common/http';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { MissOverview } from '@loadwright/contracts';
import { catchError, map, of } from 'rxjs';

/** What the card knows. */
type OpenMissesState =
  { readonly state: 'loading' } | { readonly state: 'failed' } | { readonly state: 'ready'; readonly overview: MissOverview };

/** The Overview's open misses: how many of each severity, and the series with the worst of them, each a link to its miss. */
@Component({
  selector: 'lw-open-misses',
  imports: [MatIconModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="open-misses-heading">
      <h3 id="open-misses-heading"><mat-icon aria-hidden="true" svgIcon="crisis_alert"></mat-icon> Open misses</h3>
      @switch (data().state) {
        @case ('loading') {
          <p class="detail">Reading open misses…</p>
        }
        @case ('failed') {
          <p class="detail">Open misses could not be read.</p>
        }
      }
      @if (overview(); as o) {
        <dl class="counts">
          <div class="high">
            <dt>High</dt>
            <dd>{{ o.open.high }}</dd>
          </div>
          <div>
            <dt>Medium</dt>
            <dd>{{ o.open.medium }}</dd>
          </div>
          <div>
            <dt>Low</dt>
            <dd>{{ o.open.low }}</dd>
          </div>
        </dl>
        @if (o.worstSeries.length) {
          <ul class="worst">
            @for (s of o.worstSeries; track s.seriesId) {
              <li>
                <a [routerLink]="['/misses', s.latestMissId]">{{ s.seriesName }}</a>
                <span class="when">{{ s.open }} open, worst {{ s.highest }}</span>
              </li>
            }
          </ul>
        } @else {
          <p class="detail">No open misses: actuals are inside what was planned.</p>
        }
        <a routerLink="/misses" class="more">Open the Misses page</a>
      }
    </section>
  `,
  styleUrl: './overview-card.scss',
  styles: `
    .counts {
      display: flex;
      gap: 24px;
      margin: 4px 0 8px;
    }
    .counts dt {
      font: var(--mat-sys-label-medium);
      color: var(--mat-sys-on-surface-variant);
    }
    .counts dd {
      margin: 0;
      font: var(--mat-sys-headline-small);
      font-weight: 600;
    }
    .counts .high dd {
      color: #8c1d18;
    }
    .worst {
      margin: 8px 0;
      padding-left: 18px;
    }
    .worst li + li {
      margin-top: 4px;
    }
    .worst .when {
      margin-left: 8px;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class OpenMisses {
  private readonly http = inject(HttpClient);

  /** The summary, read once when the Overview opens. */
  protected readonly data = toSignal(
    this.http.get<MissOverview>('/api/misses/overview').pipe(
      map((overview): OpenMissesState => ({ state: 'ready', overview })),
      catchError(() => of<OpenMissesState>({ state: 'failed' })),
    ),
    { initialValue: { state: 'loading' } as OpenMissesState },
  );
  /** The summary, once read. */
  protected readonly overview = computed(() => {
    const data = this.data();
    return data.state === 'ready' ? data.overview : null;
  });
}
