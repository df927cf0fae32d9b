import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { Permission, SessionInfo, SignInRequest } from '@loadwright/contracts';
import { Observable, firstValueFrom, tap } from 'rxjs';
import { ApiProblem } from '../problems/api-problem';

/** What the app knows about who is signed in. */
export type SessionState =
  { readonly status: 'unknown' } | { readonly status: 'signed-out' } | { readonly status: 'signed-in'; readonly session: SessionInfo };

/**
 * The signed-in person and their permissions, as signals. The API alone decides what is allowed;
 * the app reads the session's permission list only to hide what a role cannot do.
 */
@Injectable({ providedIn: 'root' })
export class SessionStore {
  private readonly http = inject(HttpClient);
  /** The one writable copy of the state; everything else derives from it. */
  private readonly state = signal<SessionState>({ status: 'unknown' });

  /** The current state; 'unknown' only until {@link restore} has answered. */
  readonly current = this.state.asReadonly();
  /** The signed-in person, or null. */
  readonly user = computed(() => {
    const state = this.state();
    return state.status === 'signed-in' ? state.session.user : null;
  });
  /** The permissions of the signed-in person (empty when signed out). */
  readonly permissions = computed<ReadonlySet<Permission>>(() => {
    const state = this.state();
    return new Set(state.status === 'signed-in' ? state.session.permissions : []);
  });

  /** True when the signed-in person holds `permission`. */
  can(permission: Permission): boolean {
    return this.permissions().has(permission);
  }

  /** Asks the API who is signed in (GET /api/auth/session); resolves signed-out on 401 or when the API cannot be reached. */
  async restore(): Promise<void> {
    try {
      this.state.set({ status: 'signed-in', session: await firstValueFrom(this.http.get<SessionInfo>('/api/auth/session')) });
    } catch (error: unknown) {
      if (!(error instanceof ApiProblem)) throw error;
      this.state.set({ status: 'signed-out' });
    }
  }

  /** Signs in; the API sets the session and CSRF cookies. Fails with an {@link ApiProblem}. */
  signIn(request: SignInRequest): Observable<SessionInfo> {
    return this.http
      .post<SessionInfo>('/api/auth/sign-in', request)
      .pipe(tap((session) => this.state.set({ status: 'signed-in', session })));
  }

  /**
   * Ends the session on the server, then forgets it here in every case: when the server had already
   * ended it (401) or cannot be reached, this browser still stops acting as signed in.
   */
  async signOut(): Promise<void> {
    try {
      await firstValueFrom(this.http.post<void>('/api/auth/sign-out', null));
    } catch (error: unknown) {
      if (!(error instanceof ApiProblem)) throw error;
    } finally {
      this.forget();
    }
  }

  /** Forgets the session without asking the server, e.g. after the server said it has ended. */
  forget(): void {
    this.state.set({ status: 'signed-out' });
  }
}
