/**
 * One settings trial, start to end, as its job runs it: mark it running, read the history once, refit
 * the current and then the proposed settings at every origin (counting each refit for the progress
 * bar), score both sides, store the results. Bad data or settings the engine refuses fail the trial at
 * once with the reason; any other failure puts it back to queued for the job queue's retry, and the last
 * attempt fails it. A copy of the job for a trial that already ended changes nothing.
 */
import type { ModelSettingsRequest, TrialResults } from '@loadwright/contracts';
import type pg from 'pg';
import { readHolidaySpec } from '../holiday-calendar';
import { describeRefitError, isPermanentRefitError, RefitDataError } from '../refit-errors';
import type { Attempt } from '../refit-series';
import { forecastFromOrigins, scoreSide, trialOrigins, type SideForecasts } from './trial-backtest';
import { readTrialHistory, type TrialHistory } from './trial-history';

/** How a trial job ended. */
export type SettingsTrialOutcome = 'finished' | 'failed' | 'skipped';

/** Runs trial `trialId`; see the file comment. */
export async function runSettingsTrial(pool: pg.Pool, trialId: number, attempt: Attempt): Promise<SettingsTrialOutcome> {
  const { rows } = await pool.query<{ series_id: number; current_settings: ModelSettingsRequest; proposed_settings: ModelSettingsRequest }>(
    `update settings_trials set state = 'running', fits_done = 0, error = null, started_at = coalesce(started_at, now())
      where id = $1 and state in ('queued', 'running')
      returning series_id, current_settings, proposed_settings`,
    [trialId],
  );
  const trial = rows[0];
  if (!trial) return 'skipped';
  try {
    const { current_settings: current, proposed_settings: proposed } = trial;
    const windowDays = Math.max(current.trainingWindowDays, proposed.trainingWindowDays);
    const history = await readTrialHistory(pool, trial.series_id, windowDays);
    const origins = trialOrigins(history.values.length);
    await pool.query('update settings_trials set first_origin = $2, last_origin = $3 where id = $1', [
      trialId,
      new Date(originInstant(history, origins[0]!)),
      new Date(originInstant(history, origins[origins.length - 1]!)),
    ]);
    const holidays = await readHolidaySpec(pool);
    const counted = async () => {
      await pool.query('update settings_trials set fits_done = fits_done + 1 where id = $1', [trialId]);
    };
    const currentForecasts = await sideForecasts('current', () => forecastFromOrigins(history, current, holidays, counted));
    const proposedForecasts = await sideForecasts('proposed', () => forecastFromOrigins(history, proposed, holidays, counted));
    const results: TrialResults = { current: scoreSide(history, currentForecasts), proposed: scoreSide(history, proposedForecasts) };
    const finished = await pool.query(
      `update settings_trials set state = 'finished', results = $2, finished_at = now() where id = $1 and state = 'running' returning 1`,
      [trialId, JSON.stringify(results)],
    );
    return finished.rows.length > 0 ? 'finished' : 'skipped';
  } catch (error) {
    const message = describeRefitError(error);
    if (isPermanentRefitError(error) || attempt.retryCount >= attempt.retryLimit) {
      await pool.query(`update settings_trials set state = 'failed', error = $2, finished_at = now() where id = $1 and state = 'running'`, [
        trialId,
        message,
      ]);
      return 'failed';
    }
    await pool.query(`update settings_trials set state = 'queued', error = $2 where id = $1 and state = 'running'`, [trialId, message]);
    throw error;
  }
}

/** A side's forecasts; an engine refusal is reported as a data error naming the side. */
async function sideForecasts(side: 'current' | 'proposed', run: () => Promise<SideForecasts>): Promise<SideForecasts> {
  try {
    return await run();
  } catch (error) {
    if (isPermanentRefitError(error)) throw new RefitDataError(`The ${side} settings could not be fitted: ${describeRefitError(error)}`);
    throw error;
  }
}

/** The instant of an origin: its first forecast hour. */
function originInstant(history: TrialHistory, origin: number): number {
  return history.timestamps[origin]!;
}
