import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { SeriesDetail, UploadDetail, UploadFinding, ValidationRule } from '@loadwright/contracts';
import { catchError, forkJoin, of } from 'rxjs';
import { SeriesClient } from '../series-catalogue/series-client';
import { detailWords, informationalRules, ruleNames } from './rule-names';
import { OrganisationZone } from '../core/organisation/organisation-zone';
import { clockText } from '../refits/clock-text';
import { UploadsClient } from './uploads-client';

/** One rule's section of the report. */
interface RuleSection {
  readonly rule: ValidationRule;
  readonly name: string;
  readonly description: string;
  readonly count: number;
  readonly informational: boolean;
  readonly examples: UploadFinding[];
}

/**
 * The validation report of an import: what was stored and refused, counts and examples per rule,
 * a download of every finding as CSV, and links to the series the file touched (each series' page
 * and the catalogue filtered to its part of the network).
 */
@Component({
  selector: 'lw-upload-report',
  imports: [DecimalPipe, RouterLink, MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './upload-report.html',
  styleUrl: './upload-report.scss',
})
export class UploadReport {
  private readonly series = inject(SeriesClient);
  private readonly uploads = inject(UploadsClient);
  /** Finding times are stated in the organisation's zone, named in the table head. */
  protected readonly zone = inject(OrganisationZone);
  /** "3 Dec 06:00 CST" in the organisation's zone. */
  protected readonly clock = (iso: string) => clockText(iso, this.zone.timeZone(), false);

  /** The finished upload. */
  readonly detail = input.required<UploadDetail>();

  /** Rules with findings, problems first, each with its examples. */
  protected readonly sections = computed<RuleSection[]>(() => {
    const { counts, examples } = this.detail().report;
    return counts
      .map((entry) => ({
        rule: entry.rule,
        name: ruleNames[entry.rule],
        description: entry.description,
        count: entry.count,
        informational: informationalRules.has(entry.rule),
        examples: examples.filter((finding) => finding.rule === entry.rule),
      }))
      .sort((a, b) => Number(a.informational) - Number(b.informational));
  });
  /** Findings that point at a problem (estimates stored are not). */
  protected readonly problemCount = computed(() => this.sections().reduce((sum, s) => sum + (s.informational ? 0 : s.count), 0));
  /** Address of the findings CSV. */
  protected readonly csvUrl = computed(() => this.uploads.reportCsvUrl(this.detail().upload.id));
  /** The series the file touched, as far as the mapping and the findings name them, looked up in the catalogue. */
  protected readonly touched = signal<SeriesDetail[]>([]);
  protected readonly detailWords = (detail: Record<string, unknown>) => detailWords(detail, this.clock);

  constructor() {
    effect(() => {
      const keys = touchedKeys(this.detail());
      untracked(() => {
        if (keys.length === 0) return this.touched.set([]);
        forkJoin(keys.map((key) => this.series.get(key).pipe(catchError(() => of(null))))).subscribe((found) =>
          this.touched.set(found.filter((s): s is SeriesDetail => s !== null)),
        );
      });
    });
  }
}

/** Series keys named by the confirmed mapping and by the report's examples, sorted. */
function touchedKeys(detail: UploadDetail): string[] {
  const keys = new Set<string>();
  const mapping = detail.upload.mapping;
  if (mapping?.layout === 'wide') for (const c of mapping.seriesColumns) keys.add(c.seriesKey);
  if (mapping?.layout === 'long' && mapping.seriesKey) keys.add(mapping.seriesKey);
  for (const finding of detail.report.examples) if (finding.seriesKey && finding.rule !== 'unknown_series') keys.add(finding.seriesKey);
  return [...keys].sort();
}
