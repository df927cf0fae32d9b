import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { missSeverities, missStates, seriesLevels, type MissDetail, type MissSummary } from '@loadwright/contracts';
import { of } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { problemMessage } from '../core/problems/api-problem';
import { MissChart } from './miss-chart';
import { MissesClient, type MissFilters } from './misses-client';
import { MissesViews } from './misses-views';

/**
 * The Misses page: open, acknowledged and resolved misses with filters by series, group, severity,
 * state and period; one miss open beside the list with its evidence, likely cause and chart, to
 * acknowledge with a comment, comment on, or resolve.
 */
@Component({
  selector: 'lw-misses',
  imports: [
    DatePipe,
    DecimalPipe,
    FormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    MissChart,
    MissesViews,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './misses.html',
  styleUrl: './misses.scss',
})
export class Misses {
  private readonly client = inject(MissesClient);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  /** The open miss's id (route parameter), if one is open. */
  readonly id = input<string>();

  protected readonly levels = seriesLevels;
  protected readonly severities = missSeverities;
  protected readonly states = missStates;

  /** The filters as typed. */
  protected readonly filters = signal<MissFilters>({ series: '', level: '', severity: '', state: '', from: '', to: '' });
  /** Bumped after an action to read list and miss again. */
  private readonly refreshes = signal(0);
  /** The misses matching the filters. */
  protected readonly misses = rxResource<MissSummary[], { filters: MissFilters; n: number }>({
    params: () => ({ filters: this.filters(), n: this.refreshes() }),
    stream: ({ params }) => this.client.list(params.filters),
  });
  /** The open miss. */
  protected readonly miss = rxResource<MissDetail | null, { id: string | undefined; n: number }>({
    params: () => ({ id: this.id(), n: this.refreshes() }),
    stream: ({ params }) => (params.id ? this.client.detail(Number(params.id)) : of(null)),
  });
  /** The comment being written. */
  protected readonly comment = signal('');
  /** What the last action did, or why it failed. */
  protected readonly outcome = signal<string | null>(null);
  protected readonly actionProblem = signal<string | null>(null);
  /** True while an action is being saved. */
  protected readonly busy = signal(false);

  /** May acknowledge and comment (viewers may). */
  protected readonly canAcknowledge = computed(() => this.session.permissions().has('misses.acknowledge'));
  /** May resolve (planners and admins). */
  protected readonly canResolve = computed(() => this.session.permissions().has('misses.rules'));
  /** Why the list or the miss could not be read. */
  protected readonly problem = computed(() => {
    const error = this.misses.error() ?? this.miss.error();
    return error ? problemMessage(error) : null;
  });

  /** Changes one filter. */
  protected setFilter(key: keyof MissFilters, value: string): void {
    this.filters.update((f) => ({ ...f, [key]: value }));
  }

  /** Local time of an instant in a zone, e.g. "31 Oct, 10:00". */
  protected local(iso: string, timeZone: string): string {
    return new Intl.DateTimeFormat('en-GB', { timeZone, day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' }).format(
      Date.parse(iso),
    );
  }

  /** Acknowledges the open miss with the comment. */
  protected acknowledge(miss: MissDetail): void {
    this.act(this.client.acknowledge(miss.id, this.comment()));
  }

  /** Adds the comment. */
  protected addComment(miss: MissDetail): void {
    this.act(this.client.comment(miss.id, this.comment()));
  }

  /** Resolves the open miss (with the comment, if any). */
  protected resolve(miss: MissDetail): void {
    this.act(this.client.resolve(miss.id, this.comment() || undefined));
  }

  /** Opens a miss from the list. */
  protected open(item: MissSummary): void {
    void this.router.navigate(['/misses', item.id]);
  }

  private act(request: ReturnType<MissesClient['comment']>): void {
    this.busy.set(true);
    this.actionProblem.set(null);
    request.subscribe({
      next: ({ message }) => {
        this.busy.set(false);
        this.outcome.set(message);
        this.comment.set('');
        this.refreshes.update((n) => n + 1);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.outcome.set(null);
        this.actionProblem.set(problemMessage(error));
      },
    });
  }
}
