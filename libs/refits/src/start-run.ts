/**
 * Starting a refit run: resolve the scope to active load series, then in one transaction create the
 * run, one queued run-series row per series and one 'refit-series' job per series (keyed by series,
 * so two runs' jobs of one series run one after the other). A scheduled run is unique per fire time,
 * so a schedule delivered twice starts one run. A run over every series is refused while another one
 * is still open (the open one is refitting the same series already); an advisory lock makes the check
 * and the insert one step, so two clicks cannot both pass it. A run someone started is written to the
 * audit log in the same transaction: the run and its jobs exist exactly when the entry does.
 */
import { recordAudit, type Actor } from '@loadwright/audit';
import type { RefitScope } from '@loadwright/contracts';
import { drizzle } from 'drizzle-orm/node-postgres';
import type pg from 'pg';
import { readHolidayPlace, seedHolidayYears } from './holiday-calendar';
import { refitSeriesKey, refitSeriesQueue, type JobInserter, type RefitSeriesJob } from './refit-queues';

/** What to start. */
export interface StartRunRequest {
  trigger: 'schedule' | 'manual';
  scope: RefitScope;
  requestedById: number | null;
  /** The schedule's fire time (scheduled runs). */
  scheduledFor?: Date;
  /** Who started it by hand, for the run's audit entry (scheduled runs have none). */
  caller?: { actor: Actor; ip?: string };
}

/** The run, or null when a scheduled run for that fire time already existed. */
export interface StartedRun {
  runId: number;
  seriesIds: number[];
}

/** The scope names something that does not exist or holds no active load series. */
export class RefitScopeError extends Error {
  override readonly name = 'RefitScopeError';
  constructor(
    readonly kind: 'notFound' | 'invalidInput' | 'conflict',
    message: string,
  ) {
    super(message);
  }
}

/** Starts a run (see the file comment); null when the scheduled run exists already. */
export async function startRefitRun(pool: pg.Pool, insertJobs: JobInserter, request: StartRunRequest): Promise<StartedRun | null> {
  const seriesIds = await resolveScope(pool, request.scope);
  const year = new Date().getUTCFullYear();
  await seedHolidayYears(pool, await readHolidayPlace(pool), [year - 2, year - 1, year, year + 1]);
  const client = await pool.connect();
  try {
    await client.query('begin');
    if (request.scope.kind === 'all') {
      await client.query(`select pg_advisory_xact_lock(hashtext('loadwright.refit-all'))`);
      const open = await client.query<{ id: number; series_done: number; series_failed: number; series_total: number }>(
        `select id, series_done, series_failed, series_total from refit_runs
          where finished_at is null and scope->>'kind' = 'all' order by id desc limit 1`,
      );
      const running = open.rows[0];
      if (running) {
        await client.query('rollback');
        throw new RefitScopeError(
          'conflict',
          `Refit run ${running.id} over every series is still open (${running.series_done + running.series_failed} of ${running.series_total} series finished); it refits the same series. Wait for it to finish, or refit single series now.`,
        );
      }
    }
    const run = await client.query<{ id: number }>(
      `insert into refit_runs (trigger, requested_by_id, scope, scheduled_for, series_total)
       values ($1, $2, $3, $4, $5)
       on conflict (scheduled_for) where trigger = 'schedule' do nothing returning id`,
      [request.trigger, request.requestedById, JSON.stringify(request.scope), request.scheduledFor ?? null, seriesIds.length],
    );
    if (run.rows.length === 0) {
      await client.query('rollback');
      return null;
    }
    const runId = run.rows[0]!.id;
    await client.query('insert into refit_run_series (run_id, series_id) select $1, unnest($2::int[])', [runId, seriesIds]);
    const jobs = seriesIds.map((seriesId) => ({
      name: refitSeriesQueue,
      data: { runId, seriesId } satisfies RefitSeriesJob,
      singletonKey: refitSeriesKey(seriesId),
    }));
    await insertJobs(jobs, client);
    if (request.caller)
      await recordAudit(drizzle(client), {
        actor: request.caller.actor,
        action: 'refit.started',
        targetType: 'refit_run',
        targetId: runId,
        detail: { scope: request.scope, series: seriesIds.length },
        ip: request.caller.ip,
      });
    await client.query('commit');
    return { runId, seriesIds };
  } catch (error) {
    await client.query('rollback').catch(() => {});
    throw error;
  } finally {
    client.release();
  }
}

/** The active load series a scope covers, by id. */
export async function resolveScope(pool: pg.Pool, scope: RefitScope): Promise<number[]> {
  const active = `kind = 'load' and archived_at is null`;
  if (scope.kind === 'all') {
    const { rows } = await pool.query<{ id: number }>(`select id from series where ${active} order by id`);
    if (rows.length === 0) throw new RefitScopeError('invalidInput', 'There is no active load series to refit.');
    return rows.map((r) => r.id);
  }
  if (scope.kind === 'subtree') {
    const root = await pool.query('select 1 from series where id = $1', [scope.seriesId]);
    if (root.rows.length === 0) throw new RefitScopeError('notFound', `No series with id ${scope.seriesId}.`);
    const { rows } = await pool.query<{ id: number }>(
      `with recursive tree as (select id from series where id = $1 union all select s.id from series s join tree t on s.parent_id = t.id)
       select s.id from series s join tree using (id) where s.kind = 'load' and s.archived_at is null order by s.id`,
      [scope.seriesId],
    );
    if (rows.length === 0)
      throw new RefitScopeError('invalidInput', `Series ${scope.seriesId} and the series below it hold no active load series.`);
    return rows.map((r) => r.id);
  }
  const wanted = [...new Set(scope.seriesIds)];
  const { rows } = await pool.query<{ id: number; kind: string; archived_at: Date | null }>(
    'select id, kind, archived_at from series where id = any($1::int[])',
    [wanted],
  );
  const found = new Map(rows.map((r) => [r.id, r]));
  const missing = wanted.filter((id) => !found.has(id));
  if (missing.length > 0) throw new RefitScopeError('notFound', `No series with id ${missing.slice(0, 10).join(', ')}.`);
  const unusable = rows.filter((r) => r.kind !== 'load' || r.archived_at !== null).map((r) => r.id);
  if (unusable.length > 0)
    throw new RefitScopeError('invalidInput', `Series ${unusable.slice(0, 10).join(', ')} cannot be refitted (temperature or archived).`);
  return wanted.sort((a, b) => a - b);
}
