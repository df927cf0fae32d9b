/** API tokens for downstream systems (admins): list, create (secret shown once), revoke. */
import { desc, eq, isNull, and } from 'drizzle-orm';
import { apiTokenSchema, createApiTokenRequestSchema, createdApiTokenSchema, idParamsSchema } from '@loadwright/contracts';
import { apiTokens, users } from '@loadwright/db';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { newApiTokenSecret } from '../auth/api-token-secret';
import { clientAddress } from '../auth/client-address';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';

const iso = (date: Date | null) => date?.toISOString() ?? null;

/** The routes under /api/tokens. */
export function tokenRoutes({ db }: AppContext): RouteDefinition[] {
  const listTokens = async (id?: number) => {
    const rows = await db
      .select({ token: apiTokens, createdBy: users.displayName })
      .from(apiTokens)
      .leftJoin(users, eq(users.id, apiTokens.createdById))
      .where(id === undefined ? undefined : eq(apiTokens.id, id))
      .orderBy(desc(apiTokens.createdAt));
    return rows.map(({ token, createdBy }) => ({
      id: token.id,
      name: token.name,
      prefix: token.prefix,
      scope: token.scope,
      createdAt: token.createdAt.toISOString(),
      createdBy: createdBy ?? null,
      expiresAt: iso(token.expiresAt),
      lastUsedAt: iso(token.lastUsedAt),
      revokedAt: iso(token.revokedAt),
    }));
  };

  return [
    defineRoute({
      method: 'get',
      path: '/tokens',
      access: 'admin.tokens',
      tag: 'API tokens',
      summary: 'All API tokens, newest first (never their secrets)',
      response: z.array(apiTokenSchema),
      handler: () => listTokens(),
    }),
    defineRoute({
      method: 'post',
      path: '/tokens',
      access: 'admin.tokens',
      tag: 'API tokens',
      summary: 'Create a token; the response is the only time its secret is shown',
      body: createApiTokenRequestSchema,
      response: createdApiTokenSchema,
      status: 201,
      handler: async ({ body, actor, req }) => {
        const { token, prefix, hash } = newApiTokenSecret();
        const expiresAt = body.expiresInDays === null ? null : new Date(Date.now() + body.expiresInDays * 86_400_000);
        if (actor.kind !== 'user') throw new HttpProblem('forbidden', 'Only a signed-in admin can create a token; it acts for them.');
        // The token and its audit entry are written together or not at all.
        const id = await db.transaction(async (tx) => {
          const [row] = await tx
            .insert(apiTokens)
            .values({ name: body.name, scope: body.scope, prefix, secretHash: hash, expiresAt, createdById: actor.userId })
            .returning({ id: apiTokens.id });
          await recordAudit(tx, {
            actor,
            action: 'token.created',
            targetType: 'api_token',
            targetId: row!.id,
            detail: { name: body.name, scope: body.scope, prefix },
            ip: clientAddress(req),
          });
          return row!.id;
        });
        const [created] = await listTokens(id);
        return { token: created!, secret: token };
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/tokens/:id',
      access: 'admin.tokens',
      tag: 'API tokens',
      summary: 'Revoke a token at once',
      params: idParamsSchema,
      handler: async ({ params, actor, req }) => {
        await db.transaction(async (tx) => {
          const [row] = await tx
            .update(apiTokens)
            .set({ revokedAt: new Date() })
            .where(and(eq(apiTokens.id, params.id), isNull(apiTokens.revokedAt)))
            .returning({ id: apiTokens.id, name: apiTokens.name });
          if (!row) throw new HttpProblem('notFound', `No live token with id ${params.id}.`);
          await recordAudit(tx, {
            actor,
            action: 'token.revoked',
            targetType: 'api_token',
            targetId: row.id,
            detail: { name: row.name },
            ip: clientAddress(req),
          });
        });
      },
    }),
  ];
}
