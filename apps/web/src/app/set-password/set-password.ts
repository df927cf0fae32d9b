import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { MINIMUM_PASSWORD_LENGTH, matchingPasswords } from './password-rules';

/** Where an invite or reset link lands: choose a password with the link's one-time token. */
@Component({
  selector: 'lw-set-password',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatInputModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './set-password.html',
  styleUrl: '../sign-in/auth-page.scss',
})
export class SetPassword {
  private readonly http = inject(HttpClient);

  /** The link's one-time token (query parameter). */
  readonly token = input<string>();

  /** The new password, typed twice. */
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      newPassword: ['', [Validators.required, Validators.minLength(MINIMUM_PASSWORD_LENGTH)]],
      repeatPassword: ['', Validators.required],
    },
    { validators: matchingPasswords('newPassword', 'repeatPassword') },
  );
  /** The rule the API enforces, shown before anyone types. */
  protected readonly minimumLength = MINIMUM_PASSWORD_LENGTH;
  /** True when the address carries no token at all. */
  protected readonly tokenMissing = computed(() => !this.token());
  /** True while the API is saving the password. */
  protected readonly saving = signal(false);
  /** The API's confirmation once the password is set. */
  protected readonly done = signal<string | null>(null);
  /** The API's refusal in its own words (e.g. the link expired), or null. */
  protected readonly problem = signal<string | null>(null);
  /** The server's message on a control, for the template. */
  protected readonly serverError = serverError;

  /** Sends the token and the new password. */
  protected setPassword(): void {
    this.problem.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.http
      .post<{ message: string }>('/api/auth/set-password', { token: this.token(), newPassword: this.form.controls.newPassword.value })
      .subscribe({
        next: ({ message }) => this.done.set(message),
        error: (error: unknown) => {
          this.saving.set(false);
          if (error instanceof ApiProblem) applyFieldErrors(this.form, error);
          this.problem.set(problemMessage(error));
        },
      });
  }
}
