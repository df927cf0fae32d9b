/** Seeds the demo cooperative into an empty database and describes its accounts for the console. */
import { demoScenario } from '../fixtures/demo/scenario';
import { createDb } from '@loadwright/db';
import { seedDemoMisses } from '@loadwright/misses';
import { scoreAllSeries } from '@loadwright/accuracy';
import { createJobInserter, refitQueueReady, startRefitRun } from '@loadwright/refits';
import pg from 'pg';
import { seedDemo } from '../libs/db/src/seed/seed-demo';

/** Seeds when the database holds no organisation yet, then a few misses in its history; true when it seeded. */
export async function seedDemoIfEmpty(databaseUrl: string): Promise<boolean> {
  const { seeded } = await seedDemo(databaseUrl);
  if (seeded) {
    await addDemoMisses(databaseUrl);
    await addDemoAccuracy(databaseUrl);
  }
  return seeded;
}

/** Scores every demo version against the demo's actuals, so accuracy shows on first start; returns the hours scored. */
export async function addDemoAccuracy(databaseUrl: string): Promise<number> {
  const handle = createDb(databaseUrl, { max: 2, applicationName: 'loadwright-seed' });
  try {
    const outcomes = await scoreAllSeries(handle.db, { since: new Date(0) });
    return outcomes.reduce((sum, outcome) => sum + outcome.hours, 0);
  } finally {
    await handle.close();
  }
}

/** The demo's misses (forecasts for a few series over its last week, judged by the default rules); returns how many. */
export async function addDemoMisses(databaseUrl: string): Promise<number> {
  const handle = createDb(databaseUrl, { max: 2, applicationName: 'loadwright-seed' });
  try {
    return await seedDemoMisses(handle.db);
  } finally {
    await handle.close();
  }
}

/**
 * Starts the first refit of every demo series once a worker has made the refit queue, so a first start shows
 * model forecasts with their bands, model cards and a finished run instead of waiting for the nightly hour.
 * Returns the run's id, or null when no worker made the queue within `waitMs`.
 */
export async function startDemoRefit(databaseUrl: string, waitMs = 120_000): Promise<number | null> {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2, application_name: 'loadwright-seed' });
  try {
    const deadline = Date.now() + waitMs;
    while (!(await refitQueueReady(pool))) {
      if (Date.now() > deadline) return null;
      await new Promise((done) => setTimeout(done, 500));
    }
    const started = await startRefitRun(pool, createJobInserter(), { trigger: 'manual', scope: { kind: 'all' }, requestedById: null });
    return started?.runId ?? null;
  } finally {
    await pool.end();
  }
}

/** The demo sign-ins, one line per role, for the start banner and the README. */
export function demoAccountsText(): string {
  const width = Math.max(...demoScenario.accounts.map((a) => a.email.length));
  const lines = demoScenario.accounts.map((a) => `  ${a.role.padEnd(8)} ${a.email.padEnd(width)}  (${a.displayName})`);
  return `Demo utility: ${demoScenario.organisation.name}\nDemo accounts (password for all: ${demoScenario.demoPassword}):\n${lines.join('\n')}\n`;
}
