import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import type { ChartData, ChartOptions } from 'chart.js';
import type { HierarchyCoherence, ReconciliationMethodName, ReconciliationResult, SeriesDetail } from '@loadwright/contracts';
import { BaseChartDirective } from 'ng2-charts';
import { type Observable, catchError, combineLatest, filter, map, of, startWith, Subject, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { chartColours, timeChartOptions, withUnit, zonedLabel } from './chart-theme';
import { SeriesPageClient } from './series-page-client';

/** What the panel shows: loading, a problem, or the comparison. */
type CoherenceState =
  | { readonly state: 'loading' }
  | { readonly state: 'failed'; readonly problem: string }
  | { readonly state: 'ready'; readonly coherence: HierarchyCoherence };

/** The methods a planner may choose, with the words the panel uses for them. */
const methods: { readonly value: ReconciliationMethodName; readonly label: string; readonly explanation: string }[] = [
  {
    value: 'min-trace',
    label: 'Minimum trace',
    explanation:
      'Moves every level by how uncertain its own forecast is (Wickramasuriya, Athanasopoulos & Hyndman 2019, with a shrunk error covariance).',
  },
  { value: 'bottom-up', label: 'Bottom-up', explanation: 'Keeps the lowest level as forecast and adds it up.' },
  { value: 'top-down', label: 'Top-down', explanation: 'Keeps this forecast and splits it by the last 28 days’ shares.' },
];

/**
 * Coherence of a parent with its children: its forecast against the sum of theirs hour by hour (plus the
 * unmetered load and losses a reconciliation allotted), and, for planners, reconciling the hierarchy below it.
 */
@Component({
  selector: 'lw-coherence-panel',
  imports: [BaseChartDirective, DecimalPipe, MatButtonModule, MatButtonToggleModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './coherence-panel.html',
  styleUrl: './coherence-panel.scss',
})
export class CoherencePanel {
  private readonly client = inject(SeriesPageClient);
  private readonly dialog = inject(MatDialog);
  private readonly reloads = new Subject<void>();

  /** The parent series. */
  readonly series = input.required<SeriesDetail>();
  /** Whether the person looking may reconcile (planners, admins). */
  readonly canReconcile = input(false);
  /** Emits after a reconciliation wrote a coherent set of drafts. */
  readonly reconciled = output<ReconciliationResult>();

  /** Drafts or approved versions. */
  protected readonly compare = signal<'draft' | 'approved'>('draft');
  /** The chosen reconciliation method. */
  protected readonly method = signal<ReconciliationMethodName>('min-trace');
  protected readonly methods = methods;
  protected readonly chosen = computed(() => methods.find((m) => m.value === this.method())!);
  /** True while reconciling. */
  protected readonly busy = signal(false);
  /** Why the last reconciliation failed. */
  protected readonly problem = signal<string | null>(null);

  protected readonly view = toSignal(
    combineLatest([toObservable(this.series), toObservable(this.compare), this.reloads.pipe(startWith(undefined))]).pipe(
      switchMap(([series, state]): Observable<CoherenceState> =>
        this.client.coherence(series.id, state).pipe(
          map((coherence): CoherenceState => ({ state: 'ready', coherence })),
          catchError((error: unknown) => of<CoherenceState>({ state: 'failed', problem: problemMessage(error) })),
          startWith<CoherenceState>({ state: 'loading' }),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } as CoherenceState },
  );

  /** The comparison, once read. */
  protected readonly coherence = computed(() => {
    const view = this.view();
    return view.state === 'ready' ? view.coherence : null;
  });

  /** The parent and the sum of its children (with the remainder when reconciled), as two lines. */
  protected readonly chartData = computed<ChartData<'line'>>(() => {
    const c = this.coherence();
    if (!c) return { datasets: [] };
    const reconciled = c.hours.some((h) => h.remainder !== null);
    return {
      datasets: [
        {
          label: `${c.parent.name} (solid)`,
          data: c.hours.map((h) => ({ x: Date.parse(h.ts), y: h.parent })),
          borderColor: chartColours.forecast,
          borderWidth: 2,
          pointRadius: 0,
          pointStyle: 'line',
        },
        {
          label: reconciled ? 'Children + unmetered and losses (dashed)' : 'Sum of the children (dashed)',
          data: c.hours.flatMap((h) => (h.childrenSum === null ? [] : [{ x: Date.parse(h.ts), y: h.childrenSum + (h.remainder ?? 0) }])),
          borderColor: chartColours.approved,
          borderWidth: 2,
          borderDash: [8, 5],
          pointRadius: 0,
          pointStyle: 'line',
        },
      ],
    };
  });
  protected readonly options = computed<ChartOptions<'line'>>(() => timeChartOptions(this.series().timeZone, this.series().unit, false));

  /** The hours where the parent and the sum differ most, largest first. */
  protected readonly widestHours = computed(() =>
    [...(this.coherence()?.hours ?? [])]
      .filter((h) => h.gapPercent !== null)
      .sort((a, b) => Math.abs(b.gapPercent!) - Math.abs(a.gapPercent!))
      .slice(0, 5),
  );

  protected readonly amount = withUnit;
  /** "0.321 MW (5.66 %)"; a gap that rounds to zero is shown as 0, never −0. */
  protected gapText(gap: number | null, percent: number | null, unit: string): string {
    if (gap === null || percent === null) return '—';
    const rounded = Math.round(gap * 1000) / 1000 || 0;
    const share = Math.round(percent * 100) / 100 || 0;
    return `${withUnit(rounded, unit, 3)} (${share.toFixed(2)} %)`;
  }
  protected readonly when = (ts: string) => zonedLabel(Date.parse(ts), this.series().timeZone);
  protected readonly describe = computed(() => {
    const c = this.coherence();
    if (!c) return 'No comparison yet.';
    return `${c.parent.name} against the sum of the ${c.children.length} series below it, hour by hour; the table lists the widest gaps.`;
  });

  /** Asks, then reconciles every draft of this series and below it. */
  protected reconcileHierarchy(): void {
    const method = this.chosen();
    confirmAction(this.dialog, {
      title: `Reconcile ${this.series().name} and everything below it (${method.label.toLowerCase()})?`,
      consequence: `${method.explanation} Each series gets a new draft that replaces its current one (adjusted numbers included); the set is approved together.`,
      confirmLabel: 'Reconcile',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => {
          this.busy.set(true);
          this.problem.set(null);
          return this.client.reconcile(this.series().id, { method: method.value });
        }),
      )
      .subscribe({
        next: (result) => {
          this.busy.set(false);
          this.compare.set('draft');
          this.reloads.next();
          this.reconciled.emit(result);
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.problem.set(problemMessage(error));
        },
      });
  }
}
