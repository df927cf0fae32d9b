import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { ApprovalPreview, ApprovalResult, HierarchyCoherence, SeriesDetail } from '@loadwright/contracts';
import { catchError, filter, forkJoin, of, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { withUnit } from './chart-theme';
import { SeriesPageClient } from './series-page-client';
import { zoneAbbreviation } from './zoned-time';

/** Bulk approval of a group (planners, admins): what approving every draft below this series would change, then all or none. */
@Component({
  selector: 'lw-group-approval',
  imports: [DecimalPipe, MatButtonModule, MatCheckboxModule, MatIconModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './group-approval.html',
  styleUrl: './group-approval.scss',
})
export class GroupApproval {
  private readonly client = inject(SeriesPageClient);
  private readonly dialog = inject(MatDialog);

  /** The group's top series. */
  readonly series = input.required<SeriesDetail>();
  /** Emits after the group's drafts were approved. */
  readonly approved = output<ApprovalResult>();

  /** The preview, once asked for. */
  protected readonly preview = signal<ApprovalPreview | null>(null);
  /** Whether the group's drafts add up (the parent against its children), read with the preview. */
  protected readonly coherence = signal<HierarchyCoherence | null>(null);
  /** True while a request is on its way. */
  protected readonly busy = signal(false);
  /** Why the last request failed. */
  protected readonly problem = signal<string | null>(null);
  /** True when the planner chose to approve stale drafts too (most of their hours passed). */
  protected readonly includeStale = signal(false);
  /** The drafts the approve button sends: current ones, and stale ones only when included. */
  protected readonly toApprove = computed(() => {
    const preview = this.preview();
    if (!preview) return [];
    return this.includeStale() ? [...new Set([...preview.versionIds, ...preview.staleVersionIds])] : preview.versionIds;
  });
  /** Rows with a draft, largest peak change first. */
  protected readonly rows = computed(() =>
    [...(this.preview()?.items ?? [])]
      .filter((item) => item.draft)
      .sort((a, b) => Math.abs(b.peakDifferencePercent ?? 0) - Math.abs(a.peakDifferencePercent ?? 0)),
  );

  protected readonly amount = withUnit;
  protected readonly zoneAt = zoneAbbreviation;

  /** Asks the API what approving the group would change. */
  protected previewGroup(): void {
    this.busy.set(true);
    this.problem.set(null);
    forkJoin({
      preview: this.client.previewApproval(this.series().id),
      coherence: this.client.coherence(this.series().id, 'draft').pipe(catchError(() => of(null))),
    }).subscribe({
      next: ({ preview, coherence }) => {
        this.busy.set(false);
        this.includeStale.set(false);
        this.preview.set(preview);
        this.coherence.set(coherence);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(problemMessage(error));
      },
    });
  }

  /** Asks, then approves every previewed draft together. */
  protected approveGroup(): void {
    const ids = this.toApprove();
    const includeStale = this.includeStale();
    if (!ids.length) return;
    const stale = includeStale ? (this.preview()?.staleVersionIds.length ?? 0) : 0;
    confirmAction(this.dialog, {
      title: `Approve ${ids.length} drafts of ${this.series().name} and below?`,
      consequence: `Each draft becomes the forecast handed on for its series and supersedes the version approved before it. All are approved together, or none if one changed meanwhile.${stale ? ` ${stale} of them ${stale === 1 ? 'is' : 'are'} stale: most of their hours have passed.` : ''}`,
      confirmLabel: `Approve ${ids.length} drafts`,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => {
          this.busy.set(true);
          return this.client.approveMany(ids, includeStale);
        }),
      )
      .subscribe({
        next: (result) => {
          this.busy.set(false);
          this.preview.set(null);
          this.approved.emit(result);
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.problem.set(problemMessage(error));
        },
      });
  }
}
