/**
 * Sentences for refused input, in place of the validator's own wording ("Too small: expected number
 * to be >=7"). A message a schema states for itself always wins; this map words every other refusal
 * as an instruction the person can follow. The API installs it once (installValidationMessages), so
 * every problem response's `errors[].detail` reads as a sentence, whichever route refused the input.
 */
import { z } from 'zod';

type Issue = Parameters<z.core.$ZodErrorMap>[0];

/** "1 character", "5 characters". */
function count(amount: number | bigint, noun: string): string {
  return `${amount} ${noun}${amount === 1 || amount === 1n ? '' : 's'}`;
}

/** Words for the kind of value a type check expected. */
const expectedWords: Record<string, string> = {
  number: 'a number',
  int: 'a whole number',
  string: 'a text',
  boolean: 'true or false',
  array: 'a list',
  object: 'an object with fields',
  date: 'a date',
  bigint: 'a whole number',
};

/** Words for a string format. */
const formatWords: Record<string, string> = {
  email: 'an e-mail address such as name@example.org',
  datetime: 'a date and time in ISO 8601 with its offset, such as 2026-12-03T06:00:00Z',
  date: 'a date such as 2026-12-03',
  time: 'a time such as 06:00',
  url: 'a web address such as https://example.org',
  uuid: 'an identifier in UUID form',
  regex: 'text in the expected form',
};

/** The sentence for one refused value, or undefined to keep the schema's own. */
export function validationMessage(issue: Issue): string | undefined {
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined) return 'Give a value: this field is required';
      return `Give ${expectedWords[issue.expected] ?? `a value of type ${issue.expected}`}`;
    case 'too_small': {
      const { minimum, inclusive, exact } = issue;
      if (issue.origin === 'string') {
        if (exact) return `Use exactly ${count(minimum, 'character')}`;
        return Number(minimum) <= 1 ? 'Fill this in: it cannot be empty' : `Use at least ${count(minimum, 'character')}`;
      }
      if (issue.origin === 'array' || issue.origin === 'set') return `List at least ${count(minimum, 'item')}`;
      if (issue.origin === 'date') return `Choose a date on or after ${String(minimum)}`;
      return inclusive === false ? `Use a number greater than ${minimum}` : `Use a number of at least ${minimum}`;
    }
    case 'too_big': {
      const { maximum, inclusive, exact } = issue;
      if (issue.origin === 'string') {
        if (exact) return `Use exactly ${count(maximum, 'character')}`;
        return `Use at most ${count(maximum, 'character')}`;
      }
      if (issue.origin === 'array' || issue.origin === 'set') return `List at most ${count(maximum, 'item')}`;
      if (issue.origin === 'date') return `Choose a date on or before ${String(maximum)}`;
      return inclusive === false ? `Use a number less than ${maximum}` : `Use a number of at most ${maximum}`;
    }
    case 'invalid_format':
      return `Give ${formatWords[issue.format] ?? `text in the ${issue.format} form`}`;
    case 'not_multiple_of':
      return `Use a multiple of ${issue.divisor}`;
    case 'invalid_value':
      return issue.values.length === 1
        ? `Use ${JSON.stringify(issue.values[0])}`
        : `Choose one of ${issue.values.map((value) => JSON.stringify(value)).join(', ')}`;
    case 'unrecognized_keys':
      return `Leave out ${issue.keys.map((key) => `"${key}"`).join(', ')}: ${issue.keys.length === 1 ? 'it is' : 'they are'} not part of this request`;
    case 'invalid_union':
      return 'This value has none of the accepted forms';
    case 'invalid_key':
      return 'A key of this object is not accepted';
    case 'invalid_element':
      return 'An entry of this list is not accepted';
    default:
      return undefined;
  }
}

/** Makes validationMessage the wording of every zod refusal in this process (schema messages still win). */
export function installValidationMessages(): void {
  z.config({ customError: validationMessage });
}
