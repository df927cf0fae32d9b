import { ChangeDetectionStrategy, Component, computed, inject, output, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import type { RefitRunSummary, RefitScope, SeriesSummary } from '@loadwright/contracts';
import { catchError, map, of } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { RefitsClient } from './refits-client';

/** How much a manual run covers. */
type ScopeKind = RefitScope['kind'];

/** "Refit now" (planners, admins): all active series, a group (a series and everything below it), or one series. */
@Component({
  selector: 'lw-refit-now',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <form class="refit-now" (ngSubmit)="startRun()">
      <h2 id="refit-now-heading">Refit now</h2>
      <mat-form-field subscriptSizing="dynamic">
        <mat-label>What to refit</mat-label>
        <mat-select name="kind" [ngModel]="kind()" (ngModelChange)="chooseKind($event)">
          <mat-option value="all">All active series</mat-option>
          <mat-option value="subtree">A group (a series and all below it)</mat-option>
          <mat-option value="series">One series</mat-option>
        </mat-select>
      </mat-form-field>
      @if (kind() !== 'all') {
        <mat-form-field subscriptSizing="dynamic" class="target">
          <mat-label>{{ kind() === 'subtree' ? 'Group' : 'Series' }}</mat-label>
          <mat-select name="target" [ngModel]="targetId()" (ngModelChange)="targetId.set($event)" required>
            @for (series of choices(); track series.id) {
              <mat-option [value]="series.id">{{ series.name }} ({{ series.key }}, {{ series.level }})</mat-option>
            }
          </mat-select>
        </mat-form-field>
      }
      <button mat-flat-button type="submit" [disabled]="starting() || (kind() !== 'all' && targetId() === null)">
        <mat-icon aria-hidden="true" svgIcon="model_training"></mat-icon>
        Refit now
      </button>
      @if (problem(); as message) {
        <p class="notice problem" role="alert">
          <mat-icon aria-hidden="true" svgIcon="error"></mat-icon><span>{{ message }}</span>
        </p>
      }
    </form>
  `,
  styleUrl: './refit-now.scss',
})
export class RefitNow {
  private readonly client = inject(RefitsClient);

  /** Emits the run the API started. */
  readonly started = output<RefitRunSummary>();

  /** The chosen scope kind. */
  protected readonly kind = signal<ScopeKind>('subtree');
  /** The chosen group or series. */
  protected readonly targetId = signal<number | null>(null);
  /** True while the request is on its way. */
  protected readonly starting = signal(false);
  /** Why the run could not start, or null. */
  protected readonly problem = signal<string | null>(null);
  /** Live load series, or an empty list when they cannot be read (the problem shows on start). */
  private readonly series = toSignal(
    this.client.loadSeries().pipe(
      map((page) => page.items),
      catchError(() => of([] as SeriesSummary[])),
    ),
    { initialValue: [] as SeriesSummary[] },
  );
  /** Groups are the series others hang below; a single series may be any load series. */
  protected readonly choices = computed(() => {
    const all = this.series();
    if (this.kind() !== 'subtree') return all;
    const parents = new Set(all.map((s) => s.parentId));
    return all.filter((s) => parents.has(s.id));
  });

  /** Switches the scope kind and forgets a target that no longer fits. */
  protected chooseKind(kind: ScopeKind): void {
    this.kind.set(kind);
    if (!this.choices().some((s) => s.id === this.targetId())) this.targetId.set(null);
  }

  /** Asks the API to start the run. */
  protected startRun(): void {
    const scope = this.scope();
    if (!scope) return;
    this.starting.set(true);
    this.problem.set(null);
    this.client.start(scope).subscribe({
      next: (run) => {
        this.starting.set(false);
        this.started.emit(run);
      },
      error: (error: unknown) => {
        this.starting.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }

  /** The scope the form describes, or null while a target is missing. */
  private scope(): RefitScope | null {
    const id = this.targetId();
    switch (this.kind()) {
      case 'all':
        return { kind: 'all' };
      case 'subtree':
        return id === null ? null : { kind: 'subtree', seriesId: id };
      case 'series':
        return id === null ? null : { kind: 'series', seriesIds: [id] };
    }
  }
}
