/**
 * Settings trials in the database: starting one (the row and its job in the caller's transaction, one
 * trial at a time per series), and reading them as the API shows them. No HTTP here: refusals are
 * SettingsTrialError with the problem kind and a sentence for the planner.
 */
import {
  sameModelSettings,
  TRIAL_ORIGINS,
  trialResultsSchema,
  type ModelSettingsRequest,
  type SettingsTrial,
  type SettingsTrialState,
} from '@loadwright/contracts';
import type pg from 'pg';
import type { JobInserter } from '../refit-queues';
import type { Queryable } from '../series-window';
import { settingsTrialQueue, type SettingsTrialJob } from './settings-trial-queue';
import { TRIAL_MIN_HISTORY_HOURS } from './trial-history';

/** A trial that cannot be started or applied as asked; `kind` is the problem to answer with. */
export class SettingsTrialError extends Error {
  override readonly name = 'SettingsTrialError';
  constructor(
    readonly kind: 'notFound' | 'invalidInput' | 'conflict',
    message: string,
  ) {
    super(message);
  }
}

/** Refits one trial needs: both sides at every origin. */
export const TRIAL_FITS = 2 * TRIAL_ORIGINS;

/**
 * Refuses a trial that could not run: an unknown series, a temperature or non-hourly series, or one with
 * fewer readings than a trial needs (the job checks the usable hours again and fails with the reason).
 */
export async function checkTrialCanStart(pool: pg.Pool, seriesId: number): Promise<void> {
  const { rows } = await pool.query<{ name: string; kind: string; interval_minutes: number; archived: boolean; readings: number }>(
    `select s.name, s.kind, s.interval_minutes, s.archived_at is not null as archived,
            (select count(*)::int from observations o where o.series_id = s.id) as readings
       from series s where s.id = $1`,
    [seriesId],
  );
  const series = rows[0];
  if (!series) throw new SettingsTrialError('notFound', `No series with id ${seriesId}.`);
  if (series.kind !== 'load')
    throw new SettingsTrialError('conflict', `${series.name} is a temperature series; only load series have model settings to try.`);
  if (series.archived) throw new SettingsTrialError('conflict', `${series.name} is archived; restore it before trying settings on it.`);
  if (series.interval_minutes !== 60)
    throw new SettingsTrialError(
      'conflict',
      `${series.name} records every ${series.interval_minutes} minutes; trials, like refits, model hourly series only.`,
    );
  if (series.readings < TRIAL_MIN_HISTORY_HOURS) {
    throw new SettingsTrialError(
      'conflict',
      `${series.name} has ${series.readings} hourly readings; a trial needs at least ${TRIAL_MIN_HISTORY_HOURS} (${TRIAL_MIN_HISTORY_HOURS / 24} days): ` +
        `four weeks to fit on before the first of ${TRIAL_ORIGINS} daily origins, and a week after the last.`,
    );
  }
}

/** What to start. */
export interface StartTrialRequest {
  seriesId: number;
  current: ModelSettingsRequest;
  proposed: ModelSettingsRequest;
  requestedById: number | null;
}

/** Creates the trial and its job on `client`, inside the caller's open transaction; returns the trial's id. */
export async function startSettingsTrial(client: pg.PoolClient, insertJobs: JobInserter, request: StartTrialRequest): Promise<number> {
  if (sameModelSettings(request.current, request.proposed)) {
    throw new SettingsTrialError('invalidInput', 'The proposed settings are the ones in force; change at least one setting to compare.');
  }
  // The check and the insert are one step per series, so two clicks cannot both pass the check.
  await client.query(`select pg_advisory_xact_lock(hashtext('loadwright.settings-trial'), $1)`, [request.seriesId]);
  const active = await client.query<{ id: number; state: string; fits_done: number; fits_total: number }>(
    `select id, state, fits_done, fits_total from settings_trials where series_id = $1 and state in ('queued', 'running')`,
    [request.seriesId],
  );
  const open = active.rows[0];
  if (open) {
    throw new SettingsTrialError(
      'conflict',
      `Trial ${open.id} of this series is still ${open.state} (${open.fits_done} of ${open.fits_total} refits done); one trial runs at a time per series. Wait for it to finish.`,
    );
  }
  const { rows } = await client.query<{ id: number }>(
    `insert into settings_trials (series_id, current_settings, proposed_settings, fits_total, requested_by_id)
     values ($1, $2, $3, $4, $5) returning id`,
    [request.seriesId, JSON.stringify(request.current), JSON.stringify(request.proposed), TRIAL_FITS, request.requestedById],
  );
  const trialId = rows[0]!.id;
  const data: SettingsTrialJob = { trialId };
  await insertJobs([{ name: settingsTrialQueue, data, singletonKey: `trial-${trialId}` }], client);
  return trialId;
}

/** A settings_trials row with the names of the people, as the read queries return it. */
interface TrialRow {
  id: number;
  series_id: number;
  state: SettingsTrialState;
  current_settings: ModelSettingsRequest;
  proposed_settings: ModelSettingsRequest;
  fits_done: number;
  fits_total: number;
  first_origin: Date | null;
  last_origin: Date | null;
  results: unknown;
  error: string | null;
  requested_by: string | null;
  created_at: Date;
  started_at: Date | null;
  finished_at: Date | null;
  applied_at: Date | null;
  applied_by: string | null;
}

/** The columns every read selects. */
const selectTrials = `select t.id, t.series_id, t.state, t.current_settings, t.proposed_settings, t.fits_done, t.fits_total,
         t.first_origin, t.last_origin, t.results, t.error, r.display_name as requested_by, t.created_at, t.started_at,
         t.finished_at, t.applied_at, a.display_name as applied_by
    from settings_trials t
    left join users r on r.id = t.requested_by_id
    left join users a on a.id = t.applied_by_id`;

/** One trial, or null. */
export async function readSettingsTrial(db: Queryable, trialId: number): Promise<SettingsTrial | null> {
  const { rows } = await db.query({ text: `${selectTrials} where t.id = $1`, values: [trialId] });
  return rows[0] ? trialOut(rows[0] as TrialRow) : null;
}

/** The newest `limit` trials of a series, newest first. */
export async function listSettingsTrials(db: Queryable, seriesId: number, limit = 20): Promise<SettingsTrial[]> {
  const { rows } = await db.query({
    text: `${selectTrials} where t.series_id = $1 order by t.id desc limit $2`,
    values: [seriesId, limit],
  });
  return (rows as TrialRow[]).map(trialOut);
}

/** A row as the contract shapes it. */
function trialOut(row: TrialRow): SettingsTrial {
  const iso = (date: Date | null) => date?.toISOString() ?? null;
  return {
    id: row.id,
    seriesId: row.series_id,
    state: row.state,
    currentSettings: row.current_settings,
    proposedSettings: row.proposed_settings,
    progress: { done: row.fits_done, total: row.fits_total },
    firstOrigin: iso(row.first_origin),
    lastOrigin: iso(row.last_origin),
    results: row.results === null ? null : trialResultsSchema.parse(row.results),
    error: row.error,
    requestedBy: row.requested_by,
    createdAt: row.created_at.toISOString(),
    startedAt: iso(row.started_at),
    finishedAt: iso(row.finished_at),
    appliedAt: iso(row.applied_at),
    appliedBy: row.applied_by,
  };
}
