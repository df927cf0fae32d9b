import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { type Observable, map } from 'rxjs';

/** What a confirmation asks. */
export interface ConfirmRequest {
  /** The question as a heading, e.g. "Deactivate Ines Calloway?". */
  readonly title: string;
  /** What will happen, in a sentence or two. */
  readonly consequence: string;
  /** Label of the button that goes ahead, naming the action ("Deactivate"). */
  readonly confirmLabel: string;
  /** True when the action takes something away; the button then uses the error colour. */
  readonly destructive?: boolean;
}

/** A dialog that asks before an action that is hard to undo; closes with true to go ahead. */
@Component({
  selector: 'lw-confirm-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ request.title }}</h2>
    <mat-dialog-content>
      <p>{{ request.consequence }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button type="button" [class.destructive]="request.destructive" [mat-dialog-close]="true">
        {{ request.confirmLabel }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    p {
      margin: 0;
      max-width: 52ch;
    }
    .destructive {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
})
export class ConfirmDialog {
  /** The question this dialog asks. */
  protected readonly request = inject<ConfirmRequest>(MAT_DIALOG_DATA);
}

/** Opens a confirmation and emits true only when the person goes ahead. */
export function confirmAction(dialog: MatDialog, request: ConfirmRequest): Observable<boolean> {
  return dialog
    .open<ConfirmDialog, ConfirmRequest, boolean>(ConfirmDialog, { data: request, width: '440px', autoFocus: 'first-tabbable' })
    .afterClosed()
    .pipe(map((answer) => answer === true));
}
