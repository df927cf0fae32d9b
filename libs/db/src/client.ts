import type { Logger } from 'drizzle-orm';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as relations from './relations';
import * as tables from './schema';

/** Tables and relations together, as Drizzle's relational queries need them. */
export const schema = { ...tables, ...relations };

/** The typed Drizzle database over Loadwright's schema. */
export type Database = NodePgDatabase<typeof schema>;

/** Pool settings a caller may override. */
export interface CreateDbOptions {
  /** Most connections the pool opens (default 10). */
  max?: number;
  /** Shown in pg_stat_activity, e.g. "loadwright-api" or "loadwright-worker". */
  applicationName?: string;
  /** Milliseconds a statement may run before the server cancels it (default: no limit). */
  statementTimeoutMs?: number;
  /** Milliseconds to wait for a new connection before the query fails (default 10 s), so no request hangs on a dead server. */
  connectTimeoutMs?: number;
  /** Log every SQL statement (its text only, never its parameters) to this function, or to the console when true. */
  logQueries?: boolean | ((statement: string) => void);
}

/** A connected database: Drizzle on a node-postgres pool, and a way to close both. */
export interface DbHandle {
  db: Database;
  pool: pg.Pool;
  close(): Promise<void>;
}

/**
 * Opens a connection pool to `url` and wraps it in Drizzle with the schema. Connections are
 * opened lazily; call `close()` when done so the process can exit.
 */
export function createDb(url: string, options: CreateDbOptions = {}): DbHandle {
  const pool = new pg.Pool({
    connectionString: url,
    max: options.max ?? 10,
    application_name: options.applicationName ?? 'loadwright',
    statement_timeout: options.statementTimeoutMs,
    connectionTimeoutMillis: options.connectTimeoutMs ?? 10_000,
  });
  // A client losing its connection (idle or busy: pg-pool listens on both) must not crash the process;
  // the query in flight fails with the error, and the next query opens a new connection.
  pool.on('error', () => {});
  const db = drizzle(pool, { schema, logger: statementLogger(options.logQueries) });
  return { db, pool, close: () => pool.end() };
}

/**
 * Drizzle's own logger prints each statement's parameters, which hold token hashes, e-mail addresses
 * and link secrets; this one passes on the statement text alone.
 */
export function statementLogger(target: CreateDbOptions['logQueries']): Logger | false {
  if (!target) return false;
  const write = typeof target === 'function' ? target : (statement: string) => console.debug(statement);
  return { logQuery: (query: string, _params: unknown[]) => write(query) };
}
