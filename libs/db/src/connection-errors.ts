/**
 * Tells "PostgreSQL cannot be reached right now" apart from every other error, so the API can answer
 * 503 with Retry-After instead of 500, and the worker can wait for the database instead of crashing.
 * Drizzle wraps driver errors (DrizzleQueryError), so the whole `cause` chain is checked.
 */

/** Socket-level failures of the connection to the server (Node's errno codes). */
const socketCodes = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);

/**
 * SQLSTATEs meaning the server is going away or not accepting work yet (PostgreSQL Appendix A):
 * class 08 connection exception, 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now,
 * 53300 too_many_connections.
 */
const serverStates = new Set(['57P01', '57P02', '57P03', '53300']);

/** Messages node-postgres and pg-pool use for a lost or impossible connection (they carry no code). */
const driverMessages = [
  'Connection terminated unexpectedly',
  'Connection terminated',
  'timeout exceeded when trying to connect',
  'Client has encountered a connection error and is not queryable',
  'Client was closed and is not queryable',
  'terminating connection due to administrator command',
];

/** True when `error` (or an error it wraps) says the database is unreachable or restarting. */
export function isDatabaseUnavailable(error: unknown): boolean {
  for (let current = error, depth = 0; current && depth < 5; current = (current as { cause?: unknown }).cause, depth++) {
    if (typeof current !== 'object') return false;
    const { code, message } = current as { code?: unknown; message?: unknown };
    if (typeof code === 'string' && (socketCodes.has(code) || serverStates.has(code) || code.startsWith('08'))) return true;
    if (typeof message === 'string' && driverMessages.some((text) => message.startsWith(text))) return true;
    if (current instanceof AggregateError && current.errors.some((inner) => isDatabaseUnavailable(inner))) return true;
  }
  return false;
}
