/**
 * Logging errors without the data they carry: a failed statement's parameters (token hashes, e-mail
 * addresses, readings) must never reach a log, so every logger of the product serializes `err` here.
 */

/**
 * What the log may keep of an error: its class, message, PostgreSQL code, constraint and stack, but
 * never the parameters of a failed statement (Drizzle puts them in `params` and in its message).
 */
export function loggableError(error: unknown): Record<string, unknown> {
  if (!(error instanceof Error)) return { message: 'non-error thrown', type: typeof error };
  const cause = (error as { cause?: unknown }).cause;
  const database = (cause ?? error) as { code?: string; constraint?: string; table?: string; column?: string; routine?: string };
  const query = (error as { query?: unknown }).query;
  return {
    type: error.name,
    // Drizzle's message is "Failed query: <sql>\nparams: <values>": keep the statement, drop the values.
    message: typeof query === 'string' ? `Failed query: ${query}` : error.message.split('\nparams:')[0],
    ...(database.code && { code: database.code }),
    ...(database.constraint && { constraint: database.constraint }),
    ...(database.table && { table: database.table }),
    ...(database.column && { column: database.column }),
    ...(database.routine && { routine: database.routine }),
    ...(cause instanceof Error && { cause: cause.message.split('\nparams:')[0] }),
    stack: error.stack
      ?.split('\n')
      .filter((line) => line.trimStart().startsWith('at '))
      .join('\n'),
  };
}

/** Pino serializers for every logger of the product (API, worker, tests): `err` without statement parameters. */
export const logSerializers = { err: loggableError };
