import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { InviteRequest, InviteResponse, Person, UpdatePersonRequest } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The People API (admins). Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class PeopleClient {
  private readonly http = inject(HttpClient);

  /** Everyone who can sign in, active or not, by name. */
  list(): Observable<Person[]> {
    return this.http.get<Person[]>('/api/people');
  }

  /** Creates the account and queues an e-mail with a one-time set-password link; says whether mail is on its way or delayed. */
  invite(request: InviteRequest): Observable<InviteResponse> {
    return this.http.post<InviteResponse>('/api/people', request);
  }

  /** Changes role, name or active state; role changes and deactivation end the person's sessions. */
  update(id: number, change: UpdatePersonRequest): Observable<Person> {
    return this.http.patch<Person>(`/api/people/${id}`, change);
  }

  /** Sends a fresh invite link to someone who has not set a password yet. */
  resendInvite(id: number): Observable<{ message: string }> {
    return this.http.post<{ message: string }>(`/api/people/${id}/invite`, null);
  }
}
