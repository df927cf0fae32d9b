/** The Misses page's API, the Overview's miss summary, the miss rules, the organisation's settings and each person's miss e-mail choice. */
import {
  idParamsSchema,
  messageResponseSchema,
  missCommentRequestSchema,
  missDetailSchema,
  missListQuerySchema,
  missMailChoiceSchema,
  missOverviewSchema,
  missResolveRequestSchema,
  missRuleCreateSchema,
  missRuleSchema,
  missRuleUpdateSchema,
  missRulesInForceQuerySchema,
  missRulesInForceSchema,
  missSummarySchema,
  organisationSettingsSchema,
  organisationSettingsUpdateSchema,
  roleHas,
} from '@loadwright/contracts';
import {
  acknowledgeMiss,
  commentOnMiss,
  createRuleOverride,
  listMisses,
  listRules,
  missDetail,
  missOverview,
  readMissMail,
  readSettings,
  removeRuleOverride,
  resolveMiss,
  rulesInForceFor,
  setMissMail,
  updateRule,
  updateSettings,
} from '@loadwright/misses';
import { HttpProblem } from '@loadwright/problems';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { defineRoute, type RouteDefinition } from '../http/route-table';

const idParams = idParamsSchema;

/** The routes under /api/misses, /api/miss-rules, /api/settings and /api/account/miss-mail. */
export function missesRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/misses',
      access: 'data.read',
      tag: 'Misses',
      summary: 'Misses, newest first, filtered by series, group (level), severity, state and period',
      query: missListQuerySchema,
      response: z.array(missSummarySchema),
      handler: ({ query }) => listMisses(db, query),
    }),
    defineRoute({
      method: 'get',
      path: '/misses/overview',
      access: 'data.read',
      tag: 'Misses',
      summary: 'Open misses by severity and the series with the worst of them, for the Overview',
      response: missOverviewSchema,
      handler: () => missOverview(db),
    }),
    defineRoute({
      method: 'get',
      path: '/misses/:id',
      access: 'data.read',
      tag: 'Misses',
      summary: 'One miss: evidence, likely cause, comments and the chart of its period',
      params: idParams,
      response: missDetailSchema,
      handler: ({ params }) => missDetail(db, params.id),
    }),
    defineRoute({
      method: 'post',
      path: '/misses/:id/acknowledge',
      access: 'misses.acknowledge',
      tag: 'Misses',
      summary: 'Acknowledge a miss with a comment',
      params: idParams,
      body: missCommentRequestSchema,
      response: messageResponseSchema,
      handler: async ({ params, body, actor, req }) => {
        await acknowledgeMiss(db, params.id, body.comment, actor, clientAddress(req));
        return { message: 'Miss acknowledged.' };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/misses/:id/comments',
      access: 'misses.acknowledge',
      tag: 'Misses',
      summary: 'Comment on a miss',
      params: idParams,
      body: missCommentRequestSchema,
      response: messageResponseSchema,
      status: 201,
      handler: async ({ params, body, actor }) => {
        await commentOnMiss(db, params.id, body.comment, actor);
        return { message: 'Comment added.' };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/misses/:id/resolve',
      access: 'misses.rules',
      tag: 'Misses',
      summary: 'Resolve a miss (planners and admins)',
      params: idParams,
      body: missResolveRequestSchema,
      response: messageResponseSchema,
      handler: async ({ params, body, actor, req }) => {
        await resolveMiss(db, params.id, body.comment, actor, clientAddress(req));
        return { message: 'Miss resolved.' };
      },
    }),
    defineRoute({
      method: 'get',
      path: '/miss-rules',
      access: 'data.read',
      tag: 'Misses',
      summary: 'Miss rules: the defaults, then overrides by group and series',
      response: z.array(missRuleSchema),
      handler: () => listRules(db),
    }),
    defineRoute({
      method: 'get',
      path: '/miss-rules/in-force',
      access: 'data.read',
      tag: 'Misses',
      summary: 'The rules in force for one series (series=<id>) or one group (level=<level>), kind by kind, and where each comes from',
      query: missRulesInForceQuerySchema,
      response: missRulesInForceSchema,
      handler: ({ query }) => rulesInForceFor(db, query),
    }),
    defineRoute({
      method: 'post',
      path: '/miss-rules',
      access: 'misses.rules',
      tag: 'Misses',
      summary: 'Override a rule kind for a group (level) or one series',
      body: missRuleCreateSchema,
      response: missRuleSchema,
      status: 201,
      handler: ({ body, actor }) => createRuleOverride(db, body, actor),
    }),
    defineRoute({
      method: 'patch',
      path: '/miss-rules/:id',
      access: 'misses.rules',
      tag: 'Misses',
      summary: 'Change a rule (the defaults: admins only)',
      params: idParams,
      body: missRuleUpdateSchema,
      response: missRuleSchema,
      handler: ({ params, body, actor }) =>
        updateRule(db, params.id, body, actor, actor.kind === 'user' && roleHas(actor.role, 'admin.settings')),
    }),
    defineRoute({
      method: 'delete',
      path: '/miss-rules/:id',
      access: 'misses.rules',
      tag: 'Misses',
      summary: "Remove a group's or a series' override: the default applies there again",
      params: idParams,
      response: messageResponseSchema,
      handler: ({ params, actor }) => removeRuleOverride(db, params.id, actor),
    }),
    defineRoute({
      method: 'get',
      path: '/settings',
      access: 'admin.settings',
      tag: 'Settings',
      summary: "The organisation's time zone, refit hour, morning deadline, digest hour and sender address",
      response: organisationSettingsSchema,
      handler: () => readSettings(db),
    }),
    defineRoute({
      method: 'patch',
      path: '/settings',
      access: 'admin.settings',
      tag: 'Settings',
      summary: "Change the organisation's settings; the refit schedule follows within a minute",
      body: organisationSettingsUpdateSchema,
      response: organisationSettingsSchema,
      handler: ({ body, actor }) => updateSettings(db, body, actor),
    }),
    defineRoute({
      method: 'get',
      path: '/account/miss-mail',
      access: 'self.manage',
      tag: 'Sign-in',
      summary: 'How you want to hear about misses',
      response: missMailChoiceSchema,
      handler: ({ actor }) => {
        if (actor.kind !== 'user') throw new HttpProblem('forbidden', 'API tokens receive no mail.');
        return readMissMail(db, actor.userId);
      },
    }),
    defineRoute({
      method: 'put',
      path: '/account/miss-mail',
      access: 'self.manage',
      tag: 'Sign-in',
      summary: 'Choose how you hear about misses: by severity, every miss at once, the daily digest only, or none',
      body: missMailChoiceSchema,
      response: missMailChoiceSchema,
      handler: ({ actor, body }) => {
        if (actor.kind !== 'user') throw new HttpProblem('forbidden', 'API tokens receive no mail.');
        return setMissMail(db, actor.userId, body.missMail);
      },
    }),
  ];
}
