import type { UploadDetail, UploadStatus } from '@loadwright/contracts';
import { type Observable, type SchedulerLike, switchMap, takeWhile, timer } from 'rxjs';

/** Statuses after which an upload no longer changes. */
const finalStatuses: readonly UploadStatus[] = ['done', 'failed'];

/** True once an upload has finished, well or not. */
export function isFinished(status: UploadStatus): boolean {
  return finalStatuses.includes(status);
}

/**
 * Polls an upload's detail every `periodMs` (first at once) until its import is done or failed, and
 * emits each answer, the final one included. Unsubscribing (leaving the page) stops the polling; a
 * slow answer is dropped in favour of the next one.
 */
export function followImport(read: () => Observable<UploadDetail>, periodMs = 1000, scheduler?: SchedulerLike): Observable<UploadDetail> {
  return timer(0, periodMs, scheduler).pipe(
    switchMap(() => read()),
    takeWhile((detail) => !isFinished(detail.upload.status), true),
  );
}
