// Angular's libraries ship partially compiled; outside an Angular build they need the JIT compiler.
import '@angular/compiler';
import { HttpErrorResponse } from '@angular/common/http';
import { describe, expect, it } from 'vitest';
import { ApiProblem, isProblemBody, problemFromResponse, problemMessage, unreachableProblemType } from './api-problem';

const conflict = {
  type: '/problems/conflict',
  title: 'Conflicts with the current state',
  status: 409,
  detail: 'planner@tallowmere.example already has an account.',
  errors: [{ pointer: '/email', detail: 'Already has an account' }],
};

describe('problemFromResponse', () => {
  it("keeps the API's problem: type, status, detail as the message, and field errors", () => {
    const problem = problemFromResponse(new HttpErrorResponse({ status: 409, error: conflict }));
    expect(problem).toBeInstanceOf(ApiProblem);
    expect(problem).toMatchObject({ type: '/problems/conflict', status: 409, message: conflict.detail });
    expect(problem.fieldErrors).toEqual(conflict.errors);
  });

  it('falls back to the title when the problem has no detail', () => {
    const { detail: _detail, errors: _errors, ...bare } = conflict;
    expect(problemFromResponse(new HttpErrorResponse({ status: 409, error: bare })).message).toBe('Conflicts with the current state');
  });

  it('describes a request that got no answer as unreachable', () => {
    const problem = problemFromResponse(new HttpErrorResponse({ status: 0, error: null }));
    expect(problem.type).toBe(unreachableProblemType);
    expect(problem.message).toContain('cannot be reached');
  });

  it('describes an answer that is not a problem by its status', () => {
    const problem = problemFromResponse(new HttpErrorResponse({ status: 502, statusText: 'Bad Gateway', error: '<html>proxy</html>' }));
    expect(problem).toMatchObject({ type: 'about:blank', status: 502 });
    expect(problem.message).toContain('HTTP 502');
  });
});

describe('isProblemBody', () => {
  it('accepts a problem and refuses look-alikes', () => {
    expect(isProblemBody(conflict)).toBe(true);
    expect(isProblemBody({ type: 'x', title: 'y' })).toBe(false);
    expect(isProblemBody({ ...conflict, errors: [{ pointer: 1 }] })).toBe(false);
    expect(isProblemBody(null)).toBe(false);
  });
});

describe('problemMessage', () => {
  it("uses the problem's sentence, and a plain one for anything else", () => {
    expect(problemMessage(new ApiProblem(conflict))).toBe(conflict.detail);
    expect(problemMessage(new TypeError('x is undefined'))).toBe('Something went wrong in this page. Reload it and try again.');
  });
});
