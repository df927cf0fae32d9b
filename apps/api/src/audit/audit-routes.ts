/** The audit log for admins: filter by action, person and time, paged backwards. */
import { and, desc, eq, gte, like, lt, lte, type SQL } from 'drizzle-orm';
import { auditPageSchema, auditQuerySchema } from '@loadwright/contracts';
import { apiTokens, auditLog, users } from '@loadwright/db';
import { auditTargetNames } from '@loadwright/audit';
import type { AppContext } from '../app-context';
import { defineRoute, type RouteDefinition } from '../http/route-table';

/** The routes under /api/audit. */
export function auditRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/audit',
      access: 'admin.audit',
      tag: 'Audit log',
      summary: 'Audit entries, newest first; `before` continues from the last id of a page',
      query: auditQuerySchema,
      response: auditPageSchema,
      handler: async ({ query }) => {
        const filters: SQL[] = [];
        if (query.action) filters.push(like(auditLog.action, `${query.action.replace(/[%_\\]/g, '\\$&')}%`));
        if (query.actorUserId !== undefined) filters.push(eq(auditLog.actorUserId, query.actorUserId));
        if (query.from) filters.push(gte(auditLog.at, new Date(query.from)));
        if (query.to) filters.push(lte(auditLog.at, new Date(query.to)));
        if (query.before !== undefined) filters.push(lt(auditLog.id, query.before));
        const rows = await db
          .select({ entry: auditLog, userName: users.displayName, tokenName: apiTokens.name })
          .from(auditLog)
          .leftJoin(users, eq(users.id, auditLog.actorUserId))
          .leftJoin(apiTokens, eq(apiTokens.id, auditLog.actorTokenId))
          .where(and(...filters))
          .orderBy(desc(auditLog.id))
          .limit(query.limit);
        const targetNames = await auditTargetNames(
          db,
          rows.map(({ entry }) => entry),
        );
        const entries = rows.map(({ entry, userName, tokenName }) => ({
          id: entry.id,
          at: entry.at.toISOString(),
          actor:
            entry.actorUserId !== null
              ? { kind: 'user' as const, id: entry.actorUserId, name: userName }
              : entry.actorTokenId !== null
                ? { kind: 'token' as const, id: entry.actorTokenId, name: tokenName }
                : { kind: entry.detail['visitor'] === true ? ('visitor' as const) : ('system' as const), id: null, name: null },
          action: entry.action,
          targetType: entry.targetType,
          targetId: entry.targetId,
          targetName: targetNames.get(`${entry.targetType}:${entry.targetId}`) ?? null,
          detail: entry.detail,
          ip: entry.ip,
        }));
        return { entries, nextBefore: rows.length === query.limit ? entries.at(-1)!.id : null };
      },
    }),
  ];
}
