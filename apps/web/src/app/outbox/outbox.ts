import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { MailLog, OutboxSummary } from '@loadwright/contracts';
import { of } from 'rxjs';
import { problemMessage } from '../core/problems/api-problem';
import { MailFrame } from './mail-frame';
import { OutboxClient } from './outbox-client';
import { textRuns } from './text-links';

/**
 * The Outbox (admins): the sent-mail log of everything Loadwright sends (sent, queued with the reason it
 * waits, failed), and in development the messages the local mail catcher received, one of them open
 * with its plain-text part and its HTML part. The HTML is shown in a sandboxed frame that runs no scripts.
 */
@Component({
  selector: 'lw-outbox',
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, MailFrame],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './outbox.html',
  styleUrl: './outbox.scss',
})
export class Outbox {
  private readonly client = inject(OutboxClient);

  /** The open message's id (route parameter), if one is open. */
  readonly id = input<string>();

  /** Bumped by "Check for new mail" to read the list again. */
  private readonly refreshes = signal(0);
  /** The caught messages, newest first. */
  protected readonly messages = rxResource<OutboxSummary[], number>({ params: () => this.refreshes(), stream: () => this.client.list() });
  /** The sent-mail log. */
  protected readonly mailLog = rxResource<MailLog, number>({ params: () => this.refreshes(), stream: () => this.client.mailLog() });
  /** The open message with both parts. */
  protected readonly message = rxResource({
    params: () => this.id(),
    stream: ({ params: id }) => (id ? this.client.message(id) : of(null)),
  });
  /** The plain-text part split into words and links. */
  protected readonly textRuns = computed(() => {
    const message = this.message.hasValue() ? this.message.value() : null;
    return message ? textRuns(message.text) : [];
  });
  /** Why the list or the message could not be read. */
  protected readonly problem = computed(() => {
    const error = this.messages.error() ?? this.message.error() ?? this.mailLog.error();
    return error ? problemMessage(error) : null;
  });

  /** Words for a log row's status. */
  protected statusLabel(status: MailLog['entries'][number]['status'], attempts: number): string {
    if (status === 'sent') return 'Sent';
    if (status === 'failed') return `Failed after ${attempts} attempts`;
    return attempts ? `Queued, retrying (${attempts} ${attempts === 1 ? 'attempt' : 'attempts'} so far)` : 'Queued';
  }

  /** Words for what a message was for. */
  protected kindLabel(kind: MailLog['entries'][number]['kind']): string {
    return { invite: 'Invitation', password_reset: 'Password reset', miss_alert: 'Miss alert', miss_digest: 'Daily digest' }[kind];
  }

  /** Reads the list again. */
  protected refresh(): void {
    this.refreshes.update((count) => count + 1);
  }
}
