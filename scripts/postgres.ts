/**
 * The project's own PostgreSQL 15 on loopback: initialise once, start idempotently, stop cleanly.
 *
 * PostgreSQL refuses to run as root, so when we are root its tools run as the `postgres` OS user on a
 * data directory that user owns. Trust authentication is safe only because the server listens on
 * 127.0.0.1 alone and its socket lives inside the data directory.
 */
import { execFile, spawnSync } from 'node:child_process';
import { chmodSync, chownSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';

const run = promisify(execFile);
const repoRoot = resolve(import.meta.dirname, '..');
const isRoot = process.getuid?.() === 0;

/** Where the project's server lives and listens. */
export interface PostgresLocation {
  dataDir: string;
  port: number;
  binDir: string;
}

/** The folder for everything a local instance keeps: PostgreSQL's data, the lock, the session key, caught mail. */
export function localDataDir(env: NodeJS.ProcessEnv = process.env): string {
  return resolve(repoRoot, env['LOADWRIGHT_DATA_DIR'] ?? '.data');
}

/** Defaults: <data dir>/postgres, port 54329, Debian's PostgreSQL 15 binaries. */
export function defaultLocation(env: NodeJS.ProcessEnv = process.env): PostgresLocation {
  return {
    dataDir: resolve(localDataDir(env), 'postgres'),
    port: Number(env['LOADWRIGHT_PG_PORT'] ?? 54329),
    binDir: env['LOADWRIGHT_PG_BIN'] ?? '/usr/lib/postgresql/15/bin',
  };
}

/** Connection URL of a database on the project's server. */
export function localUrl(location: PostgresLocation, database: string): string {
  return `postgres://postgres@127.0.0.1:${location.port}/${database}`;
}

/** Runs one PostgreSQL tool, as the postgres OS user when we are root. */
async function pgTool(location: PostgresLocation, tool: string, args: string[]): Promise<string> {
  const binary = resolve(location.binDir, tool);
  const [command, commandArgs] = isRoot ? ['runuser', ['-u', 'postgres', '--', binary, ...args]] : [binary, args];
  const { stdout } = await run(command, commandArgs, { encoding: 'utf8' });
  return stdout;
}

/** Installs the server with apt-get when root; otherwise explains the exact command to run. */
function ensureServerInstalled(location: PostgresLocation): void {
  if (existsSync(resolve(location.binDir, 'pg_ctl'))) return;
  const command = 'apt-get install -y postgresql';
  if (!isRoot) {
    throw new Error(
      `PostgreSQL 15 server binaries are missing from ${location.binDir}. Install them with: sudo apt-get update && sudo ${command}`,
    );
  }
  console.log(`PostgreSQL server missing: running apt-get update && ${command}`);
  for (const args of [['update'], ['install', '-y', 'postgresql']]) {
    const result = spawnSync('apt-get', args, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
    if (result.status !== 0) throw new Error(`apt-get ${args.join(' ')} failed with exit code ${result.status}`);
  }
}

/** Creates and owns the data directory, and runs initdb once. */
async function ensureCluster(location: PostgresLocation): Promise<void> {
  if (existsSync(resolve(location.dataDir, 'PG_VERSION'))) return;
  mkdirSync(location.dataDir, { recursive: true });
  if (isRoot) {
    const uid = Number(spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).stdout.trim());
    const gid = Number(spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).stdout.trim());
    chownSync(location.dataDir, uid, gid);
  }
  chmodSync(location.dataDir, 0o700);
  try {
    await pgTool(location, 'initdb', ['-D', location.dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  } catch (error) {
    const denied = /Permission denied/.test(String((error as { stderr?: string }).stderr ?? (error as Error).message));
    if (denied && isRoot)
      throw new Error(
        `The postgres OS user cannot reach ${location.dataDir}. Make its parent folders searchable (chmod o+x on each) or set LOADWRIGHT_DATA_DIR to a folder under one that is.`,
        { cause: error },
      );
    throw error;
  }
}

/** True when a server answers on the port. */
async function isReady(location: PostgresLocation): Promise<boolean> {
  try {
    await run(resolve(location.binDir, 'pg_isready'), ['-h', '127.0.0.1', '-p', String(location.port), '-t', '2']);
    return true;
  } catch {
    return false;
  }
}

/** The data directory of whatever server answers on the port. */
async function servedDataDir(location: PostgresLocation): Promise<string> {
  const client = new pg.Client({ connectionString: localUrl(location, 'postgres') });
  await client.connect();
  try {
    const { rows } = await client.query<{ data_directory: string }>('SHOW data_directory');
    return rows[0]!.data_directory;
  } finally {
    await client.end();
  }
}

/**
 * Starts the project's server if it is not running, and reuses it if it is (a server left behind by
 * a killed start is adopted, not duplicated). Refuses a foreign server on the same port.
 */
export async function startPostgres(location = defaultLocation()): Promise<{ started: boolean }> {
  ensureServerInstalled(location);
  if (await isReady(location)) {
    const dir = await servedDataDir(location);
    if (resolve(dir) !== resolve(location.dataDir)) {
      throw new Error(
        `Port ${location.port} is taken by another PostgreSQL (data directory ${dir}). Set LOADWRIGHT_PG_PORT to a free port or DATABASE_URL to use that server.`,
      );
    }
    return { started: false };
  }
  await ensureCluster(location);
  const options = `-c listen_addresses=127.0.0.1 -p ${location.port} -k ${location.dataDir}`;
  const log = resolve(location.dataDir, 'server.log');
  try {
    await pgTool(location, 'pg_ctl', ['-D', location.dataDir, '-l', log, '-w', '-t', '60', '-o', options, 'start']);
  } catch (error) {
    const tail = existsSync(log) ? readFileSync(log, 'utf8').split('\n').slice(-15).join('\n') : '';
    throw new Error(`PostgreSQL did not start on 127.0.0.1:${location.port}: ${(error as Error).message}\n${tail}`, { cause: error });
  }
  for (let attempt = 0; attempt < 60 && !(await isReady(location)); attempt++) {
    await new Promise((done) => setTimeout(done, 500));
  }
  return { started: true };
}

/** Stops the project's server with a fast shutdown; a server that is not running is left alone. */
export async function stopPostgres(location = defaultLocation()): Promise<void> {
  if (!existsSync(resolve(location.dataDir, 'postmaster.pid'))) return;
  await pgTool(location, 'pg_ctl', ['-D', location.dataDir, '-m', 'fast', '-w', '-t', '60', 'stop']);
}

/** Creates a database unless it exists. Names are validated because CREATE DATABASE takes no parameters. */
export async function createDatabase(adminUrl: string, name: string, template?: string): Promise<void> {
  assertIdentifier(name);
  if (template) assertIdentifier(template);
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const { rowCount } = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (!rowCount) await client.query(`CREATE DATABASE "${name}"${template ? ` TEMPLATE "${template}"` : ''}`);
  } finally {
    await client.end();
  }
}

/** Drops a database if it exists, ending its connections first. */
export async function dropDatabase(adminUrl: string, name: string): Promise<void> {
  assertIdentifier(name);
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  } finally {
    await client.end();
  }
}

function assertIdentifier(name: string): void {
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(name)) throw new Error(`Invalid database name "${name}": use lower-case letters, digits and _`);
}

/**
 * The database the product uses: DATABASE_URL when set (a team's own server: nothing is started),
 * otherwise the `loadwright` database on the project's own server, started if needed.
 */
export async function ensurePostgres(
  env: NodeJS.ProcessEnv = process.env,
): Promise<{ url: string; adminUrl: string; startedHere: boolean }> {
  const external = env['DATABASE_URL'];
  if (external) {
    const admin = new URL(external);
    admin.pathname = '/postgres';
    return { url: external, adminUrl: admin.toString(), startedHere: false };
  }
  const location = defaultLocation(env);
  const { started } = await startPostgres(location);
  console.log(
    started
      ? `  PostgreSQL started on 127.0.0.1:${location.port}`
      : `  PostgreSQL already running on 127.0.0.1:${location.port}: reusing it`,
  );
  const adminUrl = localUrl(location, 'postgres');
  await createDatabase(adminUrl, 'loadwright');
  return { url: localUrl(location, 'loadwright'), adminUrl, startedHere: started };
}
