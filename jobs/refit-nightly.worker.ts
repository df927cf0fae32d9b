/**
 * The nightly refit: a pg-boss cron schedule at the organisation's refit hour in its time zone fires a
 * 'refit-nightly' job, whose handler starts a run over every active load series (one 'refit-series' job
 * each). REFIT_CRON overrides the cron expression (e.g. "* * * * *" to try it out).
 */
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import type { Logger } from 'pino';
import { createJobInserter, refitNightlyQueue } from '@loadwright/refits';
import { RefitScopeError, startRefitRun } from '@loadwright/refits';
import type { WorkerPresence } from './worker-presence';

/** The schedule as registered: cron expression and time zone. */
export interface RefitSchedule {
  cron: string;
  tz: string;
}

/** The schedule the organisation's settings ask for (02:00 UTC without an organisation). */
export async function refitScheduleOf(pool: pg.Pool, env: NodeJS.ProcessEnv = process.env): Promise<RefitSchedule> {
  const { rows } = await pool.query<{ time_zone: string; refit_hour: number }>('select time_zone, refit_hour from organisation limit 1');
  const hour = rows[0]?.refit_hour ?? 2;
  return { cron: env['REFIT_CRON'] ?? `0 ${hour} * * *`, tz: rows[0]?.time_zone ?? 'UTC' };
}

/** Registers (or moves) the nightly schedule; returns it. */
export async function applyRefitSchedule(boss: PgBoss, pool: pg.Pool): Promise<RefitSchedule> {
  const schedule = await refitScheduleOf(pool);
  await boss.schedule(refitNightlyQueue, schedule.cron, {}, { tz: schedule.tz });
  return schedule;
}

/**
 * Re-applies the schedule whenever the organisation's refit hour or time zone changes, checking every
 * REFIT_SCHEDULE_CHECK_SECONDS (default 60); returns a function that stops the checks.
 */
export function keepRefitScheduleCurrent(boss: PgBoss, pool: pg.Pool, logger: Logger, applied: RefitSchedule): () => void {
  let current = applied;
  let busy = false;
  const seconds = Number(process.env['REFIT_SCHEDULE_CHECK_SECONDS'] ?? 60);
  const timer = setInterval(
    () => {
      if (busy) return;
      busy = true;
      void refitScheduleOf(pool)
        .then(async (wanted) => {
          if (wanted.cron === current.cron && wanted.tz === current.tz) return;
          await boss.schedule(refitNightlyQueue, wanted.cron, {}, { tz: wanted.tz });
          current = wanted;
          logger.info(wanted, 'nightly refit moved');
        })
        .catch((error) => logger.warn({ err: error }, 'could not check the refit schedule'))
        .finally(() => {
          busy = false;
        });
    },
    Math.max(1, Number.isFinite(seconds) ? seconds : 60) * 1000,
  );
  timer.unref();
  return () => clearInterval(timer);
}

/** Starts the handler that turns a schedule firing into a run over all active series. */
export async function workRefitNightly(boss: PgBoss, pool: pg.Pool, logger: Logger, presence: WorkerPresence): Promise<void> {
  const insertJobs = createJobInserter();
  await boss.work(refitNightlyQueue, { includeMetadata: true }, ([job]) => job && presence.hold([job.id], () => startNightly(job)));

  async function startNightly(job: PgBoss.JobWithMetadata<unknown>): Promise<void> {
    // The fire time to the minute: a schedule delivered twice for one minute starts one run.
    const scheduledFor = new Date(Math.floor(job.createdOn.getTime() / 60_000) * 60_000);
    try {
      const run = await startRefitRun(pool, insertJobs, { trigger: 'schedule', scope: { kind: 'all' }, requestedById: null, scheduledFor });
      if (run) logger.info({ runId: run.runId, series: run.seriesIds.length, scheduledFor }, 'nightly refit started');
      else logger.info({ scheduledFor }, 'nightly refit for this time exists already');
    } catch (error) {
      if (error instanceof RefitScopeError) logger.info({ reason: error.message }, 'nightly refit not started');
      else throw error;
    }
  }
}
