import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { seriesLevels, type MissRulesInForce, type SeriesLevel } from '@loadwright/contracts';
import { SessionStore } from '../core/auth/session-store';
import { problemMessage } from '../core/problems/api-problem';
import { describeRule } from '../shared/miss-rules/rule-parameters';
import { MissesClient } from './misses-client';
import { MissesViews } from './misses-views';
import { RuleOverrideForm, type OverrideTarget } from './rule-override-form';

/** Plural words for a group, e.g. "every feeder". */
const everyOf = (level: SeriesLevel) => `every ${level}`;

/**
 * The Rules view of the Misses section: the rules in force for one series or one group (level), kind by
 * kind, and where each comes from (the admin's default, the group's override or the series' own).
 * Planners and admins add, change and remove overrides here; everyone else reads them.
 */
@Component({
  selector: 'lw-miss-rules',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule, MissesViews, RuleOverrideForm],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './miss-rules.html',
  styleUrl: './miss-rules.scss',
})
export class MissRules {
  private readonly client = inject(MissesClient);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  /** `?series=<id>`: the series whose rules are shown. */
  readonly series = input<string>();
  /** `?level=<level>`: the group whose rules are shown (when no series is named). */
  readonly level = input<string>();

  protected readonly levels = seriesLevels;
  protected readonly everyOf = everyOf;
  protected readonly describeRule = describeRule;

  /** The chooser's value: "series:<id>" or "level:<level>" (every feeder until one is chosen). */
  protected readonly choice = computed(() => {
    const id = this.series();
    if (id && /^\d+$/.test(id)) return `series:${id}`;
    const level = this.level();
    return `level:${level && (seriesLevels as readonly string[]).includes(level) ? level : 'feeder'}`;
  });
  /** Bumped after a change to read the rules again. */
  private readonly refreshes = signal(0);
  /** Load series to choose from. */
  protected readonly loadSeries = rxResource({ stream: () => this.client.loadSeries() });
  /** The rules in force for the chosen series or group. */
  protected readonly rules = rxResource<MissRulesInForce, { choice: string; n: number }>({
    params: () => ({ choice: this.choice(), n: this.refreshes() }),
    stream: ({ params }) => {
      const [scope, value] = params.choice.split(':') as [string, string];
      return scope === 'series'
        ? this.client.rulesInForce({ series: Number(value) })
        : this.client.rulesInForce({ level: value as SeriesLevel });
    },
  });
  /** Where an override made here applies. */
  protected readonly target = computed<OverrideTarget | null>(() => {
    if (!this.rules.hasValue()) return null;
    const view = this.rules.value();
    if (view.scope === 'series' && view.series) return { scope: 'series', seriesId: view.series.id, name: view.series.name };
    return view.level ? { scope: 'level', level: view.level, name: everyOf(view.level) } : null;
  });

  /** May add, change and remove overrides (planners and admins). */
  protected readonly canEdit = computed(() => this.session.permissions().has('misses.rules'));
  /** The kind whose override form is open. */
  protected readonly editing = signal<string | null>(null);
  /** What the last change did, or why it failed. */
  protected readonly outcome = signal<string | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly problem = computed(() => {
    const error = this.rules.error() ?? this.loadSeries.error();
    return error ? problemMessage(error) : null;
  });

  /** Where a kind's rule comes from, in words. */
  protected sourceWords(entry: MissRulesInForce['kinds'][number]): string {
    const view = this.rules.value()!;
    if (entry.source === 'series') return "This series' own override";
    if (entry.source === 'level') return `Override for ${everyOf(view.level!)}`;
    return 'Default (Settings)';
  }

  /** Shows the rules of another series or group. */
  protected choose(value: string): void {
    const [scope, id] = value.split(':') as [string, string];
    this.editing.set(null);
    this.outcome.set(null);
    void this.router.navigate(['/misses/rules'], { queryParams: scope === 'series' ? { series: id } : { level: id } });
  }

  /** Opens the override form of a kind. */
  protected edit(kind: string): void {
    this.outcome.set(null);
    this.failure.set(null);
    this.editing.set(kind);
  }

  /** After the form saved: close it, say so, read the rules again. */
  protected afterSave(message: string): void {
    this.editing.set(null);
    this.failure.set(null);
    this.outcome.set(message);
    this.refreshes.update((n) => n + 1);
  }

  /** Removes the override set here; the group's override or the default applies again. */
  protected remove(entry: MissRulesInForce['kinds'][number]): void {
    if (!entry.override) return;
    this.editing.set(null);
    this.client.removeOverride(entry.override.id).subscribe({
      next: ({ message }) => this.afterSave(message),
      error: (error: unknown) => {
        this.outcome.set(null);
        this.failure.set(problemMessage(error));
      },
    });
  }
}
