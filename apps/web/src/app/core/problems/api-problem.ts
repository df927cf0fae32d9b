import { HttpErrorResponse } from '@angular/common/http';
import type { Problem } from '@loadwright/contracts';

/** One field the API refused, as a JSON pointer into the request body and a sentence about it. */
export interface FieldProblem {
  /** JSON pointer into the request body, e.g. "/email". */
  readonly pointer: string;
  /** What is wrong with the field, fit to show under it. */
  readonly detail: string;
}

/** Problem type used when no answer arrived at all (the API is down or the network is gone). */
export const unreachableProblemType = '/problems/unreachable';

/**
 * A failed API call as the app handles it: the RFC 9457 problem the API wrote, or one made up from the
 * transport failure. `message` is the sentence to show (the problem's detail, else its title).
 */
export class ApiProblem extends Error {
  /** Problem type URI; switch on this, never on the wording. */
  readonly type: string;
  /** Fixed title of the type. */
  readonly title: string;
  /** HTTP status, or 0 when no answer arrived. */
  readonly status: number;
  /** Refused input fields, empty when the problem is not about fields. */
  readonly fieldErrors: readonly FieldProblem[];

  /** Wraps a problem body. */
  constructor(problem: Problem) {
    super(problem.detail ?? problem.title);
    this.name = 'ApiProblem';
    this.type = problem.type;
    this.title = problem.title;
    this.status = problem.status;
    this.fieldErrors = problem.errors ?? [];
  }
}

/** True when a response body has the shape of a problem detail (checked by hand to keep zod out of the first download). */
export function isProblemBody(body: unknown): body is Problem {
  if (typeof body !== 'object' || body === null) return false;
  const candidate = body as Record<string, unknown>;
  const errorsOk =
    candidate['errors'] === undefined ||
    (Array.isArray(candidate['errors']) &&
      candidate['errors'].every((entry) => typeof entry?.pointer === 'string' && typeof entry?.detail === 'string'));
  return (
    typeof candidate['type'] === 'string' && typeof candidate['title'] === 'string' && typeof candidate['status'] === 'number' && errorsOk
  );
}

/** Turns any HTTP failure into an {@link ApiProblem}: the API's own problem when it sent one, else a plain description. */
export function problemFromResponse(response: HttpErrorResponse): ApiProblem {
  if (isProblemBody(response.error)) return new ApiProblem(response.error);
  if (response.status === 0) {
    return new ApiProblem({
      type: unreachableProblemType,
      title: 'The Loadwright API cannot be reached',
      status: 0,
      detail: 'The Loadwright API cannot be reached. Check that the server is running and this machine is on its network, then try again.',
    });
  }
  return new ApiProblem({
    type: 'about:blank',
    title: response.statusText || 'Request failed',
    status: response.status,
    detail: `The Loadwright API answered with an error it did not explain (HTTP ${response.status}). Try again; if it persists, tell your administrator.`,
  });
}

/** The sentence to show for any error caught from an API call. */
export function problemMessage(error: unknown): string {
  if (error instanceof ApiProblem) return error.message;
  return 'Something went wrong in this page. Reload it and try again.';
}
