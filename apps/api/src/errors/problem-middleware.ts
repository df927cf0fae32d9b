/**
 * The one place errors become responses: RFC 9457 problem details, never a stack trace, SQL text or
 * secret. Unknown errors are logged on the server (without the statement's parameters, which can hold
 * token hashes and e-mail addresses) and answered with a generic 500. While PostgreSQL is unreachable
 * (stopped, restarting, refusing connections) the answer is 503 with Retry-After instead: the pool opens
 * new connections on the next request, so the API recovers by itself once the database is back.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { isDatabaseUnavailable } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { loggableError } from '@loadwright/runtime';

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
  if (problem.kind === 'internal') req.log?.error({ err: loggableError(error) }, 'unhandled error');
  if (problem.kind === 'unavailable') {
    req.log?.warn({ err: loggableError(error) }, 'database unavailable');
    res.setHeader('Retry-After', String(databaseRetryAfterSeconds));
  }
  res
    .status(problem.toProblem().status)
    .type(problemContentType)
    .send(JSON.stringify(problem.toProblem(req.originalUrl)));
};

/** Errors of the request body reader (body-parser, via express.json), by their `type`. */
const bodyReaderProblems: Record<string, (error: { charset?: string; message: string }) => HttpProblem> = {
  'entity.too.large': () => new HttpProblem('payloadTooLarge', 'The request body is larger than the server accepts.'),
  'entity.parse.failed': () =>
    new HttpProblem('invalidInput', 'The request body is not valid JSON.', [{ pointer: '', detail: 'Not valid JSON' }]),
  'charset.unsupported': (error) =>
    new HttpProblem(
      'unsupportedMediaType',
      `The charset "${printable(error.charset ?? '')}" is not read; send JSON as UTF-8 (Content-Type: application/json).`,
    ),
  'encoding.unsupported': () =>
    new HttpProblem('unsupportedMediaType', 'That Content-Encoding is not read; send the body uncompressed, or as gzip, deflate or br.'),
  'request.size.invalid': () => new HttpProblem('invalidInput', 'The request body is shorter or longer than its Content-Length says.'),
  'request.aborted': () => new HttpProblem('invalidInput', 'The request body ended before it was complete.'),
};

function toHttpProblem(error: unknown): HttpProblem {
  if (error instanceof HttpProblem) return error;
  if (error instanceof ZodError) {
    const errors = error.issues.map((issue) => ({ pointer: `/${issue.path.join('/')}`, detail: issue.message }));
    return new HttpProblem('invalidInput', 'Correct the fields listed in errors and try again.', errors);
  }
  const { status, type, expose } = (error ?? {}) as { status?: number; type?: string; expose?: boolean };
  if (type && bodyReaderProblems[type]) return bodyReaderProblems[type](error as { charset?: string; message: string });
  if (status === 404) return new HttpProblem('notFound');
  if (isDatabaseUnavailable(error))
    return new HttpProblem(
      'unavailable',
      `The database cannot be reached at the moment; Loadwright reconnects by itself. Try again in ${databaseRetryAfterSeconds} seconds.`,
    );
  // Any other client error raised by Express or the body reader (a path that does not decode, a body
  // that does not inflate): the request was at fault, so say so rather than blame the server.
  if (typeof status === 'number' && status >= 400 && status < 500 && expose !== false) {
    return new HttpProblem(
      status === 415 ? 'unsupportedMediaType' : 'invalidInput',
      `The request could not be read: ${printable((error as Error).message)}.`,
    );
  }
  return new HttpProblem('internal', 'The error was logged. Try again, and tell your administrator if it persists.');
}

/** A short, single-line, printable version of text that came from the request. */
function printable(text: string): string {
  return text.replace(/[^\x20-\x7e]/g, '?').slice(0, 120);
}
