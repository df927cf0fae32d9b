/** The access decision for one request: pure, so the access-matrix test and the router share it. */
import { roleHas, scopeHas } from '@loadwright/contracts';
import { HttpProblem } from '@loadwright/problems';
import type { Access } from '../http/route-table';
import type { Actor } from '@loadwright/audit';

/** Throws 401 when nobody is identified for a protected route, 403 when the caller (or a token's creator) lacks the permission. */
export function authorize(access: Access, actor: Actor): void {
  if (access === 'public') return;
  if (actor.kind === 'anonymous')
    throw new HttpProblem('unauthenticated', actor.reason ?? 'Sign in, or send a valid API token, to use this.');
  if (actor.kind === 'user') {
    if (!roleHas(actor.role, access))
      throw new HttpProblem(
        'forbidden',
        `The ${actor.role} role does not have the "${access}" permission. Ask an administrator if you need it.`,
      );
    return;
  }
  if (!scopeHas(actor.scope, access))
    throw new HttpProblem(
      'forbidden',
      `A ${actor.scope} token does not have the "${access}" permission. Ask an administrator if you need it.`,
    );
  // A token acts for the person who created it, with at most that person's current rights.
  if (!roleHas(actor.creator.role, access))
    throw new HttpProblem(
      'forbidden',
      `This token acts for its creator, whose ${actor.creator.role} role does not have the "${access}" permission. Ask an administrator for a new token.`,
    );
}
