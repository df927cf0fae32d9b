import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  type ModelMethod,
  type ModelSettings,
  type ModelSettingsRequest,
  type SeasonalTreatment,
  modelMethodLabels,
  modelMethods,
  modelSettingsRequestSchema,
} from '@loadwright/contracts';
import type { Observable } from 'rxjs';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { SeriesPageClient } from './series-page-client';

/** Seasonal treatments offered, by a key the select can hold. */
const seasonalChoices: { key: string; label: string; value: SeasonalTreatment }[] = [
  { key: 'none', label: 'None', value: { kind: 'none' } },
  { key: 'how-add', label: 'Hour-of-week profile, additive', value: { kind: 'profile', slot: 'hour-of-week', form: 'additive' } },
  {
    key: 'how-mul',
    label: 'Hour-of-week profile, multiplicative',
    value: { kind: 'profile', slot: 'hour-of-week', form: 'multiplicative' },
  },
  { key: 'hod-add', label: 'Hour-of-day profile, additive', value: { kind: 'profile', slot: 'hour-of-day', form: 'additive' } },
  { key: 'hod-mul', label: 'Hour-of-day profile, multiplicative', value: { kind: 'profile', slot: 'hour-of-day', form: 'multiplicative' } },
  { key: 'diff-24', label: 'Differencing at 24 hours', value: { kind: 'difference', lag: 24 } },
  { key: 'diff-168', label: 'Differencing at 168 hours', value: { kind: 'difference', lag: 168 } },
];

/** The select key of a seasonal treatment. */
function seasonalKey(value: SeasonalTreatment): string {
  return seasonalChoices.find((choice) => JSON.stringify(choice.value) === JSON.stringify(value))?.key ?? 'none';
}

/** What the dialog edits. */
export interface ModelSettingsDialogData {
  readonly seriesId: number;
  readonly settings: ModelSettings;
  /** What the form does with the checked settings instead of saving them (e.g. start a trial of them); closes with its answer. */
  readonly submit?: ModelSettingsSubmit;
}

/** Another use of the settings form: its words and where the checked settings go. */
export interface ModelSettingsSubmit {
  readonly title: string;
  readonly hint: string;
  readonly label: string;
  readonly send: (settings: ModelSettingsRequest) => Observable<unknown>;
}

/** Reads an optional whole number from a text field: empty means "let the method choose" (null). */
function optionalInteger(value: string | number | null): number | null {
  return value === null || value === '' ? null : Number(value);
}

/**
 * A series' model settings (planners, admins), checked with the shared schema before sending; server errors land on
 * their fields. The same form proposes settings for a trial.
 */
@Component({
  selector: 'lw-model-settings-dialog',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './model-settings-dialog.html',
  styleUrl: './model-settings-dialog.scss',
})
export class ModelSettingsDialog {
  private readonly client = inject(SeriesPageClient);
  private readonly dialogRef = inject<MatDialogRef<ModelSettingsDialog, unknown>>(MatDialogRef);
  /** The series and its current settings. */
  protected readonly data = inject<ModelSettingsDialogData>(MAT_DIALOG_DATA);

  protected readonly methods = modelMethods;
  protected readonly methodLabels = modelMethodLabels;
  protected readonly seasonalChoices = seasonalChoices;
  protected readonly fieldError = serverError;

  /** The form, filled from the current settings. */
  protected readonly form = new FormGroup({
    method: new FormControl<ModelMethod>(this.data.settings.method, { nonNullable: true }),
    arOrder: new FormControl<string | number | null>(this.data.settings.arOrder),
    maxArOrder: new FormControl<number>(this.data.settings.maxArOrder, { nonNullable: true }),
    maOrder: new FormControl<string | number | null>(this.data.settings.maOrder),
    maxMaOrder: new FormControl<number>(this.data.settings.maxMaOrder, { nonNullable: true }),
    seasonal: new FormControl(seasonalKey(this.data.settings.seasonal), { nonNullable: true }),
    log: new FormControl(this.data.settings.log, { nonNullable: true }),
    dayTypes: new FormControl(this.data.settings.dayTypes, { nonNullable: true }),
    temperature: new FormGroup({ enabled: new FormControl(this.data.settings.temperature.enabled, { nonNullable: true }) }),
    trainingWindowDays: new FormControl<number>(this.data.settings.trainingWindowDays, { nonNullable: true }),
    horizonHours: new FormControl<number>(this.data.settings.horizonHours, { nonNullable: true }),
  });
  /** True while saving. */
  protected readonly saving = signal(false);
  /** Problems no field took. */
  protected readonly problem = signal<string | null>(null);

  /** Checks the settings with the shared schema and saves them. */
  protected saveSettings(): void {
    const value = this.form.getRawValue();
    const current = this.data.settings;
    const request = {
      method: value.method,
      arOrder: optionalInteger(value.arOrder),
      maOrder: optionalInteger(value.maOrder),
      maxArOrder: Number(value.maxArOrder),
      maxMaOrder: Number(value.maxMaOrder),
      extraLags: current.extraLags,
      seasonal: seasonalChoices.find((choice) => choice.key === value.seasonal)!.value,
      log: value.log,
      temperature: { ...current.temperature, enabled: value.temperature.enabled },
      dayTypes: value.dayTypes,
      trainingWindowDays: Number(value.trainingWindowDays),
      horizonHours: Number(value.horizonHours),
      levels: current.levels,
    } satisfies ModelSettingsRequest;
    const checked = modelSettingsRequestSchema.safeParse(request);
    if (!checked.success) {
      const problem = new ApiProblem({
        type: '/problems/invalid-input',
        title: 'Check the settings',
        status: 400,
        errors: checked.error.issues.map((issue) => ({ pointer: '/' + issue.path.join('/'), detail: issue.message })),
      });
      this.showProblem(problem);
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    const send =
      this.data.submit?.send ?? ((settings: ModelSettingsRequest) => this.client.saveModelSettings(this.data.seriesId, settings));
    send(checked.data).subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error: unknown) => {
        this.saving.set(false);
        this.showProblem(error);
      },
    });
  }

  /** Puts field errors on their controls and the rest above the buttons. */
  private showProblem(error: unknown): void {
    if (error instanceof ApiProblem && error.fieldErrors.length) {
      const unplaced = applyFieldErrors(this.form, error);
      this.problem.set(unplaced.length ? unplaced.join(' ') : null);
    } else {
      this.problem.set(problemMessage(error));
    }
  }
}
