import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { missSeverities, type MissRule, type MissRuleParameter, type MissRulesInForce, type SeriesLevel } from '@loadwright/contracts';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { RULE_PARAMETER_FIELDS, numberOrNull, type RuleParameterField } from '../shared/miss-rules/rule-parameters';
import { MissesClient } from './misses-client';

/** Where an override applies: one series or every series of a group (level). */
export type OverrideTarget = { scope: 'series'; seriesId: number; name: string } | { scope: 'level'; level: SeriesLevel; name: string };

/** The values the form edits. */
interface OverrideValues {
  parameters: Partial<Record<MissRuleParameter, number | null>>;
  severity: MissRule['severity'];
  recipients: string;
  active: boolean;
}

/**
 * Adds or changes the override of one rule kind for a series or a group. Starts from the override when
 * there is one, else from the rule in force there; only the settings the kind reads are shown. Checks
 * what it can before sending and shows the API's refusals beside the fields they name.
 */
@Component({
  selector: 'lw-rule-override-form',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatSlideToggleModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './rule-override-form.html',
  styleUrl: './rule-override-form.scss',
})
export class RuleOverrideForm {
  private readonly client = inject(MissesClient);

  /** The kind being overridden, with the rule in force and the override set here. */
  readonly entry = input.required<MissRulesInForce['kinds'][number]>();
  /** Where the override applies. */
  readonly target = input.required<OverrideTarget>();
  /** Emits what was saved, in a sentence. */
  readonly saved = output<string>();
  /** Emits when the planner closes the form without saving. */
  readonly cancelled = output<void>();

  protected readonly severities = missSeverities;
  /** The fields of the kind, with the kind's own words for the threshold. */
  protected readonly fields = computed(() => {
    const reads = this.baseRule()?.reads ?? [];
    return RULE_PARAMETER_FIELDS.filter((field) => reads.includes(field.key));
  });
  /** The threshold's meaning for this kind, e.g. "percent error". */
  protected readonly thresholdMeaning = computed(() => this.baseRule()?.thresholdMeaning ?? null);

  /** The rule the form starts from. */
  private readonly baseRule = computed(() => this.entry().override ?? this.entry().inForce);
  /** Edits over the starting values. */
  private readonly edits = signal<Partial<OverrideValues>>({});
  /** The values shown: edits over the starting rule. */
  protected readonly values = computed<OverrideValues>(() => {
    const base = this.baseRule();
    const start: OverrideValues = {
      parameters: Object.fromEntries(RULE_PARAMETER_FIELDS.map((field) => [field.key, base ? base[field.key] : null])),
      severity: base?.severity ?? 'medium',
      recipients: (base?.recipients ?? []).join(', '),
      active: this.entry().override ? this.entry().override!.active : true,
    };
    const edits = this.edits();
    return { ...start, ...edits, parameters: { ...start.parameters, ...edits.parameters } };
  });
  /** Refusals by field key (from the checks here or the API's pointers). */
  protected readonly fieldErrors = signal<Partial<Record<string, string>>>({});
  /** Why saving failed, in a sentence. */
  protected readonly problem = signal<string | null>(null);
  protected readonly busy = signal(false);

  /** The refusals to list under the fields, each with the id its field points to. */
  protected readonly errorList = computed(() =>
    Object.entries(this.fieldErrors()).flatMap(([key, message]) => (message ? [{ key, id: this.inputId(key) + '-error', message }] : [])),
  );

  /** The id of a field's input, unique per kind. */
  protected inputId(key: string): string {
    return `override-${this.entry().kind}-${key}`;
  }

  /** Sets a parameter from what was typed. */
  protected setParameter(key: MissRuleParameter, typed: string | number | null): void {
    this.edits.update((edits) => ({ ...edits, parameters: { ...edits.parameters, [key]: numberOrNull(typed) } }));
  }

  /** Sets severity, recipients or the on/off switch. */
  protected set<K extends 'severity' | 'recipients' | 'active'>(key: K, value: OverrideValues[K]): void {
    this.edits.update((edits) => ({ ...edits, [key]: value }));
  }

  /** A sentence on a value outside what the field accepts, or null when it is fine. */
  private check(field: RuleParameterField, value: number | null): string | null {
    const name = field.key === 'threshold' && this.thresholdMeaning() ? `The threshold (${this.thresholdMeaning()})` : field.name;
    if (value === null) return field.required ? `${name} is needed: enter a number from ${field.min} to ${field.max}.` : null;
    if (field.whole && !Number.isInteger(value)) return `${name} is a whole number.`;
    if (field.key === 'threshold' && value <= 0) return `${name} must be above 0.`;
    if (value < field.min || (field.max !== null && value > field.max))
      return field.max === null ? `${name} must be ${field.min} or more.` : `${name} must be from ${field.min} to ${field.max}.`;
    return null;
  }

  /** Adds the override, or changes the one set here. */
  protected save(): void {
    const values = this.values();
    const errors: Record<string, string> = {};
    for (const field of this.fields()) {
      const message = this.check(field, values.parameters[field.key] ?? null);
      if (message) errors[field.key] = message;
    }
    this.fieldErrors.set(errors);
    if (Object.keys(errors).length) {
      this.problem.set('Some settings need a look before the override can be saved.');
      return;
    }
    const parameters = Object.fromEntries(this.fields().map((field) => [field.key, values.parameters[field.key] ?? null]));
    const recipients = values.recipients
      .split(/[,;\s]+/)
      .map((r) => r.trim())
      .filter(Boolean);
    const settings = { ...parameters, severity: values.severity, recipients, active: values.active };
    const target = this.target();
    const override = this.entry().override;
    const request = override
      ? this.client.changeRule(override.id, settings)
      : this.client.addOverride({
          kind: this.entry().kind,
          ...(target.scope === 'series'
            ? { scope: 'series', scopeSeriesId: target.seriesId }
            : { scope: 'level', scopeLevel: target.level }),
          ...settings,
        });
    this.busy.set(true);
    this.problem.set(null);
    request.subscribe({
      next: () => {
        this.busy.set(false);
        this.edits.set({});
        this.saved.emit(`${this.entry().kindName} for ${target.name}: override ${override ? 'changed' : 'added'}.`);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(problemMessage(error));
        if (error instanceof ApiProblem)
          this.fieldErrors.set(Object.fromEntries(error.fieldErrors.map((e) => [e.pointer.split('/')[1] ?? '', e.detail])));
      },
    });
  }
}
