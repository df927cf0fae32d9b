import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import {
  type SeriesSummary,
  type Upload,
  type UploadDetail,
  type UploadSettings,
  repeatedHourPolicies,
  timestampsMarks,
  uploadUnits,
} from '@loadwright/contracts';
import { catchError, map, of } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { initialCatalogueQuery } from '../series-catalogue/catalogue-query';
import { SeriesClient } from '../series-catalogue/series-client';
import { type MappingDraft, draftFromProposal, draftIssues, draftToRequest, withSeries } from './mapping-draft';
import { UploadsClient } from './uploads-client';

/** Rows of the preview shown (the API sends up to 20). */
const previewRows = 8;

/** Words for the units a file may be in. */
const unitWords: Record<(typeof uploadUnits)[number], string> = {
  W: 'W (mean demand)',
  kW: 'kW (mean demand)',
  MW: 'MW (mean demand)',
  Wh: 'Wh per interval (energy, converted to demand)',
  kWh: 'kWh per interval (energy, converted to demand)',
  MWh: 'MWh per interval (energy, converted to demand)',
  degC: '°C',
  degF: '°F',
};

/** Words for the repeated-hour policies. */
const policyWords: Record<(typeof repeatedHourPolicies)[number], string> = {
  'by-order': 'By file order: first daylight, then standard time; ask me when order cannot tell',
  'first-is-daylight': 'First is daylight, second standard time',
  reject: 'Drop readings in that hour',
};

/**
 * The mapping step: the first rows of the file, the proposed column mapping and settings to check
 * and change, then confirm, which queues the import. Checks the shared schema before sending; the
 * server's refusal (which names the column) shows as it is.
 */
@Component({
  selector: 'lw-mapping-step',
  imports: [
    FormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './mapping-step.html',
  styleUrl: './mapping-step.scss',
})
export class MappingStep {
  private readonly uploads = inject(UploadsClient);

  /** The upload awaiting its mapping, with layout, preview and proposal. */
  readonly detail = input.required<UploadDetail>();
  /** The mapping was accepted and the import queued. */
  readonly confirmed = output<Upload>();

  /** Live series to map onto, by key. */
  protected readonly catalogue = toSignal(
    inject(SeriesClient)
      .list({ ...initialCatalogueQuery, pageSize: 200 })
      .pipe(
        map((page) => page.items),
        catchError(() => of<SeriesSummary[]>([])),
      ),
    { initialValue: [] as SeriesSummary[] },
  );
  /** The form's state. */
  protected readonly draft = signal<MappingDraft | null>(null);
  /** The file's columns. */
  protected readonly columns = computed(() => this.detail().layout?.columns ?? []);
  /** The first rows shown. */
  protected readonly rows = computed(() => (this.detail().preview?.rows ?? []).slice(0, previewRows));
  /** What the draft still lacks, shown once the steward has tried to confirm. */
  protected readonly issues = computed(() => {
    const draft = this.draft();
    return draft ? draftIssues(draft) : [];
  });
  /** True once confirm was pressed (issues show from then on). */
  protected readonly tried = signal(false);
  /** True while the API checks the mapping against the file. */
  protected readonly sending = signal(false);
  /** The server's refusal. */
  protected readonly problem = signal<string | null>(null);
  /** What each column is used for, for the preview's headings. */
  protected readonly roles = computed(() => {
    const draft = this.draft();
    const roles = new Map<string, string>();
    if (!draft) return roles;
    roles.set(draft.timestampColumn, 'timestamp');
    if (draft.layout === 'long') {
      roles.set(draft.valueColumn, 'value');
      if (draft.seriesKeyColumn) roles.set(draft.seriesKeyColumn, 'series key');
    } else {
      for (const [column, key] of Object.entries(draft.wideColumns))
        if (key && column !== draft.timestampColumn) roles.set(column, `→ ${key}`);
    }
    roles.delete('');
    return roles;
  });
  protected readonly units = uploadUnits;
  protected readonly unitWords = unitWords;
  protected readonly marks = timestampsMarks;
  protected readonly policies = repeatedHourPolicies;
  protected readonly policyWords = policyWords;

  constructor() {
    effect(() => {
      const detail = this.detail();
      untracked(() => {
        if (detail.proposal && detail.layout) this.draft.set(draftFromProposal(detail.proposal, detail.layout));
      });
    });
  }

  /** Changes one mapping choice. */
  protected set<K extends keyof MappingDraft>(field: K, value: MappingDraft[K]): void {
    this.draft.update((draft) => (draft ? { ...draft, [field]: value } : draft));
  }

  /** Changes one setting. */
  protected setting<K extends keyof UploadSettings>(field: K, value: UploadSettings[K]): void {
    this.draft.update((draft) => (draft ? { ...draft, settings: { ...draft.settings, [field]: value } } : draft));
  }

  /** Sets the minutes between the file's readings; an empty field reads them from the rows. */
  protected setFileInterval(value: number | string | null): void {
    const minutes = value === '' || value === null ? null : Number(value);
    this.setting('fileIntervalMinutes', minutes !== null && Number.isInteger(minutes) && minutes > 0 ? minutes : null);
  }

  /** Maps a column of a wide file onto a series ('' leaves it out). */
  protected mapColumn(column: string, seriesKey: string): void {
    this.draft.update((draft) => (draft ? { ...draft, wideColumns: { ...draft.wideColumns, [column]: seriesKey } } : draft));
  }

  /** The series a wide file's column is read into, '' when left out. */
  protected seriesOfColumn(draft: MappingDraft, column: string): string {
    return Object.hasOwn(draft.wideColumns, column) ? draft.wideColumns[column]! : '';
  }

  /** Chooses the one series of a long file; its time zone and convention come with it. */
  protected chooseSeries(key: string): void {
    const series = this.catalogue().find((s) => s.key === key);
    this.draft.update((draft) => (draft ? (series ? withSeries(draft, series) : { ...draft, seriesKey: key }) : draft));
  }

  /** Confirms the mapping, which queues the import. */
  protected confirm(): void {
    this.tried.set(true);
    this.problem.set(null);
    const draft = this.draft();
    if (!draft || this.issues().length > 0) return;
    this.sending.set(true);
    this.uploads.confirm(this.detail().upload.id, draftToRequest(draft)).subscribe({
      next: (upload) => this.confirmed.emit(upload),
      error: (error: unknown) => {
        this.sending.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }
}
