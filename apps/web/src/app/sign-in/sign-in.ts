import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { catchError, map, of } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { safeReturnUrl } from '../core/auth/return-url';
import { HealthClient } from '../core/health/health-client';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';
import { type HealthVerdict, verdictOf } from '../overview/health-reading';

/** The sign-in page: e-mail and password, the API's own words when it refuses, and the way to a reset. */
@Component({
  selector: 'lw-sign-in',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatInputModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
})
export class SignIn {
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);
  private readonly health = inject(HealthClient);

  /** Where to go after signing in (query parameter); only paths inside the app are followed. */
  readonly returnUrl = input<string>();
  /** Set (query parameter) when the app sent the person here because their session ended. */
  readonly ended = input<string>();

  /** The sign-in form. */
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  /** True while the API is checking the password. */
  protected readonly signingIn = signal(false);
  /** The API's refusal in its own words, or null. */
  protected readonly problem = signal<string | null>(null);
  /** Whether the password is shown as typed. */
  protected readonly passwordVisible = signal(false);
  /** Service health in one line, read once, so a sign-in failure caused by an outage is not a mystery. */
  protected readonly service = toSignal(
    this.health.read().pipe(
      map((report): HealthVerdict => verdictOf({ state: 'answered', report, checkedAt: new Date() })),
      catchError((error: unknown) =>
        of(verdictOf({ state: 'unreachable', problem: (error as Error).message, checkedAt: new Date(), lastReport: null })),
      ),
    ),
  );
  /** The server's message on a control, for the template. */
  protected readonly serverError = serverError;

  /** Sends the e-mail and password; on success goes to the return address, otherwise shows why not. */
  protected signIn(): void {
    this.problem.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.signingIn.set(true);
    this.session.signIn(this.form.getRawValue()).subscribe({
      next: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
      error: (error: unknown) => {
        this.signingIn.set(false);
        const unplaced = error instanceof ApiProblem ? applyFieldErrors(this.form, error) : [];
        this.problem.set(error instanceof ApiProblem && error.fieldErrors.length && !unplaced.length ? null : problemMessage(error));
      },
    });
  }

  /** Shows or hides the password as typed. */
  protected togglePasswordVisibility(): void {
    this.passwordVisible.update((visible) => !visible);
  }
}
