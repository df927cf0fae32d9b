/**
 * The one place errors become responses: RFC 9457 problem details, never a stack trace, SQL text or
 * secret. Unknown errors are logged in full on the server and answered with a generic 500. While
 * PostgreSQL is unreachable (stopped, restarting, refusing connections) the answer is 503 with
 * Retry-After instead: the pool opens new connections on the next request, so the API recovers by
 * itself once the database is back.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { isDatabaseUnavailable } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';

const problemContentType = 'application/problem+json';

/** Seconds a client should wait before retrying while the database is away (a restart takes a few seconds). */
export const databaseRetryAfterSeconds = 5;

/** Answers any /api path no route took. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpProblem('notFound', `No API route for ${req.method} ${req.path}.`));
};

/** Converts thrown errors into problem responses. */
export const problemHandler: ErrorRequestHandler = (error, req, res, _next) => {
  const problem = toHttpProblem(error);
  if (problem.kind === 'internal') req.log?.error({ err: error }, 'unhandled error');
  if (problem.kind === 'unavailable') {
    req.log?.warn({ err: error }, 'database unavailable');
    res.setHeader('Retry-After', String(databaseRetryAfterSeconds));
  }
  res
    .status(problem.toProblem().status)
    .type(problemContentType)
    .send(JSON.stringify(problem.toProblem(req.originalUrl)));
};

function toHttpProblem(error: unknown): HttpProblem {
  if (error instanceof HttpProblem) return error;
  if (error instanceof ZodError) {
    const errors = error.issues.map((issue) => ({ pointer: `/${issue.path.join('/')}`, detail: issue.message }));
    return new HttpProblem('invalidInput', 'Correct the fields listed in errors and try again.', errors);
  }
  const status = (error as { status?: number; type?: string }).status;
  if ((error as { type?: string }).type === 'entity.too.large')
    return new HttpProblem('payloadTooLarge', 'The request body is larger than the server accepts.');
  if ((error as { type?: string }).type === 'entity.parse.failed')
    return new HttpProblem('invalidInput', 'The request body is not valid JSON.');
  if (status === 404) return new HttpProblem('notFound');
  if (isDatabaseUnavailable(error))
    return new HttpProblem(
      'unavailable',
      `The database cannot be reached at the moment; Loadwright reconnects by itself. Try again in ${databaseRetryAfterSeconds} seconds.`,
    );
  return new HttpProblem('internal', 'The error was logged. Try again, and tell your administrator if it persists.');
}
