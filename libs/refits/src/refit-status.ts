/** Refit runs as the status API shows them: summaries with counts, and per-series detail. */
import type { RefitRunDetail, RefitRunSummary, RefitScope } from '@loadwright/contracts';
import type pg from 'pg';
import { contractMethod } from './model-settings';

/** A refit_runs row with its requester's name. */
interface RunRow {
  id: number;
  trigger: 'schedule' | 'manual';
  scope: RefitScope;
  requested_by: string | null;
  scheduled_for: Date | null;
  created_at: Date;
  started_at: Date | null;
  finished_at: Date | null;
  series_total: number;
}

const runColumns = `r.id, r.trigger, r.scope, u.display_name as requested_by, r.scheduled_for, r.created_at, r.started_at, r.finished_at, r.series_total
  from refit_runs r left join users u on u.id = r.requested_by_id`;

/** The newest runs first. */
export async function listRuns(pool: pg.Pool, limit: number): Promise<RefitRunSummary[]> {
  const { rows } = await pool.query<RunRow>(`select ${runColumns} order by r.created_at desc, r.id desc limit $1`, [limit]);
  return summarise(pool, rows);
}

/** The newest unfinished run, or null. */
export async function currentRun(pool: pg.Pool): Promise<RefitRunSummary | null> {
  const { rows } = await pool.query<RunRow>(
    `select ${runColumns} where r.finished_at is null order by r.created_at desc, r.id desc limit 1`,
  );
  return (await summarise(pool, rows))[0] ?? null;
}

/** One run with every series' status, or null when it does not exist. */
export async function runDetail(pool: pg.Pool, runId: number): Promise<RefitRunDetail | null> {
  const { rows } = await pool.query<RunRow>(`select ${runColumns} where r.id = $1`, [runId]);
  const [summary] = await summarise(pool, rows);
  if (!summary) return null;
  const series = await pool.query(
    `select rs.series_id, s.key, s.name, rs.status, rs.attempts, rs.error, rs.fit_id, f.method, v.id as version_id, rs.phase_ms,
            rs.queued_at, rs.started_at, rs.finished_at, rs.duration_ms
       from refit_run_series rs
       join series s on s.id = rs.series_id
       left join fits f on f.id = rs.fit_id
       left join forecast_versions v on v.refit_run_id = rs.run_id and v.series_id = rs.series_id
      where rs.run_id = $1
      order by s.key`,
    [runId],
  );
  return {
    ...summary,
    series: series.rows.map((row) => ({
      seriesId: row.series_id,
      seriesKey: row.key,
      seriesName: row.name,
      status: row.status,
      attempts: row.attempts,
      error: row.error,
      fitId: row.fit_id === null ? null : Number(row.fit_id),
      method: row.method === null ? null : (contractMethod(row.method) as RefitRunDetail['series'][number]['method']),
      versionId: row.version_id === null ? null : Number(row.version_id),
      phaseMs: row.phase_ms,
      queuedAt: row.queued_at.toISOString(),
      startedAt: row.started_at?.toISOString() ?? null,
      finishedAt: row.finished_at?.toISOString() ?? null,
      durationMs: row.duration_ms,
    })),
  };
}

/** The series a scope names: a group's top series, or up to 20 listed ones. */
function scopeIds(scope: RefitScope): number[] {
  if (scope.kind === 'subtree') return [scope.seriesId];
  if (scope.kind === 'series') return scope.seriesIds.slice(0, 20);
  return [];
}

/** Adds status counts, state, duration and the names of the series the scope names to run rows. */
async function summarise(pool: pg.Pool, runs: RunRow[]): Promise<RefitRunSummary[]> {
  if (runs.length === 0) return [];
  const { rows } = await pool.query<{ run_id: number; status: string; count: string }>(
    'select run_id, status, count(*) from refit_run_series where run_id = any($1::int[]) group by run_id, status',
    [runs.map((r) => r.id)],
  );
  const named = [...new Set(runs.flatMap((run) => scopeIds(run.scope)))];
  const names = new Map<number, string>();
  if (named.length > 0) {
    const found = await pool.query<{ id: number; name: string }>('select id, name from series where id = any($1::int[])', [named]);
    for (const row of found.rows) names.set(row.id, row.name);
  }
  const now = Date.now();
  return runs.map((run) => {
    const counts = { total: run.series_total, queued: 0, running: 0, done: 0, failed: 0 };
    for (const row of rows) if (row.run_id === run.id) counts[row.status as 'queued' | 'running' | 'done' | 'failed'] = Number(row.count);
    const state = run.finished_at ? 'finished' : run.started_at ? 'running' : 'queued';
    return {
      id: run.id,
      trigger: run.trigger,
      scope: run.scope,
      state,
      requestedBy: run.requested_by,
      scheduledFor: run.scheduled_for?.toISOString() ?? null,
      createdAt: run.created_at.toISOString(),
      startedAt: run.started_at?.toISOString() ?? null,
      finishedAt: run.finished_at?.toISOString() ?? null,
      durationMs: (run.finished_at?.getTime() ?? now) - run.created_at.getTime(),
      counts,
      scopeSeries: scopeIds(run.scope).flatMap((id) => (names.has(id) ? [{ id, name: names.get(id)! }] : [])),
    };
  });
}
