import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ApiToken, CreateApiTokenRequest, CreatedApiToken } from '@loadwright/contracts';
import type { Observable } from 'rxjs';

/** The API tokens API (admins). Failures arrive as ApiProblem from the problem interceptor. */
@Injectable({ providedIn: 'root' })
export class TokensClient {
  private readonly http = inject(HttpClient);

  /** All tokens, newest first, never their secrets. */
  list(): Observable<ApiToken[]> {
    return this.http.get<ApiToken[]>('/api/tokens');
  }

  /** Creates a token; the answer is the only time its secret is shown. */
  create(request: CreateApiTokenRequest): Observable<CreatedApiToken> {
    return this.http.post<CreatedApiToken>('/api/tokens', request);
  }

  /** Revokes a token at once. */
  revoke(id: number): Observable<void> {
    return this.http.delete<void>(`/api/tokens/${id}`);
  }
}
