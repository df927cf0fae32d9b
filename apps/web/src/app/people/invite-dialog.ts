import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { type InviteResponse, type Role, roles } from '@loadwright/contracts';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { PeopleClient } from './people-client';
import { ROLE_DESCRIPTIONS } from './person-status';

/** Invites someone: e-mail, name and role; the API e-mails the set-password link. Closes with the new person. */
@Component({
  selector: 'lw-invite-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Invite someone</h2>
    <form [formGroup]="form" (ngSubmit)="invite()" novalidate>
      <mat-dialog-content>
        <p class="intro">They receive an e-mail with a one-time link to choose a password. The link expires after three days.</p>
        @if (problem(); as message) {
          <p class="problem" role="alert">
            <mat-icon aria-hidden="true" svgIcon="error"></mat-icon><span>{{ message }}</span>
          </p>
        }
        <mat-form-field appearance="outline">
          <mat-label>E-mail address</mat-label>
          <input matInput type="email" formControlName="email" autocomplete="off" required />
          @if (form.controls.email.hasError('required')) {
            <mat-error>Enter their e-mail address</mat-error>
          } @else if (form.controls.email.hasError('email')) {
            <mat-error>Enter a valid e-mail address, e.g. name&#64;utility.example</mat-error>
          } @else if (serverError(form.controls.email); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Name</mat-label>
          <input matInput formControlName="displayName" autocomplete="off" required />
          @if (form.controls.displayName.hasError('required')) {
            <mat-error>Enter their name as colleagues know it</mat-error>
          } @else if (serverError(form.controls.displayName); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Role</mat-label>
          <mat-select formControlName="role">
            @for (role of roles; track role) {
              <mat-option [value]="role">{{ role }}</mat-option>
            }
          </mat-select>
          <mat-hint>{{ describe(form.controls.role.value) }}</mat-hint>
          @if (serverError(form.controls.role); as message) {
            <mat-error>{{ message }}</mat-error>
          }
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="sending()">{{ sending() ? 'Sending…' : 'Send invite' }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    mat-dialog-content {
      display: flex;
      flex-direction: column;
      gap: 8px;
    }
    mat-form-field {
      width: 100%;
    }
    .intro {
      margin: 0 0 8px;
      color: var(--mat-sys-on-surface-variant);
    }
    .problem {
      display: flex;
      gap: 8px;
      margin: 0 0 8px;
      padding: 10px 12px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
  `,
})
export class InviteDialog {
  private readonly people = inject(PeopleClient);
  private readonly dialogRef = inject<MatDialogRef<InviteDialog, InviteResponse>>(MatDialogRef);

  /** The invite form; new people start as viewers, the role with least reach. */
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    displayName: ['', Validators.required],
    role: ['viewer' as Role, Validators.required],
  });
  /** Roles to choose from. */
  protected readonly roles = roles;
  /** True while the API creates the account and sends the mail. */
  protected readonly sending = signal(false);
  /** The API's refusal when it is not about one field. */
  protected readonly problem = signal<string | null>(null);
  /** The server's message on a control, for the template. */
  protected readonly serverError = serverError;

  /** One line on what the role may do. */
  protected describe(role: Role): string {
    return ROLE_DESCRIPTIONS[role];
  }

  /** Sends the invite; field refusals land on their controls. */
  protected invite(): void {
    this.problem.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.sending.set(true);
    this.people.invite(this.form.getRawValue()).subscribe({
      next: (person) => this.dialogRef.close(person),
      error: (error: unknown) => {
        this.sending.set(false);
        const unplaced = error instanceof ApiProblem ? applyFieldErrors(this.form, error) : [];
        this.problem.set(error instanceof ApiProblem && error.fieldErrors.length && !unplaced.length ? null : problemMessage(error));
      },
    });
  }
}
