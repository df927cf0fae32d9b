import { problemTypes, type Problem, type ProblemKind } from '@loadwright/contracts';

/** An error that becomes an RFC 9457 problem response; thrown by routes and services alike. */
export class HttpProblem extends Error {
  override readonly name = 'HttpProblem';
  constructor(
    readonly kind: ProblemKind,
    readonly detail?: string,
    readonly errors?: Problem['errors'],
    /** A tag for the server's own use (e.g. `csrf` for the audit log); never sent. */
    readonly reason?: string,
  ) {
    super(detail ?? problemTypes[kind].title);
  }

  /** The response body for this problem. */
  toProblem(instance?: string): Problem {
    const { type, title, status } = problemTypes[this.kind];
    return {
      type,
      title,
      status,
      ...(this.detail && { detail: this.detail }),
      ...(instance && { instance }),
      ...(this.errors && { errors: this.errors }),
    };
  }
}
