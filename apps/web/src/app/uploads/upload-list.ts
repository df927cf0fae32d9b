import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatButtonModule } from '@angular/material/button';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { Upload } from '@loadwright/contracts';
import { Subject, catchError, switchMap, takeWhile, tap, timer, EMPTY } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { isFinished } from './follow-import';
import { fileSize, statusLooks } from './upload-status';
import { UploadsClient } from './uploads-client';

/** How often the list is read again while an import is running, ms. */
const refreshWhileActiveMs = 3000;

/** Uploads shown per page. */
const pageSize = 20;

/**
 * The uploads, newest first, a page at a time, with status and progress; read again every few seconds
 * while any import on the page runs. A queued or running import can be cancelled from its row.
 */
@Component({
  selector: 'lw-upload-list',
  imports: [DatePipe, DecimalPipe, RouterLink, MatButtonModule, MatIconModule, MatPaginatorModule, MatProgressBarModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './upload-list.html',
  styleUrl: './upload-list.scss',
})
export class UploadList {
  private readonly client = inject(UploadsClient);

  /** Changes whenever the list should be read again (e.g. after a new upload). */
  readonly refreshKey = input(0);

  /** The uploads, newest first; null while loading. */
  protected readonly uploads = signal<Upload[] | null>(null);
  /** How many uploads there are in all. */
  protected readonly total = signal(0);
  /** Why the list could not be read, or an import not cancelled. */
  protected readonly problem = signal<string | null>(null);
  /** The page shown, from 0 (the newest uploads). */
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = pageSize;
  /** The upload whose cancellation is being sent. */
  protected readonly cancelling = signal<number | null>(null);
  protected readonly statusLooks = statusLooks;
  protected readonly fileSize = fileSize;
  private readonly refresh = new Subject<void>();

  constructor() {
    this.refresh
      .pipe(
        switchMap(() =>
          timer(0, refreshWhileActiveMs).pipe(
            switchMap(() =>
              this.client
                .list(pageSize, this.pageIndex() * pageSize)
                .pipe(catchError((error: unknown) => (this.problem.set(problemMessage(error)), EMPTY))),
            ),
            tap((page) => {
              this.problem.set(null);
              this.uploads.set(page.items);
              this.total.set(page.total);
            }),
            takeWhile((page) => page.items.some((upload) => !isFinished(upload.status) && upload.status !== 'received')),
          ),
        ),
        takeUntilDestroyed(),
      )
      .subscribe();
    effect(() => {
      this.refreshKey();
      this.refresh.next();
    });
  }

  /** Shows another page of uploads. */
  protected turnPage(event: PageEvent): void {
    this.pageIndex.set(event.pageIndex);
    this.refresh.next();
  }

  /** Cancels a queued or running import, then reads the list again. */
  protected cancelImport(upload: Upload): void {
    this.cancelling.set(upload.id);
    this.client.cancel(upload.id).subscribe({
      next: () => {
        this.cancelling.set(null);
        this.refresh.next();
      },
      error: (error: unknown) => {
        this.cancelling.set(null);
        this.problem.set(problemMessage(error));
        this.refresh.next();
      },
    });
  }
}
