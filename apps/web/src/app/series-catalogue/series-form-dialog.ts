import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { type AbstractControl, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  type SeriesDetail,
  type SeriesSummary,
  seriesIntervalMinutes,
  seriesKinds,
  seriesLevelDepth,
  seriesLevels,
  timestampsMarks,
  unitsByKind,
} from '@loadwright/contracts';
import { map, startWith } from 'rxjs';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import type { NetworkNode } from './network-tree';
import { SeriesClient } from './series-client';
import { type SeriesFormValue, changedFields, formIssues, formToRequest, newSeriesForm, seriesToForm } from './series-form';

/** What the series dialog is opened with. */
export interface SeriesDialogData {
  /** The series to edit, or null to add one. */
  readonly series: SeriesSummary | null;
  /** Systems, zones and substations a new or changed series may sit under. */
  readonly network: readonly NetworkNode[];
  /** Weather stations a load series may link to. */
  readonly stations: readonly SeriesSummary[];
  /** Time zone a new series starts with (the system's). */
  readonly defaultTimeZone: string;
}

/** Error key of the shared schema's message on a control. */
const schemaErrorKey = 'schema';

/** Words for the interval choices. */
const intervalLabels: Record<number, string> = {
  5: '5 minutes',
  15: '15 minutes',
  30: '30 minutes',
  60: 'Hourly (60 minutes)',
  1440: 'Daily',
};

/** Adds or edits a series in the catalogue; checks the shared schema first, then shows the server's refusals on their fields. */
@Component({
  selector: 'lw-series-form-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './series-form-dialog.html',
  styleUrl: './series-form-dialog.scss',
})
export class SeriesFormDialog {
  private readonly client = inject(SeriesClient);
  private readonly dialogRef = inject<MatDialogRef<SeriesFormDialog, SeriesDetail>>(MatDialogRef);
  /** What the dialog was opened with. */
  protected readonly data = inject<SeriesDialogData>(MAT_DIALOG_DATA);

  /** The form, filled from the series being edited or with a new hourly feeder. */
  protected readonly form = inject(NonNullableFormBuilder).group<SeriesFormValue>(
    this.data.series ? seriesToForm(this.data.series) : newSeriesForm(this.data.defaultTimeZone),
  );
  /** True when editing an existing series. */
  protected readonly editing = this.data.series !== null;
  /** Choices for the pickers. */
  protected readonly kinds = seriesKinds;
  protected readonly levels = seriesLevels;
  protected readonly intervals = seriesIntervalMinutes;
  protected readonly intervalLabels = intervalLabels;
  protected readonly marks = timestampsMarks;
  /** True while the API saves. */
  protected readonly saving = signal(false);
  /** A refusal that belongs to no single field. */
  protected readonly problem = signal<string | null>(null);

  private readonly kind = toSignal(this.form.controls.kind.valueChanges.pipe(startWith(this.form.controls.kind.value)), {
    requireSync: true,
  });
  private readonly level = toSignal(this.form.controls.level.valueChanges.pipe(startWith(this.form.controls.level.value)), {
    requireSync: true,
  });
  /** True for a load series: it has a level, a parent and may link a weather station. */
  protected readonly isLoad = computed(() => this.kind() === 'load');
  /** Units the chosen kind may be stored in. */
  protected readonly units = computed(() => unitsByKind[this.kind()]);
  /** Parents that sit above the chosen level (a series never sits under itself). */
  protected readonly parents = computed(() => {
    const level = this.level();
    const depth = level ? seriesLevelDepth[level] : Infinity;
    return this.data.network.filter((node) => seriesLevelDepth[node.level] < depth && node.id !== this.data.series?.id);
  });

  constructor() {
    this.form.controls.kind.valueChanges.pipe(map((kind) => unitsByKind[kind])).subscribe((units) => {
      if (!units.includes(this.form.controls.unit.value)) this.form.controls.unit.setValue(units[0]!);
    });
    if (this.editing) this.form.controls.kind.disable();
  }

  /** The message to show under a control: the shared schema's, else the server's. */
  protected messageFor(control: AbstractControl): string | null {
    const schema: unknown = control.errors?.[schemaErrorKey];
    return typeof schema === 'string' ? schema : serverError(control);
  }

  /** Checks the form with the shared schema, then creates or changes the series. */
  protected save(): void {
    this.problem.set(null);
    const value = this.form.getRawValue();
    const issues = formIssues(value);
    for (const [field, message] of Object.entries(issues)) {
      const control = this.form.get(field);
      if (control) {
        control.setErrors({ ...control.errors, [schemaErrorKey]: message });
        control.markAsTouched();
      } else {
        this.problem.set(message);
      }
    }
    if (Object.keys(issues).length > 0) return;
    const series = this.data.series;
    if (series) {
      const change = changedFields(series, value);
      if (Object.keys(change).length === 0) {
        this.dialogRef.close();
        return;
      }
      this.send(this.client.update(series.id, change));
    } else {
      this.send(this.client.create(formToRequest(value)));
    }
  }

  /** Sends a save and closes with the saved series; field refusals land on their controls. */
  private send(request: ReturnType<SeriesClient['create']>): void {
    this.saving.set(true);
    request.subscribe({
      next: (saved) => this.dialogRef.close(saved),
      error: (error: unknown) => {
        this.saving.set(false);
        const unplaced = error instanceof ApiProblem ? applyFieldErrors(this.form, error) : [];
        const placedAll = error instanceof ApiProblem && error.fieldErrors.length > 0 && unplaced.length === 0;
        this.problem.set(placedAll ? null : unplaced.length ? unplaced.join(' ') : problemMessage(error));
      },
    });
  }
}
