import { describe, expect, it } from 'vitest';
import { describeRefitError } from './refit-errors';

/** An error shaped as node-postgres raises PostgreSQL's refusals. */
function databaseError(code: string, message: string, constraint?: string): Error {
  return Object.assign(new Error(message), { code, constraint });
}

describe('describeRefitError', () => {
  it('says what happened instead of the database text of a draft collision', () => {
    const text = describeRefitError(
      databaseError(
        '23505',
        'duplicate key value violates unique constraint "forecast_versions_one_draft_key"',
        'forecast_versions_one_draft_key',
      ),
    );
    expect(text).toBe('Another refit of this series wrote its draft at the same moment; this attempt was set aside.');
  });

  it('never shows a constraint, table or column name for other database errors', () => {
    const text = describeRefitError(
      databaseError('23503', 'insert or update on table "fits" violates foreign key constraint "fits_series_id_fkey"'),
    );
    expect(text).toBe('The database refused to store this refit (code 23503).');
    expect(describeRefitError(databaseError('40P01', 'deadlock detected'))).toMatch(/retried/);
  });

  it('keeps the text our own triggers raise', () => {
    expect(describeRefitError(databaseError('P0001', 'an approved version never changes'))).toBe('an approved version never changes');
  });

  it('keeps our own messages, on one line', () => {
    expect(describeRefitError(new Error('the series has\nno readings'))).toBe('the series has no readings');
  });
});
