/** The access decision for one request: pure, so the access-matrix test and the router share it. */
import { roleHas, scopeHas } from '@loadwright/contracts';
import { HttpProblem } from '@loadwright/problems';
import type { Access } from '../http/route-table';
import type { Actor } from '@loadwright/audit';

/** Throws 401 when nobody is identified for a protected route, 403 when the caller lacks the permission. */
export function authorize(access: Access, actor: Actor): void {
  if (access === 'public') return;
  if (actor.kind === 'anonymous')
    throw new HttpProblem('unauthenticated', actor.reason ?? 'Sign in, or send a valid API token, to use this.');
  const allowed = actor.kind === 'user' ? roleHas(actor.role, access) : scopeHas(actor.scope, access);
  if (!allowed) {
    const who = actor.kind === 'user' ? `The ${actor.role} role` : `A ${actor.scope} token`;
    throw new HttpProblem('forbidden', `${who} does not have the "${access}" permission. Ask an administrator if you need it.`);
  }
}
