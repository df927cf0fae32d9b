/**
 * `npm start`: everything a fresh machine needs to run Loadwright with its demo data. Starts
 * PostgreSQL on loopback (unless DATABASE_URL names a server), migrates, seeds the demo cooperative
 * when the database is empty, rebuilds the web app when stale, then runs the API and the worker(s)
 * until Ctrl-C, which stops all it started. A worker that dies is started again with backoff (see
 * restartPolicy in child-processes.ts) while the API, the mail catcher and PostgreSQL keep serving;
 * the API is the front door, so if it stops, everything stops.
 */
import { resolve } from 'node:path';
import { migrate } from '@loadwright/db';
import { ConfigError, loadConfig } from '@loadwright/runtime';
import { firstExit, startTypeScript, stopAll, supervise, type NamedChild, type SupervisedChild } from './child-processes';
import { AlreadyRunningError, acquireInstanceLock } from './instance-lock';
import { defaultLocation, ensurePostgres, localDataDir, stopPostgres } from './postgres';
import { buildWeb, isWebBuildStale } from './web-build';
import { seedDemoIfEmpty, demoAccountsText, startDemoRefit } from './demo-seed';
import { startMailCatcher, type MailCatcher } from '@loadwright/mail';
import { ensureSessionSecret } from './session-secret';

async function main(): Promise<number> {
  const config = loadConfig();
  const url = `http://${config.HOST === '0.0.0.0' ? '127.0.0.1' : config.HOST}:${config.PORT}`;
  const dataDir = localDataDir();
  const releaseLock = acquireInstanceLock(resolve(dataDir, 'instance.json'), {
    pid: process.pid,
    url,
    startedAt: new Date().toISOString(),
  });
  const children: NamedChild[] = [];
  const workers: SupervisedChild[] = [];
  let startedPostgres = false;
  let catcher: MailCatcher | undefined;
  let stopping = false;

  const shutdown = async (code: number) => {
    if (stopping) return;
    stopping = true;
    console.log('\nStopping Loadwright…');
    await Promise.all([stopAll(children), ...workers.map((worker) => worker.stop())]);
    await catcher?.stop();
    if (startedPostgres) await stopPostgres(defaultLocation());
    releaseLock();
    console.log('Stopped.');
    process.exit(code);
  };
  for (const signal of ['SIGINT', 'SIGTERM'] as const) process.once(signal, () => void shutdown(0));

  try {
    step('Starting PostgreSQL');
    const database = await ensurePostgres();
    startedPostgres = database.startedHere;
    step(`Migrating ${redact(database.url)}`);
    await migrate(database.url);
    step('Checking demo data');
    const seeded = await seedDemoIfEmpty(database.url);
    if (seeded) console.log('  Seeded the demo cooperative.');
    if (isWebBuildStale()) {
      step('Building the web app (first start or changed sources, about 30 s)');
      await buildWeb();
    }
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      DATABASE_URL: database.url,
      SESSION_SECRET: config.SESSION_SECRET ?? ensureSessionSecret(resolve(dataDir, 'session-secret')),
    };
    if (!config.SMTP_URL) {
      catcher = await startMailCatcher(resolve(dataDir, 'outbox'));
      Object.assign(env, { SMTP_URL: catcher.smtpUrl, OUTBOX_FOLDER: resolve(dataDir, 'outbox') });
      console.log(`  Mail goes to the local catcher (${catcher.smtpUrl}); admins read it on the Outbox page.`);
    }
    children.push(startTypeScript('API', 'apps/api/src/server.ts', env));
    for (let i = 1; i <= config.WORKER_PROCESSES; i++) {
      const name = `worker ${i}`;
      const start = () => startTypeScript(name, 'jobs/worker.ts', { ...env, WORKER_NAME: `worker-${i}` }).process;
      workers.push(supervise(name, start, (line) => console.error(line)));
    }
    console.log(`\nLoadwright is running at ${url}\n\n${demoAccountsText()}\nPress Ctrl-C to stop.\n`);
    if (seeded) {
      // Not awaited: the product is usable at once, and the Refits page shows this run's progress.
      startDemoRefit(database.url).then(
        (runId) => {
          if (runId !== null)
            console.log(`  Started the first refit of every demo series (run ${runId}); the Refits page shows its progress.`);
          else console.log('  No worker made the refit queue in time: the first refit waits for the nightly hour or "Refit now".');
        },
        (error: unknown) => console.error(`  The first refit could not be started: ${(error as Error).message}`),
      );
    }
    const exited = await firstExit(children);
    if (!stopping) {
      console.error(`The ${exited.name} process stopped unexpectedly (exit code ${exited.code}); stopping the rest.`);
      await shutdown(1);
    }
    return 1;
  } catch (error) {
    console.error(`\nLoadwright could not start: ${(error as Error).message}`);
    await shutdown(1);
    return 1;
  }
}

function step(text: string): void {
  console.log(`• ${text}`);
}

function redact(url: string): string {
  const parsed = new URL(url);
  if (parsed.password) parsed.password = '***';
  return parsed.toString();
}

try {
  await main();
} catch (error) {
  if (error instanceof ConfigError || error instanceof AlreadyRunningError) {
    console.error(error.message);
    process.exit(1);
  }
  throw error;
}
