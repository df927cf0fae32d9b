import type { UploadStatus } from '@loadwright/contracts';

/** How a status reads in lists and headings: words and an icon. */
export const statusLooks: Record<UploadStatus, { readonly label: string; readonly icon: string }> = {
  received: { label: 'Awaiting mapping', icon: 'rule' },
  queued: { label: 'Queued', icon: 'schedule' },
  importing: { label: 'Importing', icon: 'sync' },
  done: { label: 'Imported', icon: 'check_circle' },
  failed: { label: 'Refused', icon: 'error' },
  cancelled: { label: 'Cancelled', icon: 'block' },
  awaiting_choice: { label: 'Needs your choice', icon: 'warning' },
};

/** File sizes in B, kB or MB (powers of 1024), to one decimal above a kB. */
export function fileSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
