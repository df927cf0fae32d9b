import { beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { installValidationMessages } from './validation-messages';

/** The message of the first issue a schema raises for a value. */
function messageOf(schema: z.ZodType, value: unknown): string {
  const result = schema.safeParse(value);
  if (result.success) throw new Error('expected a refusal');
  return result.error.issues[0]!.message;
}

describe('validation messages', () => {
  beforeAll(() => installValidationMessages());

  it('words number limits as instructions, not "Too small: expected number to be >=7"', () => {
    expect(messageOf(z.number().min(7), 3)).toBe('Use a number of at least 7');
    expect(messageOf(z.number().max(100), 300)).toBe('Use a number of at most 100');
    expect(messageOf(z.number().positive(), 0)).toBe('Use a number greater than 0');
    expect(messageOf(z.number().int(), 1.5)).toBe('Give a whole number');
  });

  it('words text, list, type, format and choice refusals', () => {
    expect(messageOf(z.string().min(1), '')).toBe('Fill this in: it cannot be empty');
    expect(messageOf(z.string().max(3), 'abcd')).toBe('Use at most 3 characters');
    expect(messageOf(z.array(z.number()).min(1), [])).toBe('List at least 1 item');
    expect(messageOf(z.object({ name: z.string() }), {})).toBe('Give a value: this field is required');
    expect(messageOf(z.number(), 'seven')).toBe('Give a number');
    expect(messageOf(z.iso.datetime(), 'yesterday')).toBe('Give a date and time in ISO 8601 with its offset, such as 2026-12-03T06:00:00Z');
    expect(messageOf(z.enum(['shift', 'scale']), 'stretch')).toBe('Choose one of "shift", "scale"');
    expect(messageOf(z.strictObject({}), { extra: 1 })).toBe('Leave out "extra": it is not part of this request');
  });

  it('keeps a message the schema states for itself', () => {
    expect(messageOf(z.string().min(5, 'Give a reason of at least 5 characters'), 'no')).toBe('Give a reason of at least 5 characters');
  });
});
