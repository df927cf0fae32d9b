import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { type ApiToken, type CreatedApiToken, type TokenScope, tokenScopes } from '@loadwright/contracts';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { SCOPE_DESCRIPTIONS } from './token-state';
import { TokensClient } from './tokens-client';

/**
 * Creates an API token: name, scope, expiry. After creation the dialog shows the secret once, with a
 * copy button and a plain warning, and closes with the new token (never the secret).
 */
@Component({
  selector: 'lw-create-token-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatRadioModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './create-token-dialog.html',
  styleUrl: './create-token-dialog.scss',
})
export class CreateTokenDialog {
  private readonly tokens = inject(TokensClient);
  private readonly dialogRef = inject<MatDialogRef<CreateTokenDialog, ApiToken>>(MatDialogRef);

  /** The token's settings; a year's expiry by default, so forgotten tokens stop working. */
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', Validators.required],
    scope: ['read' as TokenScope],
    expires: [true],
    expiresInDays: [365, [Validators.required, Validators.min(1), Validators.max(3650)]],
  });
  /** Scopes to choose from, with what each allows. */
  protected readonly scopes = tokenScopes.map((scope) => ({ scope, description: SCOPE_DESCRIPTIONS[scope] }));
  /** True while the API creates the token. */
  protected readonly creating = signal(false);
  /** The created token and its secret, shown once. */
  protected readonly created = signal<CreatedApiToken | null>(null);
  /** Whether the secret reached the clipboard. */
  protected readonly copied = signal<'yes' | 'failed' | null>(null);
  /** The API's refusal when it is not about one field. */
  protected readonly problem = signal<string | null>(null);
  /** The server's message on a control, for the template. */
  protected readonly serverError = serverError;

  constructor() {
    // With no expiry the day count is not asked for, so it must not block the form.
    this.form.controls.expires.valueChanges.subscribe((expires) =>
      expires ? this.form.controls.expiresInDays.enable() : this.form.controls.expiresInDays.disable(),
    );
  }

  /** Asks the API for the token. */
  protected create(): void {
    this.problem.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, scope, expires } = this.form.getRawValue();
    this.creating.set(true);
    this.tokens.create({ name, scope, expiresInDays: expires ? this.form.controls.expiresInDays.value : null }).subscribe({
      next: (created) => {
        this.created.set(created);
        this.dialogRef.disableClose = true;
      },
      error: (error: unknown) => {
        this.creating.set(false);
        const unplaced = error instanceof ApiProblem ? applyFieldErrors(this.form, error) : [];
        this.problem.set(error instanceof ApiProblem && error.fieldErrors.length && !unplaced.length ? null : problemMessage(error));
      },
    });
  }

  /** Copies the secret to the clipboard and says whether it worked. */
  protected async copySecret(secret: string): Promise<void> {
    try {
      await navigator.clipboard.writeText(secret);
      this.copied.set('yes');
    } catch {
      this.copied.set('failed');
    }
  }

  /** Closes the dialog; the secret is gone from the app from here on. */
  protected finish(): void {
    this.dialogRef.close(this.created()?.token);
  }
}
