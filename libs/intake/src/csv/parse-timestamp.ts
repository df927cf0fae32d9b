/**
 * Timestamps as interval files write them. Read: ISO 8601 dates and times with `T` or a space,
 * optional seconds and fraction, and optional `Z` or ±hh:mm / ±hhmm offset (2025-03-09T02:00:00-06:00,
 * 2025-03-09 02:00); slashed dates, month first unless told day first (3/9/2025 2:00, 03/09/2025
 * 14:00:00, 3/9/2026 12:00 AM with a 12-hour clock: 12:00 AM is midnight, 12:00 PM noon); dates alone
 * (2025-03-09) for daily series. `24:00` means midnight at the end of the day, as some meters write
 * the last interval end.
 */

/** A parsed timestamp: an instant when it carried an offset, otherwise local wall-clock fields. */
export type ParsedTimestamp = { kind: 'instant'; ms: number; year: number } | { kind: 'wall'; wallMs: number; year: number };

const iso = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i;
const slashed = /^(\d{1,2})\/(\d{1,2})\/(\d{4})(?:\s+(\d{1,2}):(\d{2})(?::(\d{2}))?(?:\s*([AaPp])\.?[Mm]\.?)?)?$/;

/** The two numbers before the year of a slashed date (3/13/2026 → [3, 13]), or null for other cells. */
export function slashedDateFields(text: string): [number, number] | null {
  const match = slashed.exec(text.trim());
  return match ? [Number(match[1]), Number(match[2])] : null;
}

/**
 * Parses one cell; null when it is no timestamp of a form above (or names a date that does not
 * exist). `dayFirst` reads slashed dates as day/month/year.
 */
export function parseTimestamp(text: string, dayFirst = false): ParsedTimestamp | null {
  const cell = text.trim();
  let year: number,
    month: number,
    day: number,
    hour = 0,
    minute = 0,
    second = 0,
    fraction = 0;
  let offset: string | undefined;
  let match = iso.exec(cell);
  if (match) {
    [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
    if (match[4] !== undefined) [hour, minute] = [Number(match[4]), Number(match[5])];
    if (match[6] !== undefined) second = Number(match[6]);
    if (match[7] !== undefined) fraction = Number(`0.${match[7]}`);
    offset = match[8];
  } else if ((match = slashed.exec(cell))) {
    [month, day, year] = [Number(match[1]), Number(match[2]), Number(match[3])];
    if (dayFirst) [month, day] = [day, month];
    if (match[4] !== undefined) [hour, minute] = [Number(match[4]), Number(match[5])];
    if (match[6] !== undefined) second = Number(match[6]);
    if (match[7] !== undefined) {
      // A 12-hour clock: hours 1–12 only; 12 AM is midnight, 12 PM noon.
      if (hour < 1 || hour > 12) return null;
      hour = (hour % 12) + (match[7].toLowerCase() === 'p' ? 12 : 0);
    }
  } else {
    return null;
  }
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) return null;
  const endOfDay = hour === 24 && minute === 0 && second === 0 && fraction === 0;
  if ((hour > 23 && !endOfDay) || minute > 59 || second > 59) return null;
  const wallMs = Date.UTC(year, month - 1, day, hour, minute, second) + Math.round(fraction * 1000);
  if (offset === undefined) return { kind: 'wall', wallMs, year };
  return { kind: 'instant', ms: wallMs - offsetMs(offset), year };
}

/** Milliseconds east of UTC of `Z`, `+05:30`, `-0600`. */
function offsetMs(text: string): number {
  if (text.toUpperCase() === 'Z') return 0;
  const sign = text.startsWith('-') ? -1 : 1;
  const digits = text.slice(1).replace(':', '');
  return sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2))) * 60_000;
}

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}
