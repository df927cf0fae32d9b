/**
 * Settings trials end to end against the real database and the real worker: a planner proposes settings for
 * a demo feeder, the job backtests them against the series' current settings from the same 14 daily origins
 * (progress counted refit by refit), the stored numbers equal a direct run of the engine's rolling-origin
 * backtest on the same history and origins, and applying the trial saves the settings (audited) and queues a
 * refit. Refusals: viewers and stewards, a proposal equal to the settings in force, a second trial while one
 * runs, too little history; a trial whose history is too gappy fails and says why.
 */
import { TRIAL_MIN_TRAINING_HOURS, type ModelSettingsRequest, type SettingsTrial, type TrialScores } from '@loadwright/contracts';
import { rollingOriginBacktest, localCalendar, type BacktestResult } from '@loadwright/forecasting';
import { fitSeriesModel, inputsAtOrigin, readHolidaySpec, readTrialHistory, trialOrigins, type TrialHistory } from '@loadwright/refits';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { seriesId, waitFor, waitForRun } from './support';

let server: TestServer;
let planner: SignedIn;
let viewer: SignedIn;
let steward: SignedIn;

beforeAll(async () => {
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  planner = await signIn(server.url, people.planner.email);
  viewer = await signIn(server.url, people.viewer.email);
  steward = await signIn(server.url, people.steward.email);
}, 180_000);

afterAll(async () => {
  await server?.close();
});

/** A write as `who`. */
const write = (who: SignedIn, method: 'put' | 'post', path: string) =>
  request(server.url)[method](path).set('Cookie', who.cookie).set('X-CSRF-Token', who.csrf);

/** The editable settings of a series as the API reads them. */
async function settingsOf(id: number): Promise<ModelSettingsRequest> {
  const { body } = await request(server.url).get(`/api/series/${id}/model`).set('Cookie', viewer.cookie);
  const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = body;
  return editable as ModelSettingsRequest;
}

/** Polls a trial until it ends, recording every progress count seen. */
async function followTrial(trialId: number, seen: number[]): Promise<SettingsTrial> {
  return waitFor(
    async () => {
      const { body } = await request(server.url).get(`/api/settings-trials/${trialId}`).set('Cookie', viewer.cookie);
      const trial = body as SettingsTrial;
      if (seen.at(-1) !== trial.progress.done) seen.push(trial.progress.done);
      return trial.state === 'finished' || trial.state === 'failed' ? trial : undefined;
    },
    `trial ${trialId} to end`,
    240_000,
  );
}

/** The engine's backtest of `settings` on `history` at one horizon, with the refit run at each origin. */
function directBacktest(
  history: TrialHistory,
  settings: ModelSettingsRequest,
  holidays: Awaited<ReturnType<typeof readHolidaySpec>>,
  horizon: number,
) {
  const n = history.values.length;
  // Ending the series 168 − horizon hours early puts the origins on the trial's own hours.
  return rollingOriginBacktest(history.values.subarray(0, n - (168 - horizon)), {
    origins: 14,
    horizon,
    step: 24,
    season: 168,
    minTrain: TRIAL_MIN_TRAINING_HOURS,
    // Whole local days counted back from the history's end at a local midnight.
    day: { periodsPerDay: 24, firstDayStart: n % 24 },
    forecaster: (train) => {
      const forecast = fitSeriesModel(inputsAtOrigin(history, settings, train.length), holidays).forecast;
      return { mean: forecast.mean, intervals: forecast.intervals.filter((band) => band.level === 80 || band.level === 95) };
    },
  });
}

/** The stored scores equal the direct backtest's (same arithmetic on the same forecasts: to rounding). */
function expectSameScores(stored: TrialScores, direct: BacktestResult): void {
  const close = (a: number | null, b: number | null) => {
    expect(a).not.toBeNull();
    expect(Math.abs(a! - b!)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(b!)));
  };
  expect(stored.hours).toBe(direct.overall.count);
  close(stored.mae, direct.overall.mae);
  close(stored.rmse, direct.overall.rmse);
  close(stored.mape, direct.overall.mape);
  close(stored.mase, direct.overall.mase);
  close(stored.coverage80, 100 * direct.overall.intervals.find((i) => i.level === 80)!.coverage);
  close(stored.coverage95, 100 * direct.overall.intervals.find((i) => i.level === 95)!.coverage);
  close(stored.naive.mae, direct.overall.benchmark.mae);
  expect(stored.peakDays).toBe(direct.peak!.days);
  close(stored.peakError, direct.peak!.meanAbsoluteError);
  close(stored.peakHourError, direct.peak!.meanAbsoluteHours);
}

describe('a settings trial on a demo feeder', () => {
  let feeder = 0;
  let current: ModelSettingsRequest;
  let proposed: ModelSettingsRequest;
  let trial: SettingsTrial;

  it('is refused to viewers and stewards, and when it proposes the settings in force', async () => {
    feeder = await seriesId(server.pool, 'fdr-c1');
    // Short windows keep the 28 refits quick; the current side is AR by least squares on an hour-of-week profile.
    current = { ...(await settingsOf(feeder)), method: 'cmle', trainingWindowDays: 42 };
    expect((await write(planner, 'put', `/api/series/${feeder}/model`).send(current)).status).toBe(200);
    proposed = { ...current, method: 'yule-walker', seasonal: { kind: 'difference', lag: 24 }, trainingWindowDays: 35 };

    expect((await write(viewer, 'post', `/api/series/${feeder}/settings-trials`).send(proposed)).status).toBe(403);
    expect((await write(steward, 'post', `/api/series/${feeder}/settings-trials`).send(proposed)).status).toBe(403);
    const same = await write(planner, 'post', `/api/series/${feeder}/settings-trials`).send(current);
    expect(same.status).toBe(400);
    expect(same.body.detail).toBe('The proposed settings are the ones in force; change at least one setting to compare.');
    const invalid = await write(planner, 'post', `/api/series/${feeder}/settings-trials`).send({
      ...proposed,
      arOrder: 60,
      maxArOrder: 48,
    });
    expect(invalid.status).toBe(400);
    expect(invalid.body.errors).toEqual([{ pointer: '/arOrder', detail: 'The AR order must not exceed the largest AR order' }]);
    const { rows } = await server.pool.query('select count(*)::int as n from settings_trials');
    expect(rows[0].n).toBe(0);
  });

  it('runs as a job with its progress counted, one at a time per series, and keeps both sides side by side', async () => {
    const started = await write(planner, 'post', `/api/series/${feeder}/settings-trials`).send(proposed);
    expect(started.status).toBe(202);
    expect(started.body).toMatchObject({
      seriesId: feeder,
      state: 'queued',
      progress: { done: 0, total: 28 },
      requestedBy: 'Test planner',
    });
    expect(started.body.currentSettings).toEqual(current);
    expect(started.body.proposedSettings).toEqual(proposed);
    const again = await write(planner, 'post', `/api/series/${feeder}/settings-trials`).send({ ...proposed, log: true });
    expect(again.status).toBe(409);
    expect(again.body.detail).toMatch(
      new RegExp(
        `^Trial ${started.body.id} of this series is still (queued|running) \\(\\d+ of 28 refits done\\); one trial runs at a time per series`,
      ),
    );

    const seen: number[] = [];
    trial = await followTrial(started.body.id, seen);
    expect(trial.error).toBeNull();
    expect(trial.state).toBe('finished');
    expect(trial.progress).toEqual({ done: 28, total: 28 });
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);
    expect(seen.length, `progress seen: ${seen.join(', ')}`).toBeGreaterThan(2);

    // The origins: 14 local midnights a day apart, the last one a week before the end of the history.
    const first = new Date(trial.firstOrigin!).getTime();
    const last = new Date(trial.lastOrigin!).getTime();
    expect(last - first).toBe(13 * 24 * 3_600_000);
    expect(localCalendar([first, last], 'America/Chicago').hourOfDay).toEqual(new Uint8Array([0, 0]));

    for (const side of [trial.results!.current, trial.results!.proposed]) {
      expect(side.dayAhead).toMatchObject({ hours: 14 * 24, peakDays: 14 });
      expect(side.weekAhead).toMatchObject({ hours: 14 * 168, peakDays: 98 });
      expect(side.temperature.used).toBe(true);
    }
    expect(trial.results!.current.fitted).toEqual({ 'hour-of-week profile + AR by conditional maximum likelihood': 14 });
    expect(trial.results!.proposed.fitted).toEqual({ 'daily difference + AR by Yule-Walker': 14 });
    // The benchmark is the same for both sides: same origins, same hours.
    expect(trial.results!.proposed.weekAhead.naive).toEqual(trial.results!.current.weekAhead.naive);

    const list = await request(server.url).get(`/api/series/${feeder}/settings-trials`).set('Cookie', viewer.cookie);
    expect(list.status).toBe(200);
    expect(list.body.trials.map((t: SettingsTrial) => t.id)).toEqual([trial.id]);
  }, 300_000);

  it('stores the numbers a direct engine backtest of the same origins gives', async () => {
    const history = await readTrialHistory(server.pool, feeder, 42);
    // The history is the feeder's own readings, hour by hour, ending at a local midnight.
    const { rows } = await server.pool.query<{ ms: number; value: number }>(
      `select (extract(epoch from ts) * 1000)::float8 as ms, value from observations
        where series_id = $1 and ts >= to_timestamp($2::float8 / 1000) and ts <= to_timestamp($3::float8 / 1000) order by ts`,
      [feeder, history.timestamps[0], history.timestamps[history.timestamps.length - 1]],
    );
    expect(rows.map((row) => row.ms)).toEqual(Array.from(history.timestamps));
    expect(rows.map((row) => row.value)).toEqual(Array.from(history.values));
    expect(history.timestamps[trialOrigins(history.values.length)[0]!]).toBe(new Date(trial.firstOrigin!).getTime());

    const holidays = await readHolidaySpec(server.pool);
    for (const [side, settings] of [
      ['current', current],
      ['proposed', proposed],
    ] as const) {
      expectSameScores(trial.results![side].dayAhead, directBacktest(history, settings, holidays, 24));
      expectSameScores(trial.results![side].weekAhead, directBacktest(history, settings, holidays, 168));
    }
  }, 300_000);

  it('applies the proposal as the series settings, audited, queues a refit with it, and only once', async () => {
    expect((await write(viewer, 'post', `/api/settings-trials/${trial.id}/apply`).send({ refit: true })).status).toBe(403);
    const applied = await write(planner, 'post', `/api/settings-trials/${trial.id}/apply`).send({ refit: true });
    expect(applied.status).toBe(200);
    expect(applied.body.trial).toMatchObject({ id: trial.id, appliedBy: 'Test planner' });
    expect(applied.body.refitRunId).toEqual(expect.any(Number));
    expect(await settingsOf(feeder)).toEqual(proposed);
    const audit = await server.pool.query(
      `select detail from audit_log where action = 'model.settings_changed' and target_id = $1 order by id desc limit 1`,
      [String(feeder)],
    );
    expect(audit.rows[0].detail).toMatchObject({ trialId: trial.id, before: { method: 'cmle' }, after: { method: 'yule-walker' } });
    const started = await server.pool.query(`select 1 from audit_log where action = 'refit.started' and target_id = $1`, [
      String(applied.body.refitRunId),
    ]);
    expect(started.rows).toHaveLength(1);
    const run = await waitForRun(server.pool, applied.body.refitRunId, 120_000);
    expect(run.series_done).toBe(1);
    const fit = await server.pool.query(`select method from fits where series_id = $1 order by id desc limit 1`, [feeder]);
    expect(fit.rows[0].method).toBe('yule_walker');

    const twice = await write(planner, 'post', `/api/settings-trials/${trial.id}/apply`).send({ refit: false });
    expect(twice.status).toBe(409);
    expect(twice.body.detail).toBe(`Trial ${trial.id} was applied already, by Test planner.`);
  }, 180_000);
});

describe('trials the history cannot carry', () => {
  /** A load series of its own with hourly readings at the given hour offsets (before the demo's end). */
  async function seriesWithReadings(key: string, hours: number[]): Promise<number> {
    const { rows } = await server.pool.query<{ id: number }>(
      `insert into series (key, name, kind, level, unit, time_zone) values ($1, $2, 'load', 'feeder', 'kW', 'America/Chicago') returning id`,
      [key, `Test feeder ${key}`],
    );
    const id = rows[0]!.id;
    await server.pool.query(
      `insert into observations (series_id, ts, value)
       select $1, timestamptz '2026-11-30 05:00Z' - make_interval(hours => h), 1000 + 200 * sin(h * pi() / 12) + (h % 7)
         from unnest($2::int[]) as h`,
      [id, hours],
    );
    return id;
  }

  it('refuses a series with too little history, in a sentence', async () => {
    const id = await seriesWithReadings(
      'fdr-short',
      Array.from({ length: 800 }, (_, h) => h),
    );
    const refused = await write(planner, 'post', `/api/series/${id}/settings-trials`).send({ ...(await settingsOf(id)), method: 'cmle' });
    expect(refused.status).toBe(409);
    expect(refused.body.detail).toBe(
      'Test feeder fdr-short has 800 hourly readings; a trial needs at least 1152 (48 days): four weeks to fit on before the first of 14 daily origins, and a week after the last.',
    );
  });

  it('fails a trial whose history is too gappy, and says why', async () => {
    // 1,400 readings over 2,000 hours: 30 % of the hours a trial reads are missing.
    const hours = Array.from({ length: 2000 }, (_, h) => h).filter((h) => h % 10 >= 3);
    const id = await seriesWithReadings('fdr-gappy', hours);
    const started = await write(planner, 'post', `/api/series/${id}/settings-trials`).send({ ...(await settingsOf(id)), method: 'cmle' });
    expect(started.status).toBe(202);
    const ended = await followTrial(started.body.id, []);
    expect(ended.state).toBe('failed');
    expect(ended.error).toMatch(
      /^Test feeder fdr-gappy misses \d+ of the \d+ hours a trial reads \(30 %\); at most 20 % can be bridged\.$/,
    );
    expect(ended.results).toBeNull();
  }, 120_000);
});
