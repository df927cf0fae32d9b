/**
 * Accuracy scoring and its reports on a planner's month: one hourly series with six weeks of actuals
 * and a version issued every day for the last 28 days (168 hours each, so every past hour was forecast
 * by up to seven versions; 4,116 scored hours). Each step is timed beside the database read it cannot
 * avoid, in the same run, and reported as a ratio:
 *
 * - scoring the series from nothing (read points and actuals, score, upsert), against reading its
 *   versions' points and hourly actuals alone;
 * - scoring it again (the hourly job's eight-day window), against the same read;
 * - the series page's report (28 days), against reading its stored rows alone;
 * - the Overview's summary, against the same row read.
 *
 * `npm run bench -- accuracy-scoring`.
 */
import { accuracyOverview, hourlyActuals, scoreSeries, seriesAccuracy, storedScores } from '@loadwright/accuracy';
import { createDb, forecastVersions, observations, series } from '@loadwright/db';
import { pointsOf } from '@loadwright/forecasts';
import { eq } from 'drizzle-orm';
import { migrate } from '../../libs/db/src/migrate';
import { createDatabase, dropDatabase, ensurePostgres } from '../../scripts/postgres';
import { writeDraftVersion } from '../../tests/forecasts/support/draft-versions';
import { summarise, type Benchmark, type BenchReport, type Timing } from '../support/harness';

const hourMs = 3_600_000;
const dayMs = 24 * hourMs;
const repetitions = 7;

/** Runs async `work` once untimed, then `repetitions` times timed. */
async function timeAsync(work: () => Promise<unknown>): Promise<Timing> {
  await work();
  const times: number[] = [];
  for (let i = 0; i < repetitions; i++) {
    const started = performance.now();
    await work();
    times.push(performance.now() - started);
  }
  return summarise(times);
}

/** A day-and-week shaped load with a little noise, kW. */
function load(t: number): number {
  const hour = (t / hourMs) % 24;
  const weekday = Math.floor(t / dayMs + 4) % 7;
  return 800 + 250 * Math.sin(((hour - 9) / 24) * 2 * Math.PI) - (weekday >= 5 ? 120 : 0) + 20 * Math.sin(t / 7_777_777);
}

/** The benchmark. */
export const bench: Benchmark = {
  name: 'accuracy-scoring',
  description: 'Scoring 28 daily versions of one series and reading its accuracy report and the Overview, each against its plain read',
  async run(): Promise<BenchReport> {
    const { adminUrl } = await ensurePostgres();
    const name = `bench_accuracy_${process.pid}`;
    await createDatabase(adminUrl, name);
    const url = new URL(adminUrl);
    url.pathname = `/${name}`;
    try {
      await migrate(url.toString());
      const { db, close } = createDb(url.toString(), { max: 2 });
      try {
        const [row] = await db
          .insert(series)
          .values({ key: 'bench', name: 'Bench feeder', kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'UTC' })
          .returning({ id: series.id });
        const seriesId = row!.id;
        const end = Math.floor(Date.now() / dayMs) * dayMs;
        const start = end - 6 * 7 * dayMs;
        const readings = [];
        for (let t = start; t < end; t += hourMs) readings.push({ seriesId, ts: new Date(t), value: load(t), quality: 0 });
        for (let i = 0; i < readings.length; i += 2000) await db.insert(observations).values(readings.slice(i, i + 2000));
        for (let day = 28; day >= 1; day--) {
          const origin = end - day * dayMs;
          await writeDraftVersion(db, {
            seriesId,
            origin: new Date(origin),
            mean: (i) => load(origin + i * hourMs) * 1.02,
            stdError: () => 30,
          });
        }
        const versions = await db.select({ id: forecastVersions.id }).from(forecastVersions).where(eq(forecastVersions.seriesId, seriesId));
        const ids = versions.map((v) => v.id);
        const target = { id: seriesId, timeZone: 'UTC', intervalMinutes: 60 };
        const now = new Date(end);
        const readInputs = () => Promise.all([pointsOf(db, ids), hourlyActuals(db, target, new Date(start), now, new Date(start))]);

        const first = await scoreSeries(db, seriesId, { now, since: new Date(0) });
        const full = await timeAsync(() => scoreSeries(db, seriesId, { now, since: new Date(0) }));
        const window = await timeAsync(() => scoreSeries(db, seriesId, { now }));
        const inputs = await timeAsync(readInputs);
        const report = await timeAsync(() => seriesAccuracy(db, seriesId, 28));
        const overview = await timeAsync(() => accuracyOverview(db, 28));
        const rows = await timeAsync(() => storedScores(db, seriesId, new Date(end - 28 * dayMs), now));

        const line = (step: string, timing: Timing, reference: Timing, against: string) => ({
          step,
          'median ms': timing.medianMs,
          against,
          'reference ms': reference.medianMs,
          ratio: timing.medianMs / reference.medianMs,
        });
        return {
          rows: [
            line('score all 28 versions', full, inputs, 'read points + actuals'),
            line('score last 8 days', window, inputs, 'read points + actuals'),
            line('series report, 28 days', report, rows, 'read stored rows'),
            line('Overview summary, 28 days', overview, rows, 'read stored rows'),
          ],
          notes: [
            `${first.versions} versions, ${first.hours} scored hours; medians of ${repetitions} runs after one untimed run.`,
            'Ratios are against the plain database read of the same inputs, measured in the same run.',
          ],
          checks: [
            { name: 'every version scored', passed: first.versions === 28, detail: `${first.versions} of 28` },
            {
              name: 'scoring from nothing within 10× of reading its inputs',
              passed: full.medianMs <= 10 * inputs.medianMs,
              detail: `${(full.medianMs / inputs.medianMs).toFixed(2)}×`,
            },
            {
              name: 'series report within 10× of reading its rows',
              passed: report.medianMs <= 10 * rows.medianMs,
              detail: `${(report.medianMs / rows.medianMs).toFixed(2)}×`,
            },
          ],
          data: { full, window, inputs, report, overview, rows, scored: first },
        };
      } finally {
        await close();
      }
    } finally {
      await dropDatabase(adminUrl, name);
    }
  },
};
