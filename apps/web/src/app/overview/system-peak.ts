import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { HttpClient } from '@angular/common/http';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { ForecastReview, SeriesPage } from '@loadwright/contracts';
import { catchError, map, of, switchMap } from 'rxjs';
import { peakAhead } from '../series-page/chart-data';
import { withUnit } from '../series-page/chart-theme';
import { zonedClock } from '../series-page/zoned-time';

/** What the card knows. */
type PeakState =
  | { readonly state: 'loading' }
  | { readonly state: 'none'; readonly why: string }
  | { readonly state: 'ready'; readonly review: ForecastReview };

/**
 * The Overview's next-week system peak: the highest hour still ahead in the system series' draft and
 * approved forecasts, in the series' local time with its zone named. Hours already passed never count.
 */
@Component({
  selector: 'lw-system-peak',
  imports: [MatIconModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="system-peak-heading">
      <h3 id="system-peak-heading"><mat-icon aria-hidden="true" svgIcon="trending_up"></mat-icon> Next-week system peak</h3>
      @switch (data().state) {
        @case ('loading') {
          <p class="detail">Reading the system forecast…</p>
        }
        @case ('none') {
          <p class="detail">{{ $any(data()).why }}</p>
        }
      }
      @if (review(); as r) {
        @for (line of lines(); track line.label) {
          <p class="peak">
            <span class="label">{{ line.label }}</span>
            <span class="value">{{ line.value }}</span>
            <span class="when">{{ line.when }}</span>
          </p>
        }
        @if (!lines().length) {
          <p class="detail">
            {{
              r.draft || r.approved
                ? r.series.name + "'s forecasts cover no hour still ahead; the next refit writes one."
                : r.series.name + ' has no forecast yet; the next refit writes a draft.'
            }}
          </p>
        }
        <a [routerLink]="['/series', r.series.id]" class="more">Open {{ r.series.name }}</a>
      }
    </section>
  `,
  styleUrl: './overview-card.scss',
})
export class SystemPeak {
  private readonly http = inject(HttpClient);

  /** The system series' forecast review, read once when the Overview opens. */
  protected readonly data = toSignal(
    this.http.get<SeriesPage>('/api/series', { params: { level: 'system', kind: 'load', limit: 1 } }).pipe(
      switchMap((page) => {
        const system = page.items[0];
        if (!system) return of<PeakState>({ state: 'none', why: 'No system series in the catalogue yet.' });
        return this.http
          .get<ForecastReview>(`/api/series/${system.id}/forecast`)
          .pipe(map((review): PeakState => ({ state: 'ready', review })));
      }),
      catchError(() => of<PeakState>({ state: 'none', why: 'The system forecast could not be read.' })),
    ),
    { initialValue: { state: 'loading' } as PeakState },
  );
  /** The review, once read. */
  protected readonly review = computed(() => {
    const data = this.data();
    return data.state === 'ready' ? data.review : null;
  });
  /** One line per version: its peak value with unit, and local day, time and zone. */
  protected readonly lines = computed(() => {
    const review = this.review();
    if (!review) return [];
    const zone = review.series.timeZone;
    const line = (label: string, version: ForecastReview['draft']) => {
      const peak = peakAhead(version, review.series.intervalMinutes);
      return peak
        ? [
            {
              label,
              value: withUnit(peak.value, review.series.unit),
              when: `${zonedClock(peak.ts, zone)} (${peak.hoursAhead} h of it ahead)`,
            },
          ]
        : [];
    };
    const found = [...line('Approved', review.approved), ...line('Draft', review.draft)];
    return found;
  });
}
