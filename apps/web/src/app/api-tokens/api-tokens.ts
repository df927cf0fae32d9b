import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import type { ApiToken } from '@loadwright/contracts';
import { filter, switchMap } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { CreateTokenDialog } from './create-token-dialog';
import { tokenState } from './token-state';
import { TokensClient } from './tokens-client';

/** The API tokens page (admins): tokens for downstream systems, their scope, expiry and last use; create and revoke. */
@Component({
  selector: 'lw-api-tokens',
  imports: [DatePipe, MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './api-tokens.html',
  styleUrl: './api-tokens.scss',
})
export class ApiTokens {
  private readonly client = inject(TokensClient);
  private readonly dialog = inject(MatDialog);

  /** All tokens, or null while loading. */
  protected readonly tokens = signal<ApiToken[] | null>(null);
  /** Why the list could not be read or an action failed. */
  protected readonly problem = signal<string | null>(null);
  /** What the last action did. */
  protected readonly outcome = signal<string | null>(null);
  /** Whether a token still works, in words. */
  protected readonly stateOf = (token: ApiToken) => tokenState(token, new Date());

  constructor() {
    this.load();
  }

  /** Reads the list from the API. */
  protected load(): void {
    this.client
      .list()
      .subscribe({ next: (tokens) => this.tokens.set(tokens), error: (error: unknown) => this.problem.set(problemMessage(error)) });
  }

  /** Opens the create dialog; the new token joins the top of the list once the dialog closes. */
  protected openCreate(): void {
    this.dialog
      .open<CreateTokenDialog, void, ApiToken>(CreateTokenDialog, { width: '560px', autoFocus: 'first-tabbable' })
      .afterClosed()
      .pipe(filter((token): token is ApiToken => !!token))
      .subscribe((token) => {
        this.tokens.update((tokens) => [token, ...(tokens ?? [])]);
        this.report(`Token “${token.name}” created.`);
      });
  }

  /** Asks, then revokes a token: calls with it fail from that moment. */
  protected revoke(token: ApiToken): void {
    confirmAction(this.dialog, {
      title: `Revoke “${token.name}”?`,
      consequence: `Every call made with this token is refused from now on. The system using it needs a new token to keep working. This cannot be undone.`,
      confirmLabel: 'Revoke token',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.client.revoke(token.id)),
      )
      .subscribe({
        next: () => {
          const revokedAt = new Date().toISOString();
          this.tokens.update((tokens) => (tokens ?? []).map((other) => (other.id === token.id ? { ...other, revokedAt } : other)));
          this.report(`Token “${token.name}” revoked.`);
        },
        error: (error: unknown) => {
          this.outcome.set(null);
          this.problem.set(problemMessage(error));
        },
      });
  }

  /** Shows what an action did. */
  private report(message: string): void {
    this.problem.set(null);
    this.outcome.set(message);
  }
}
