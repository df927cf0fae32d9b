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
  /** The person who created the token, whose current role caps what the token may do. */
  creator: { userId: number; role: Role };
}

/** Credentials that were presented but identify nobody, as the audit log records them. */
export interface RefusedCredential {
  credential: 'token' | 'session';
  /** What was wrong: `unknown` matches no token, `ended` a session that was signed out, expired or forged. */
  cause: 'unknown' | 'revoked' | 'expired' | 'creator inactive' | 'ended';
  tokenId?: number;
}

/** Nobody identified (public routes only). */
export interface AnonymousActor {
  kind: 'anonymous';
  /** Why credentials that were presented did not identify anyone, for the 401 message. */
  reason?: string;
  /** Set when a token or session cookie was presented and refused. */
  refused?: RefusedCredential;
}

/** Whoever is calling. */
export type Actor = UserActor | TokenActor | AnonymousActor;
