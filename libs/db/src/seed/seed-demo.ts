import { sql } from 'drizzle-orm';
import { generateDemo } from '../../../../fixtures/demo/generate';
import { publicHolidays } from '../../../../fixtures/demo/local-calendar';
import { generateForecastIssues } from '../../../../fixtures/demo/temperature-forecasts';
import { demoScenario, type DemoScenario } from '../../../../fixtures/demo/scenario';
import { createDb, type Database } from '../client';
import { holidays } from '../schema/holidays';
import { temperatureForecasts } from '../schema/temperature-forecasts';
import { organisation } from '../schema/organisation';
import { users } from '../schema/people';
import { hashDemoPassword } from './demo-password-hash';
import { insertDemoCatalogue } from './insert-demo-catalogue';
import { defaultBatchRows, insertObservations } from './insert-observations';

/** Advisory lock key held while seeding, so two starts at once seed once. */
const seedLockKey = '7357264202';

/** What to seed; every option has the demo's default. */
export interface SeedDemoOptions {
  scenario?: DemoScenario;
  /** Generator seed (default: the scenario's). */
  seed?: number;
  /** Observation rows per INSERT statement. */
  batchRows?: number;
}

/** What seeding did and how long it took. */
export interface SeedDemoResult {
  /** False when an organisation already existed and nothing was written. */
  seeded: boolean;
  /** Observation rows written (0 when not seeded). */
  observations: number;
  /** Milliseconds spent generating the history, hashing passwords, and writing everything. */
  timings: { generateMs: number; hashMs: number; writeMs: number };
}

/**
 * Seeds the demo cooperative into a migrated database that holds no organisation yet: in one
 * transaction the organisation, one account per role, the series catalogue with default model
 * specs, the holiday calendar of the demo years and every generated reading, defects included as
 * recorded (gaps are absent rows). With an organisation present it writes nothing. Accepts a
 * connection URL (opens and closes its own connection) or an open Drizzle database.
 */
export async function seedDemo(target: string | Database, options: SeedDemoOptions = {}): Promise<SeedDemoResult> {
  if (typeof target !== 'string') return seedInto(target, options);
  const handle = createDb(target, { max: 1, applicationName: 'loadwright-seed' });
  try {
    return await seedInto(handle.db, options);
  } finally {
    await handle.close();
  }
}

async function seedInto(db: Database, options: SeedDemoOptions): Promise<SeedDemoResult> {
  const scenario = options.scenario ?? demoScenario;
  const skipped: SeedDemoResult = { seeded: false, observations: 0, timings: { generateMs: 0, hashMs: 0, writeMs: 0 } };
  if (await hasOrganisation(db)) return skipped;

  let started = performance.now();
  const data = generateDemo(scenario, options.seed ?? scenario.seed);
  const generateMs = performance.now() - started;

  started = performance.now();
  const passwordHashes = await Promise.all(scenario.accounts.map(() => hashDemoPassword(scenario.demoPassword)));
  const hashMs = performance.now() - started;

  started = performance.now();
  const observations = await db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(${seedLockKey})`);
    // Checked again under the lock: another process may have seeded while we generated.
    if (await hasOrganisation(tx)) return null;

    await tx.insert(organisation).values({
      name: scenario.organisation.name,
      timeZone: scenario.organisation.timeZone,
      holidayCountry: scenario.holidays.country,
      holidayRegion: scenario.holidays.region,
      alertDefaults: {
        recipients: scenario.accounts.filter((account) => account.role === 'viewer').map((account) => account.email),
        bandLevel: 95,
        errorThresholdPercent: 10,
        repeatAfterMinutes: 240,
      },
      mailFrom: `Loadwright at ${scenario.organisation.name} <loadwright@${scenario.organisation.emailDomain}>`,
    });
    await tx.insert(users).values(
      scenario.accounts.map((account, i) => ({
        email: account.email,
        displayName: account.displayName,
        role: account.role,
        passwordHash: passwordHashes[i]!,
      })),
    );
    const ids = await insertDemoCatalogue(tx, scenario);
    await tx.insert(holidays).values(demoHolidayRows(scenario)).onConflictDoNothing();
    // A week of station forecasts issued each morning, so demo models use temperature on the first refit.
    for (const issue of generateForecastIssues(scenario, options.seed ?? scenario.seed)) {
      const issuedAt = new Date(issue.issuedAtMs);
      await tx
        .insert(temperatureForecasts)
        .values(
          Array.from(issue.ts, (ms, k) => ({ seriesId: ids.get(issue.stationKey)!, issuedAt, ts: new Date(ms), value: issue.values[k]! })),
        );
    }
    return insertObservations(
      tx,
      data.series.map((series) => ({
        seriesId: ids.get(series.key)!,
        startMs: data.startMs,
        intervalMs: data.intervalMs,
        values: series.values,
      })),
      options.batchRows ?? defaultBatchRows,
    );
  });
  const writeMs = performance.now() - started;

  if (observations === null) return skipped;
  return { seeded: true, observations, timings: { generateMs, hashMs, writeMs } };
}

/** True when the organisation row exists, i.e. the database has been set up already. */
async function hasOrganisation(db: Pick<Database, 'select'>): Promise<boolean> {
  const rows = await db.select({ name: organisation.name }).from(organisation).limit(1);
  return rows.length > 0;
}

/** Public holidays from the year the history starts to the year after it ends (forecasts run ahead). */
function demoHolidayRows(scenario: DemoScenario) {
  const firstYear = new Date(scenario.start).getUTCFullYear();
  const lastYear = new Date(scenario.end).getUTCFullYear() + 1;
  const years = Array.from({ length: lastYear - firstYear + 1 }, (_, i) => firstYear + i);
  return publicHolidays(years, scenario.holidays).map((day) => ({
    day: day.date,
    name: day.name,
    kind: 'public' as const,
    source: 'package' as const,
  }));
}
