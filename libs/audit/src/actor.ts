import type { Role, TokenScope } from '@loadwright/contracts';

/** A signed-in person, identified through their session cookie. */
export interface UserActor {
  kind: 'user';
  userId: number;
  email: string;
  displayName: string;
  role: Role;
  sessionId: string;
}

/** A downstream system, identified through its bearer token. */
export interface TokenActor {
  kind: 'token';
  tokenId: number;
  name: string;
  scope: TokenScope;
}

/** Nobody identified (public routes only). */
export interface AnonymousActor {
  kind: 'anonymous';
  /** Why credentials that were presented did not identify anyone, for the 401 message. */
  reason?: string;
}

/** Whoever is calling. */
export type Actor = UserActor | TokenActor | AnonymousActor;
