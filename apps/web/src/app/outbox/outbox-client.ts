import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { OutboxMessage, OutboxSummary } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The Outbox API (admins, development): messages the local mail catcher received. */
@Injectable({ providedIn: 'root' })
export class OutboxClient {
  private readonly http = inject(HttpClient);

  /** Every caught message, newest first, without bodies. */
  list(): Observable<OutboxSummary[]> {
    return this.http.get<OutboxSummary[]>('/api/outbox');
  }

  /** One message with its plain-text and HTML parts. */
  message(id: string): Observable<OutboxMessage> {
    return this.http.get<OutboxMessage>(`/api/outbox/${encodeURIComponent(id)}`);
  }
}
