import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import {
  missSeverities,
  type HolidayCalendar,
  type MissRule,
  type MissRuleUpdate,
  type OrganisationSettings,
  type OrganisationSettingsUpdate,
} from '@loadwright/contracts';
import type { Observable } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { RULE_PARAMETER_FIELDS, numberOrNull } from '../shared/miss-rules/rule-parameters';

/** A default rule as edited in the table. */
type RuleDraft = Pick<MissRule, 'hours' | 'threshold' | 'bandLevel' | 'floorKw' | 'peakHourTolerance' | 'severity' | 'active'>;

/**
 * Settings (admins): the organisation's time zone, refit hour, morning deadline, digest hour and sender
 * address; the miss rule defaults; and the holiday calendar (list a year, add and remove days, seed a
 * year with the country's public holidays).
 */
@Component({
  selector: 'lw-settings',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, MatSlideToggleModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './settings.html',
  styleUrl: './settings.scss',
})
export class Settings {
  private readonly http = inject(HttpClient);

  protected readonly hours = Array.from({ length: 24 }, (_, h) => h);
  protected readonly severities = missSeverities;
  /** The rule parameters, one table column each. */
  protected readonly parameterFields = RULE_PARAMETER_FIELDS;
  /** A number typed in a field, or null when left empty. */
  protected readonly numberOrNull = numberOrNull;

  private readonly refreshes = signal(0);
  /** The organisation's settings as stored. */
  protected readonly settings = rxResource<OrganisationSettings, number>({
    params: () => this.refreshes(),
    stream: () => this.http.get<OrganisationSettings>('/api/settings'),
  });
  /** Every rule; the table shows the defaults. */
  protected readonly rules = rxResource<MissRule[], number>({
    params: () => this.refreshes(),
    stream: () => this.http.get<MissRule[]>('/api/miss-rules'),
  });
  protected readonly defaults = computed(() => (this.rules.hasValue() ? this.rules.value().filter((rule) => rule.scope === 'all') : []));
  /** The year whose holidays are listed. */
  protected readonly year = signal(new Date().getFullYear());
  protected readonly holidays = rxResource<HolidayCalendar, { year: number; n: number }>({
    params: () => ({ year: this.year(), n: this.refreshes() }),
    stream: ({ params }) =>
      this.http.get<HolidayCalendar>('/api/holidays', { params: { from: `${params.year}-01-01`, to: `${params.year}-12-31` } }),
  });

  /** The organisation form's values (filled from the stored settings on first read). */
  protected readonly form = signal<OrganisationSettingsUpdate>({});
  /** Edits to default rules, by id. */
  protected readonly ruleEdits = signal<Record<number, Partial<RuleDraft>>>({});
  /** A day to add to the calendar. */
  protected readonly newDay = signal('');
  protected readonly newName = signal('');

  protected readonly outcome = signal<string | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly problem = computed(() => {
    const error = this.settings.error() ?? this.rules.error() ?? this.holidays.error();
    return error ? problemMessage(error) : null;
  });

  /** A field of the organisation form: the edited value, else the stored one. */
  protected field<K extends keyof OrganisationSettingsUpdate>(key: K): OrganisationSettingsUpdate[K] {
    const edited = this.form()[key];
    if (edited !== undefined) return edited;
    return this.settings.hasValue() ? (this.settings.value()[key] as OrganisationSettingsUpdate[K]) : undefined;
  }

  /** Changes a field of the organisation form. */
  protected setField<K extends keyof OrganisationSettingsUpdate>(key: K, value: OrganisationSettingsUpdate[K]): void {
    this.form.update((form) => ({ ...form, [key]: value }));
  }

  /** Saves the organisation's settings that changed. */
  protected saveSettings(): void {
    const change = this.form();
    if (Object.keys(change).length === 0) {
      this.report('Nothing changed.');
      return;
    }
    this.run(this.http.patch('/api/settings', change), 'Settings saved. The refit schedule follows within a minute.', () =>
      this.form.set({}),
    );
  }

  /** A rule field: edited or stored. */
  protected ruleField<K extends keyof RuleDraft>(rule: MissRule, key: K): RuleDraft[K] {
    const edited = this.ruleEdits()[rule.id]?.[key];
    return (edited !== undefined ? edited : rule[key]) as RuleDraft[K];
  }

  /** Changes a rule field; numbers typed empty become null. */
  protected setRuleField<K extends keyof RuleDraft>(rule: MissRule, key: K, value: RuleDraft[K]): void {
    this.ruleEdits.update((edits) => ({ ...edits, [rule.id]: { ...edits[rule.id], [key]: value } }));
  }

  /** Saves one default rule. */
  protected saveRule(rule: MissRule): void {
    const change = this.ruleEdits()[rule.id];
    if (!change || Object.keys(change).length === 0) {
      this.report(`${rule.kindName}: nothing changed.`);
      return;
    }
    this.run(this.http.patch(`/api/miss-rules/${rule.id}`, change as MissRuleUpdate), `${rule.kindName}: saved.`, () =>
      this.ruleEdits.update(({ [rule.id]: _done, ...rest }) => rest),
    );
  }

  /** Adds the typed day to the calendar. */
  protected addHoliday(): void {
    this.run(
      this.http.post('/api/holidays', { day: this.newDay(), name: this.newName(), kind: 'company' }),
      `${this.newDay()} added.`,
      () => {
        this.newDay.set('');
        this.newName.set('');
      },
    );
  }

  /** Removes a day from the calendar; from the next refit on it no longer counts as a holiday. */
  protected removeHoliday(id: number, day: string): void {
    this.run(this.http.delete(`/api/holidays/${id}`), `${day} removed: it no longer counts as a holiday from the next refit on.`);
  }

  /** Seeds the listed year with the country's public holidays. */
  protected seedYear(): void {
    this.run(this.http.post<{ added: number }>('/api/holidays/seed', { years: [this.year()] }), `Seeded ${this.year()}.`);
  }

  /** Shows the next or previous year. */
  protected moveYear(by: number): void {
    this.year.update((year) => year + by);
  }

  private run(request: Observable<unknown>, message: string, after?: () => void): void {
    this.failure.set(null);
    request.subscribe({
      next: () => {
        after?.();
        this.report(message);
        this.refreshes.update((n) => n + 1);
      },
      error: (error: unknown) => {
        this.outcome.set(null);
        this.failure.set(problemMessage(error));
      },
    });
  }

  private report(message: string): void {
    this.outcome.set(message);
  }
}
