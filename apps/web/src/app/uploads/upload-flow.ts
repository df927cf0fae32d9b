import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { UploadDetail } from '@loadwright/contracts';
import type { Subscription } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { followImport, isFinished } from './follow-import';
import { MappingStep } from './mapping-step';
import { RepeatedHourChoices } from './repeated-hour-choices';
import { UploadReport } from './upload-report';
import { fileSize, statusLooks } from './upload-status';
import { UploadsClient } from './uploads-client';

/** How often a running import is polled, ms. */
const pollEveryMs = 1000;

/**
 * One upload from mapping to report: the mapping step while it awaits one, a progress bar polled
 * while it imports (polling stops when it finishes or the page is left), the repeated daylight-saving
 * hours to choose for when the import stopped to ask, then the validation report, or the message of a
 * refused or cancelled file.
 */
@Component({
  selector: 'lw-upload-flow',
  imports: [
    DatePipe,
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MappingStep,
    RepeatedHourChoices,
    UploadReport,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './upload-flow.html',
  styleUrl: './upload-flow.scss',
})
export class UploadFlow {
  private readonly client = inject(UploadsClient);

  /** The upload shown. */
  readonly uploadId = input.required<number>();

  /** The latest answer about the upload; null while the first loads. */
  protected readonly detail = signal<UploadDetail | null>(null);
  /** Why the upload could not be read. */
  protected readonly problem = signal<string | null>(null);
  protected readonly statusLooks = statusLooks;
  protected readonly fileSize = fileSize;
  private polling: Subscription | null = null;

  constructor() {
    effect(() => {
      const id = this.uploadId();
      untracked(() => this.follow(id));
    });
    inject(DestroyRef).onDestroy(() => this.polling?.unsubscribe());
  }

  /** The mapping was confirmed: follow the import from now on. */
  protected importStarted(): void {
    this.follow(this.uploadId());
  }

  /** Reads the upload, and keeps reading it while its import runs. */
  private follow(id: number): void {
    this.polling?.unsubscribe();
    this.problem.set(null);
    this.polling = followImport(() => this.client.get(id), pollEveryMs).subscribe({
      next: (detail) => {
        this.detail.set(detail);
        // An upload awaiting its mapping does not change by itself: stop asking.
        if (detail.upload.status === 'received') this.polling?.unsubscribe();
      },
      error: (error: unknown) => this.problem.set(problemMessage(error)),
    });
  }

  /** Heading of the progress card for the upload's status. */
  protected progressTitle(detail: UploadDetail): string {
    if (detail.upload.status === 'queued') return 'Waiting for the import to start';
    if (detail.upload.status === 'done') return 'Import finished';
    return 'Importing and validating';
  }

  /** True while the import is waiting or running. */
  protected running(detail: UploadDetail): boolean {
    return !isFinished(detail.upload.status) && detail.upload.status !== 'received';
  }
}
