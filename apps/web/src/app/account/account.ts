import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { FormsModule } from '@angular/forms';
import type { MissMailChoice } from '@loadwright/contracts';
import { Router } from '@angular/router';
import { SessionStore } from '../core/auth/session-store';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { MINIMUM_PASSWORD_LENGTH, matchingPasswords } from '../set-password/password-rules';

/** Your account: who you are signed in as, how you hear about misses, change your own password, sign out. */
@Component({
  selector: 'lw-account',
  imports: [ReactiveFormsModule, FormsModule, MatSelectModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './account.html',
  styleUrl: './account.scss',
})
export class Account {
  private readonly http = inject(HttpClient);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);

  /** The signed-in person. */
  protected readonly user = this.session.user;
  /** Current password, and the new one typed twice. */
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      currentPassword: ['', Validators.required],
      newPassword: ['', [Validators.required, Validators.minLength(MINIMUM_PASSWORD_LENGTH)]],
      repeatPassword: ['', Validators.required],
    },
    { validators: matchingPasswords('newPassword', 'repeatPassword') },
  );
  /** The API's rule for new passwords. */
  protected readonly minimumLength = MINIMUM_PASSWORD_LENGTH;
  /** True while the API is saving. */
  protected readonly saving = signal(false);
  /** The API's confirmation after a change. */
  protected readonly done = signal<string | null>(null);
  /** The API's refusal, or null. */
  protected readonly problem = signal<string | null>(null);
  /** The server's message on a control, for the template. */
  protected readonly serverError = serverError;

  /** How this person hears about misses, as stored. */
  protected readonly missMail = signal<MissMailChoice['missMail'] | null>(null);
  /** What saving the choice said. */
  protected readonly missMailDone = signal<string | null>(null);

  constructor() {
    this.http.get<MissMailChoice>('/api/account/miss-mail').subscribe({ next: ({ missMail }) => this.missMail.set(missMail) });
  }

  /** Saves how this person hears about misses. */
  protected chooseMissMail(missMail: MissMailChoice['missMail']): void {
    this.missMail.set(missMail);
    this.http.put<MissMailChoice>('/api/account/miss-mail', { missMail }).subscribe({
      next: () => this.missMailDone.set('Saved: miss e-mail follows your choice from now on.'),
      error: (error: unknown) => this.missMailDone.set(problemMessage(error)),
    });
  }

  /** Changes the password; the API signs out every other session of this person. */
  protected changePassword(): void {
    this.problem.set(null);
    this.done.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    const { currentPassword, newPassword } = this.form.getRawValue();
    this.http.post<{ message: string }>('/api/auth/password', { currentPassword, newPassword }).subscribe({
      next: ({ message }) => {
        this.saving.set(false);
        this.form.reset();
        this.done.set(message);
      },
      error: (error: unknown) => {
        this.saving.set(false);
        const unplaced = error instanceof ApiProblem ? applyFieldErrors(this.form, error) : [];
        this.problem.set(error instanceof ApiProblem && error.fieldErrors.length && !unplaced.length ? null : problemMessage(error));
      },
    });
  }

  /** Ends this session and returns to the sign-in page. */
  protected async signOut(): Promise<void> {
    await this.session.signOut();
    await this.router.navigate(['/sign-in']);
  }
}
