import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { merge } from 'rxjs';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { AdjustmentKind, ForecastAdjustment, ForecastSeries, ForecastVersion } from '@loadwright/contracts';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { unitLabel } from './chart-theme';
import { SeriesPageClient } from './series-page-client';
import { instantOfLocal, localOfInstant, zonedClock } from './zoned-time';

/** The planner's adjustments of a draft: the list (removable while the version is a draft) and a form to add one. */
@Component({
  selector: 'lw-adjustments-panel',
  imports: [
    DecimalPipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './adjustments-panel.html',
  styleUrl: './adjustments-panel.scss',
})
export class AdjustmentsPanel {
  private readonly client = inject(SeriesPageClient);

  /** The series, for its unit and time zone. */
  readonly series = input.required<ForecastSeries>();
  /** The version whose adjustments are listed. */
  readonly version = input.required<ForecastVersion>();
  /** True when the person may adjust (planners, admins). */
  readonly canAdjust = input(false);
  /** Emits after an adjustment was added or removed. */
  readonly changed = output<void>();

  /** The add form; times are wall-clock times in the series' zone. */
  protected readonly form = new FormGroup({
    from: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    to: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    kind: new FormControl<AdjustmentKind>('shift', { nonNullable: true }),
    amount: new FormControl<number | null>(null, { validators: [Validators.required] }),
    reason: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.minLength(5), Validators.maxLength(500)],
    }),
    /** Ticked when the planner confirms a change beyond a plausible one, after the API asked. */
    confirmLargeChange: new FormControl(false, { nonNullable: true }),
  });
  /** The API's question about a change beyond a plausible one (see plausibleAdjustmentShare), or null. */
  protected readonly confirmation = signal<{ question: string; label: string } | null>(null);
  /** True while a request is on its way. */
  protected readonly busy = signal(false);
  /** A problem no field took, or null. */
  protected readonly problem = signal<string | null>(null);
  /** True while the version can still change. */
  protected readonly editable = computed(() => this.canAdjust() && this.version().state === 'draft');

  protected readonly fieldError = serverError;
  protected readonly unit = computed(() => unitLabel(this.series().unit));

  constructor() {
    // A confirmation answers one amount for one period: any change of those asks again.
    const { from, to, kind, amount } = this.form.controls;
    merge(from.valueChanges, to.valueChanges, kind.valueChanges, amount.valueChanges)
      .pipe(takeUntilDestroyed())
      .subscribe(() => {
        if (!this.confirmation()) return;
        this.confirmation.set(null);
        this.form.controls.confirmLargeChange.setValue(false);
      });
    // Start the period at the version's first day, local time, so the planner edits rather than types.
    effect(() => {
      const version = this.version();
      const zone = this.series().timeZone;
      if (this.form.controls.from.value) return;
      this.form.patchValue({
        from: localOfInstant(version.origin, zone),
        to: localOfInstant(new Date(Date.parse(version.origin) + 24 * 3_600_000).toISOString(), zone),
      });
    });
  }

  /** A period in the series' zone, e.g. "Thu Jan 15 17:00 CST → Thu Jan 15 21:00 CST". */
  protected period(adjustment: ForecastAdjustment): string {
    const zone = this.series().timeZone;
    return `${zonedClock(adjustment.from, zone)} → ${zonedClock(adjustment.to, zone)}`;
  }

  /** Sends the adjustment; after it is stored the form starts afresh, showing no message. */
  protected addAdjustment(formDirective: FormGroupDirective): void {
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    const value = this.form.getRawValue();
    const zone = this.series().timeZone;
    const from = instantOfLocal(value.from, zone);
    const to = instantOfLocal(value.to, zone);
    if (!from || !to) {
      this.problem.set('Give the period as a date and time.');
      return;
    }
    this.busy.set(true);
    this.problem.set(null);
    this.client
      .addAdjustment(this.version().id, {
        from,
        to,
        kind: value.kind,
        amount: Number(value.amount),
        reason: value.reason,
        confirmLargeChange: value.confirmLargeChange,
      })
      .subscribe({
        next: () => {
          this.busy.set(false);
          // resetForm clears the submitted state too, so the emptied fields show no "give a reason" message.
          formDirective.resetForm({ ...value, amount: null, reason: '', confirmLargeChange: false });
          this.confirmation.set(null);
          this.changed.emit();
        },
        error: (error: unknown) => {
          this.busy.set(false);
          const asked =
            error instanceof ApiProblem ? error.fieldErrors.find((field) => field.pointer === '/confirmLargeChange') : undefined;
          if (asked) {
            this.confirmation.set({ question: problemMessage(error), label: asked.detail });
            this.problem.set(null);
            return;
          }
          const unplaced = error instanceof ApiProblem ? applyFieldErrors(this.form, error) : [];
          this.problem.set(
            error instanceof ApiProblem && error.fieldErrors.length && !unplaced.length
              ? null
              : [problemMessage(error), ...unplaced].join(' '),
          );
        },
      });
  }

  /** Removes one adjustment. */
  protected removeAdjustment(adjustment: ForecastAdjustment): void {
    this.busy.set(true);
    this.client.removeAdjustment(this.version().id, adjustment.id).subscribe({
      next: () => {
        this.busy.set(false);
        this.changed.emit();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }
}
