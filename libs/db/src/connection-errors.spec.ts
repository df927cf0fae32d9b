import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from './connection-errors';

/** Builds an error as node-postgres or Node's net module does: a message and an optional code. */
function failure(message: string, code?: string): Error {
  return Object.assign(new Error(message), code ? { code } : {});
}

describe('isDatabaseUnavailable', () => {
  it('recognises a refused connection (server stopped)', () => {
    expect(isDatabaseUnavailable(failure('connect ECONNREFUSED 127.0.0.1:5432', 'ECONNREFUSED'))).toBe(true);
  });

  it("recognises node-postgres's lost connection, which has no code", () => {
    expect(isDatabaseUnavailable(failure('Connection terminated unexpectedly'))).toBe(true);
  });

  it('recognises the server shutting down (57P01) and starting up (57P03)', () => {
    expect(isDatabaseUnavailable(failure('terminating connection due to administrator command', '57P01'))).toBe(true);
    expect(isDatabaseUnavailable(failure('the database system is starting up', '57P03'))).toBe(true);
  });

  it('looks through wrapping errors such as Drizzle query errors', () => {
    const wrapped = new Error('Failed query: select 1', { cause: failure('connect ECONNREFUSED ::1:5432', 'ECONNREFUSED') });
    expect(isDatabaseUnavailable(wrapped)).toBe(true);
  });

  it('recognises an AggregateError of refused addresses (IPv4 and IPv6 both tried)', () => {
    expect(isDatabaseUnavailable(new AggregateError([failure('a', 'ECONNREFUSED'), failure('b', 'ECONNREFUSED')]))).toBe(true);
  });

  it('leaves ordinary SQL errors alone (unique violation 23505, syntax error 42601)', () => {
    expect(isDatabaseUnavailable(failure('duplicate key value violates unique constraint', '23505'))).toBe(false);
    expect(isDatabaseUnavailable(failure('syntax error at or near "selec"', '42601'))).toBe(false);
    expect(isDatabaseUnavailable(new Error('Connection string is invalid'))).toBe(false);
    expect(isDatabaseUnavailable(undefined)).toBe(false);
  });
});
