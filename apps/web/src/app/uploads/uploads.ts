import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { Router } from '@angular/router';
import type { UploadReceipt } from '@loadwright/contracts';
import { DropZone } from './drop-zone';
import { UploadFlow } from './upload-flow';
import { UploadList } from './upload-list';

/**
 * The Uploads section (stewards and admins): a drop zone and the recent uploads; with an id in the
 * address, one upload's mapping, import progress and validation report.
 */
@Component({
  selector: 'lw-uploads',
  imports: [DropZone, UploadList, UploadFlow],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (uploadId(); as id) {
      <lw-upload-flow [uploadId]="id" />
    } @else {
      <header class="page-head">
        <div>
          <h1>Uploads</h1>
          <p class="lede">
            Bring in meter, SCADA and temperature readings from CSV files: map the columns, follow the import, read what validation found.
          </p>
        </div>
      </header>
      <lw-drop-zone (received)="openUpload($event)" (answered)="listVersion.set(listVersion() + 1)" />
      <lw-upload-list [refreshKey]="listVersion()" />
    }
  `,
  styleUrl: './uploads.scss',
})
export class Uploads {
  private readonly router = inject(Router);

  /** The open upload's id (route parameter), if one is open. */
  readonly id = input<string>();
  /** The id as a number, or null for the list. */
  protected readonly uploadId = computed(() => {
    const id = Number(this.id());
    return Number.isInteger(id) && id > 0 ? id : null;
  });
  /** Bumped to read the list again. */
  protected readonly listVersion = signal(0);

  /** A file was taken in: go on to its mapping. */
  protected openUpload(receipt: UploadReceipt): void {
    void this.router.navigate(['/uploads', receipt.upload.id]);
  }
}
