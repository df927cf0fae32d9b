import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import type { GreenButtonImportResult, SeriesSummary } from '@loadwright/contracts';
import { catchError, map, of } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { initialCatalogueQuery } from '../series-catalogue/catalogue-query';
import { SeriesClient } from '../series-catalogue/series-client';
import { UploadsClient } from './uploads-client';

/**
 * A Green Button (ESPI) XML file dropped on the Uploads page: the steward picks the load series it
 * belongs to and imports it through the Green Button import, which reads the file's own intervals,
 * units and multiplier (no column mapping applies).
 */
@Component({
  selector: 'lw-green-button-import',
  imports: [DecimalPipe, FormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './green-button-import.html',
  styleUrl: './green-button-import.scss',
})
export class GreenButtonImport {
  private readonly client = inject(UploadsClient);

  /** The XML file dropped. */
  readonly file = input.required<File>();
  /** The import finished (the list of uploads has grown). */
  readonly imported = output<GreenButtonImportResult>();

  /** Live load series a usage file can go into. */
  protected readonly loadSeries = toSignal(
    inject(SeriesClient)
      .list({ ...initialCatalogueQuery, pageSize: 200 })
      .pipe(
        map((page) => page.items.filter((series) => series.kind === 'load')),
        catchError(() => of<SeriesSummary[]>([])),
      ),
    { initialValue: [] as SeriesSummary[] },
  );
  /** The series chosen. */
  protected readonly seriesKey = signal('');
  /** True while the file is being imported. */
  protected readonly sending = signal(false);
  /** What the import did. */
  protected readonly result = signal<GreenButtonImportResult | null>(null);
  /** Why the import was refused. */
  protected readonly problem = signal<string | null>(null);
  /** The findings of the import in one line, e.g. "gap 1 · estimated 1". */
  protected readonly findingWords = computed(() =>
    Object.entries(this.result()?.findingCounts ?? {})
      .map(([rule, count]) => `${rule.replace(/_/g, ' ')} ${count}`)
      .join(' · '),
  );

  /** Sends the file to the Green Button import of the chosen series. */
  protected importFile(): void {
    const key = this.seriesKey();
    if (!key) {
      this.problem.set('Choose the series this usage file belongs to.');
      return;
    }
    this.sending.set(true);
    this.problem.set(null);
    this.client.importGreenButton(key, this.file()).subscribe({
      next: (result) => {
        this.sending.set(false);
        this.result.set(result);
        this.imported.emit(result);
      },
      error: (error: unknown) => {
        this.sending.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }
}
