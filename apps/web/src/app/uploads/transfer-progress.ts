import { type HttpEvent, HttpEventType } from '@angular/common/http';
import type { UploadReceipt } from '@loadwright/contracts';

/** Where a file's transfer stands: sending (percent known or not), or answered with a receipt. */
export type TransferState =
  | { readonly phase: 'sending'; readonly percent: number | null; readonly loaded: number }
  | { readonly phase: 'received'; readonly receipt: UploadReceipt };

/** The state after one HTTP event, or null for events that change nothing the page shows. */
export function transferStep(event: HttpEvent<UploadReceipt>): TransferState | null {
  switch (event.type) {
    case HttpEventType.Sent:
      return { phase: 'sending', percent: 0, loaded: 0 };
    case HttpEventType.UploadProgress:
      return {
        phase: 'sending',
        percent: event.total ? Math.min(100, Math.round((event.loaded / event.total) * 100)) : null,
        loaded: event.loaded,
      };
    case HttpEventType.Response:
      return event.body ? { phase: 'received', receipt: event.body } : null;
    default:
      return null;
  }
}
