import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, inject, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { UploadReceipt } from '@loadwright/contracts';
import { type Subscription, filter, map } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { greenButtonRefusal, isXmlFile } from './green-button-file';
import { GreenButtonImport } from './green-button-import';
import { type TransferState, transferStep } from './transfer-progress';
import { UploadsClient } from './uploads-client';

/** What the drop zone shows about the last file. */
type DropOutcome =
  | { readonly kind: 'refused'; readonly fileName: string; readonly message: string }
  | { readonly kind: 'green-button'; readonly file: File }
  | { readonly kind: 'repeat'; readonly message: string; readonly uploadId: number };

/**
 * Takes one CSV file, dropped or picked, and sends it with a progress bar for the transfer. A file
 * Loadwright accepts is handed on (`received`); a refused one shows the server's message, which
 * names the row and column; the same bytes again point to the earlier upload. A Green Button (ESPI)
 * XML file (by its name or type, or as the server recognised it) goes to the Green Button import.
 */
@Component({
  selector: 'lw-drop-zone',
  imports: [DecimalPipe, RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, GreenButtonImport],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './drop-zone.html',
  styleUrl: './drop-zone.scss',
})
export class DropZone {
  private readonly client = inject(UploadsClient);

  /** A file was stored and previewed; its mapping comes next. */
  readonly received = output<UploadReceipt>();
  /** The server answered about a file, whatever the answer (the list of uploads may have grown). */
  readonly answered = output<void>();

  /** The transfer under way, or null. */
  protected readonly transfer = signal<(TransferState & { phase: 'sending' }) | null>(null);
  /** Name and size of the file being sent. */
  protected readonly sending = signal<{ name: string; size: number } | null>(null);
  /** What became of the last file, when it was not handed on. */
  protected readonly outcome = signal<DropOutcome | null>(null);
  /** True while a file is dragged over the zone. */
  protected readonly dragging = signal(false);
  private subscription: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.subscription?.unsubscribe());
  }

  /** Keeps the browser from opening a dragged file, and shows the zone as ready. */
  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'copy';
    this.dragging.set(true);
  }

  /** Takes the first dropped file. */
  protected dropFile(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files.item(0);
    if (file) this.sendFile(file);
  }

  /** Takes the picked file, and clears the picker so the same file can be picked again. */
  protected pickFile(input: HTMLInputElement): void {
    const file = input.files?.item(0);
    input.value = '';
    if (file) this.sendFile(file);
  }

  /** Sends a file and follows the transfer; an XML file goes to the Green Button import instead. */
  private sendFile(file: File): void {
    this.subscription?.unsubscribe();
    this.outcome.set(null);
    if (isXmlFile(file)) {
      this.outcome.set({ kind: 'green-button', file });
      return;
    }
    this.sending.set({ name: file.name, size: file.size });
    this.transfer.set({ phase: 'sending', percent: 0, loaded: 0 });
    this.subscription = this.client
      .send(file)
      .pipe(
        map(transferStep),
        filter((step) => step !== null),
      )
      .subscribe({
        next: (step) => {
          if (step.phase === 'sending') {
            this.transfer.set(step);
            return;
          }
          this.transfer.set(null);
          this.answer(file, step.receipt);
        },
        error: (error: unknown) => {
          this.transfer.set(null);
          this.outcome.set({ kind: 'refused', fileName: file.name, message: problemMessage(error) });
        },
      });
  }

  /** Decides what the answer means for the steward. */
  private answer(file: File, receipt: UploadReceipt): void {
    const fileName = file.name;
    this.answered.emit();
    if (receipt.duplicateOf !== null) {
      this.outcome.set({
        kind: 'repeat',
        message: receipt.message ?? `Already uploaded as upload ${receipt.duplicateOf}.`,
        uploadId: receipt.duplicateOf,
      });
    } else if (receipt.upload.status === 'failed' && receipt.upload.error?.startsWith(greenButtonRefusal)) {
      this.outcome.set({ kind: 'green-button', file });
    } else if (receipt.upload.status === 'failed') {
      this.outcome.set({
        kind: 'refused',
        fileName,
        message: receipt.message ?? receipt.upload.error ?? 'Loadwright could not read this file.',
      });
    } else {
      this.received.emit(receipt);
    }
  }
}
