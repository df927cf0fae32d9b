/**
 * Settings trials: start one for a series (POST /api/series/:id/settings-trials), follow and list them,
 * and apply a finished trial's proposed settings (POST /api/settings-trials/:id/apply), which saves them
 * as the series' settings, audited, and may queue a refit with them.
 */
import {
  applySettingsTrialRequestSchema,
  applySettingsTrialResultSchema,
  idParamsSchema,
  modelSettingsRequestSchema,
  sameModelSettings,
  settingsTrialListSchema,
  settingsTrialSchema,
  type ModelSettings,
  type ModelSettingsRequest,
} from '@loadwright/contracts';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import {
  checkTrialCanStart,
  createJobInserter,
  listSettingsTrials,
  NoModelError,
  readModelSettings,
  readSettingsTrial,
  refitQueueReady,
  RefitScopeError,
  SettingsTrialError,
  settingsTrialQueueReady,
  startRefitRun,
  startSettingsTrial,
  writeModelSettings,
} from '@loadwright/refits';
import { sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { defineRoute, type RouteDefinition } from '../http/route-table';

/** The editable part of read settings (without who changed them and the linked station). */
function editable(settings: ModelSettings): ModelSettingsRequest {
  const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...rest } = settings;
  return rest;
}

/** The settings-trial routes. */
export function settingsTrialRoutes({ db, pool }: AppContext): RouteDefinition[] {
  const insertJobs = createJobInserter();
  /** Runs `work`, turning the library's refusals into problems. */
  const refusing = async <T>(work: () => Promise<T>): Promise<T> => {
    try {
      return await work();
    } catch (error) {
      if (error instanceof SettingsTrialError || error instanceof RefitScopeError) throw new HttpProblem(error.kind, error.message);
      if (error instanceof NoModelError) throw new HttpProblem('notFound', error.message);
      throw error;
    }
  };
  const trialOrMissing = async (trialId: number) => {
    const trial = await readSettingsTrial(pool, trialId);
    if (!trial) throw new HttpProblem('notFound', `No settings trial with id ${trialId}.`);
    return trial;
  };

  return [
    defineRoute({
      method: 'get',
      path: '/series/:id/settings-trials',
      access: 'data.read',
      tag: 'Models',
      summary: "A load series' settings trials, newest first: what was tried, by whom, and how both sides scored",
      params: idParamsSchema,
      response: settingsTrialListSchema,
      handler: ({ params }) =>
        refusing(async () => {
          await readModelSettings(db, pool, params.id);
          return { trials: await listSettingsTrials(pool, params.id) };
        }),
    }),
    defineRoute({
      method: 'get',
      path: '/settings-trials/:id',
      access: 'data.read',
      tag: 'Models',
      summary: 'One settings trial: its progress while it runs, then both sides side by side (cheap enough to poll)',
      params: idParamsSchema,
      response: settingsTrialSchema,
      handler: ({ params }) => trialOrMissing(params.id),
    }),
    defineRoute({
      method: 'post',
      path: '/series/:id/settings-trials',
      access: 'models.edit',
      tag: 'Models',
      summary: "Backtest proposed model settings against the series' current ones from the same 14 daily origins (a job)",
      params: idParamsSchema,
      body: modelSettingsRequestSchema,
      response: settingsTrialSchema,
      status: 202,
      handler: ({ params, body, actor, req }) =>
        refusing(async () => {
          const current = editable(await readModelSettings(db, pool, params.id));
          await checkTrialCanStart(pool, params.id);
          if (!(await settingsTrialQueueReady(pool)))
            throw new HttpProblem('unavailable', 'The job queue is not ready: no worker has started against this database yet.');
          // The trial, its job and its audit entry are committed together.
          const client = await pool.connect();
          let trialId: number;
          try {
            await client.query('begin');
            trialId = await startSettingsTrial(client, insertJobs, {
              seriesId: params.id,
              current,
              proposed: body,
              requestedById: actor.kind === 'user' ? actor.userId : null,
            });
            await recordAudit(drizzle(client), {
              actor,
              action: 'model.settings_trial_started',
              targetType: 'series',
              targetId: params.id,
              detail: { trialId, current, proposed: body },
              ip: clientAddress(req),
            });
            await client.query('commit');
          } catch (error) {
            await client.query('rollback');
            throw error;
          } finally {
            client.release();
          }
          return trialOrMissing(trialId);
        }),
    }),
    defineRoute({
      method: 'post',
      path: '/settings-trials/:id/apply',
      access: 'models.edit',
      tag: 'Models',
      summary: "Save a finished trial's proposed settings as the series' settings (audited), and refit the series with them",
      params: idParamsSchema,
      body: applySettingsTrialRequestSchema,
      response: applySettingsTrialResultSchema,
      handler: ({ params, body, actor, req }) =>
        refusing(async () => {
          const userId = actor.kind === 'user' ? actor.userId : null;
          // The settings, the trial's applied mark and the audit entry are committed together; the trial row is locked first.
          const seriesId = await db.transaction(async (tx) => {
            const locked = await tx.execute<{ series_id: number }>(
              sql`select series_id from settings_trials where id = ${params.id} for update`,
            );
            if (!locked.rows[0]) throw new HttpProblem('notFound', `No settings trial with id ${params.id}.`);
            const trial = (await readSettingsTrial(pool, params.id))!;
            if (trial.state !== 'finished')
              throw new HttpProblem('conflict', `Trial ${trial.id} is ${trial.state}; only a finished trial can be applied.`);
            if (trial.appliedAt)
              throw new HttpProblem(
                'conflict',
                `Trial ${trial.id} was applied already, by ${trial.appliedBy ?? 'someone no longer listed'}.`,
              );
            const before = editable(await readModelSettings(db, pool, trial.seriesId));
            if (!sameModelSettings(before, trial.currentSettings))
              throw new HttpProblem(
                'conflict',
                `The series' settings changed after trial ${trial.id} started, so it no longer compares the proposal with the settings in force. Start a new trial.`,
              );
            await writeModelSettings(tx, trial.seriesId, trial.proposedSettings, userId);
            await tx.execute(sql`update settings_trials set applied_at = now(), applied_by_id = ${userId} where id = ${trial.id}`);
            await recordAudit(tx, {
              actor,
              action: 'model.settings_changed',
              targetType: 'series',
              targetId: trial.seriesId,
              detail: { before, after: trial.proposedSettings, trialId: trial.id },
              ip: clientAddress(req),
            });
            return trial.seriesId;
          });
          let refitRunId: number | null = null;
          if (body.refit && (await refitQueueReady(pool))) {
            // The run and its audit entry are committed together (startRefitRun writes both).
            const started = await startRefitRun(pool, insertJobs, {
              trigger: 'manual',
              scope: { kind: 'series', seriesIds: [seriesId] },
              requestedById: userId,
              caller: { actor, ip: clientAddress(req) },
            });
            refitRunId = started?.runId ?? null;
          }
          return { trial: (await readSettingsTrial(pool, params.id))!, refitRunId };
        }),
    }),
  ];
}
