/**
 * Shared building blocks for request input: row ids, whole numbers in query strings, dates and
 * instants, and the check every text must pass. Using these instead of `z.coerce.number()` or a bare
 * `z.iso.date()` keeps input PostgreSQL cannot store from ever reaching it (and a 500).
 */
import { z } from 'zod';

/** The largest value of PostgreSQL's `integer` (int4), the type of every serial id. */
export const int4Max = 2_147_483_647;

/** A row id in a JSON body: a whole number from 1 to the int4 maximum. */
export const recordIdSchema = z
  .number('Send the id as a number')
  .int('An id is a whole number')
  .min(1, 'An id is 1 or more')
  .max(int4Max, `An id is at most ${int4Max}`);

/** Plain decimal digits only: `0x10`, `1e3`, `+5`, ` 7` and `1.0` are refused rather than read loosely. */
const decimalDigits = /^[0-9]+$/;

/** A whole number written in a path or query string, read as plain decimal digits only. */
export function digitsSchema(min: number, max: number, what = 'a whole number') {
  return z
    .string()
    .regex(decimalDigits, `Write ${what} in plain decimal digits (0-9)`)
    .transform(Number)
    .pipe(z.number().min(min, `Use ${min} or more`).max(max, `Use ${max} or less`));
}

/** A row id in a path or query string: decimal digits, 1 to the int4 maximum. */
export const idParamSchema = z
  .string()
  .regex(decimalDigits, 'Write the id in plain decimal digits (0-9)')
  .transform(Number)
  .pipe(recordIdSchema);

/** Path parameters of the routes that act on one row, `/…/:id`. */
export const idParamsSchema = z.object({ id: idParamSchema });

/** Earliest and latest years accepted in dates and instants: wide for history, inside what PostgreSQL and JavaScript both hold. */
export const yearRange = { min: 1900, max: 2200 } as const;

function yearOf(value: string): number {
  return Number(/^(\d{4})/.exec(value)?.[1] ?? Number.NaN);
}

const yearMessage = `Use a year from ${yearRange.min} to ${yearRange.max}`;

/**
 * A field's own message for a value in the wrong form, leaving a missing value to the app's message
 * map ("this field is required"), and a value in the wrong form to this one message only: the year
 * check below skips what is not a date at all.
 */
function unlessMissing(message: string) {
  return (issue: { input?: unknown }) => (issue.input === undefined ? undefined : message);
}

/** A calendar date YYYY-MM-DD in the years Loadwright accepts. */
export const calendarDateSchema = z.iso
  .date({ error: unlessMissing('Write the date as YYYY-MM-DD') })
  .refine((value) => !/^\d{4}-\d{2}-\d{2}$/.test(value) || (yearOf(value) >= yearRange.min && yearOf(value) <= yearRange.max), yearMessage);

/** True when an ISO 8601 instant falls in `yearRange`. */
export function isWithinYearRange(value: string): boolean {
  const year = new Date(value).getUTCFullYear();
  return year >= yearRange.min && year <= yearRange.max;
}

/** An ISO 8601 instant (`Z`, or with `offset: true` any offset) in the years Loadwright accepts. */
export function instantSchema(options: { offset?: boolean } = {}) {
  return z.iso
    .datetime({ offset: options.offset ?? false, error: unlessMissing('Write the time as ISO 8601, e.g. 2026-03-01T06:00:00Z') })
    .refine((value) => Number.isNaN(Date.parse(value)) || isWithinYearRange(value), yearMessage);
}

/**
 * Why a text cannot be stored, or null when it can: PostgreSQL's text and jsonb refuse the NUL
 * character, and a lone UTF-16 surrogate is not a character at all (it has no UTF-8 form).
 */
export function unstorableTextReason(value: string): string | null {
  if (value.includes('\u0000')) return 'Contains a NUL character (U+0000), which text cannot hold';
  if (!isWellFormedUtf16(value)) return 'Contains a lone UTF-16 surrogate, which is not a character';
  return null;
}

/** True when every surrogate in `value` is part of a pair (String.prototype.isWellFormed, for Node 20). */
function isWellFormedUtf16(value: string): boolean {
  return !/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(value);
}
