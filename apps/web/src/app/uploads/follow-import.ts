import type { UploadDetail, UploadStatus } from '@loadwright/contracts';
import { type Observable, type SchedulerLike, switchMap, takeWhile, timer } from 'rxjs';

/** Statuses after which an upload no longer changes by itself (one awaiting a choice waits for the steward). */
const finalStatuses: readonly UploadStatus[] = ['done', 'failed', 'cancelled', 'awaiting_choice'];

/** True once an upload has finished, well or not, or waits for the steward. */
export function isFinished(status: UploadStatus): boolean {
  return finalStatuses.includes(status);
}

/**
 * Polls an upload's detail every `periodMs` (first at once) until its import is done, failed or cancelled, or waits for a choice, and
 * emits each answer, the final one included. Unsubscribing (leaving the page) stops the polling; a
 * slow answer is dropped in favour of the next one.
 */
export function followImport(read: () => Observable<UploadDetail>, periodMs = 1000, scheduler?: SchedulerLike): Observable<UploadDetail> {
  return timer(0, periodMs, scheduler).pipe(
    switchMap(() => read()),
    takeWhile((detail) => !isFinished(detail.upload.status), true),
  );
}
