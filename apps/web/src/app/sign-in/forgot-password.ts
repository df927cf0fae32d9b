import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, OnInit, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { ApiProblem, problemMessage } from '../core/problems/api-problem';
import { applyFieldErrors, serverError } from '../core/problems/field-errors';

/** "Forgot password?": asks for the e-mail address and has the API send a one-time reset link. */
@Component({
  selector: 'lw-forgot-password',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatInputModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="forgot-heading">
      <h1 id="forgot-heading">Reset your password</h1>
      <p class="intro">
        Enter the e-mail address you sign in with. If it belongs to an active account, a link to choose a new password arrives by e-mail.
      </p>
      @if (sent(); as message) {
        <p class="message done" role="status">
          <mat-icon aria-hidden="true" svgIcon="mark_email_read"></mat-icon>
          <span>{{ message }}</span>
        </p>
      } @else {
        @if (problem(); as message) {
          <p class="message problem" role="alert">
            <mat-icon aria-hidden="true" svgIcon="error"></mat-icon>
            <span>{{ message }}</span>
          </p>
        }
        <form [formGroup]="form" (ngSubmit)="sendLink()" novalidate>
          <mat-form-field appearance="outline">
            <mat-label>E-mail address</mat-label>
            <input matInput type="email" formControlName="email" autocomplete="username" required />
            @if (form.controls.email.hasError('required')) {
              <mat-error>Enter your e-mail address</mat-error>
            } @else if (form.controls.email.hasError('email')) {
              <mat-error>Enter a valid e-mail address, e.g. name&#64;utility.example</mat-error>
            } @else if (serverError(form.controls.email); as message) {
              <mat-error>{{ message }}</mat-error>
            }
          </mat-form-field>
          <button mat-flat-button class="submit" type="submit" [disabled]="sending()">
            {{ sending() ? 'Sending…' : 'Send reset link' }}
          </button>
        </form>
      }
      <p class="after"><a routerLink="/sign-in">Back to sign in</a></p>
    </section>
  `,
  styleUrl: './auth-page.scss',
})
export class ForgotPassword implements OnInit {
  private readonly http = inject(HttpClient);

  /** Address carried over from the sign-in form (query parameter). */
  readonly email = input<string>();

  /** The reset form. */
  protected readonly form = inject(NonNullableFormBuilder).group({ email: ['', [Validators.required, Validators.email]] });
  /** True while the request is on its way. */
  protected readonly sending = signal(false);
  /** The API's answer once sent (the same whether or not the address is known). */
  protected readonly sent = signal<string | null>(null);
  /** The API's refusal, or null. */
  protected readonly problem = signal<string | null>(null);
  /** The server's message on a control, for the template. */
  protected readonly serverError = serverError;

  /** Fills in the address carried over from the sign-in page. */
  ngOnInit(): void {
    const email = this.email();
    if (email) this.form.controls.email.setValue(email);
  }

  /** Asks the API to e-mail a reset link. */
  protected sendLink(): void {
    this.problem.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.sending.set(true);
    this.http.post<{ message: string }>('/api/auth/forgot-password', this.form.getRawValue()).subscribe({
      next: ({ message }) => this.sent.set(message),
      error: (error: unknown) => {
        this.sending.set(false);
        if (error instanceof ApiProblem) applyFieldErrors(this.form, error);
        this.problem.set(problemMessage(error));
      },
    });
  }
}
