import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { MailLog, OutboxMessage, OutboxSummary } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The Outbox API (admins): the sent-mail log, and the messages the local mail catcher received (development). */
@Injectable({ providedIn: 'root' })
export class OutboxClient {
  private readonly http = inject(HttpClient);

  /** The sent-mail log: what was sent, what is queued (and why it waits), what failed. */
  mailLog(): Observable<MailLog> {
    return this.http.get<MailLog>('/api/mail-log');
  }

  /** Every caught message, newest first, without bodies. */
  list(): Observable<OutboxSummary[]> {
    return this.http.get<OutboxSummary[]>('/api/outbox');
  }

  /** One message with its plain-text and HTML parts. */
  message(id: string): Observable<OutboxMessage> {
    return this.http.get<OutboxMessage>(`/api/outbox/${encodeURIComponent(id)}`);
  }
}
