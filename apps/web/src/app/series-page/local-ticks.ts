import { instantOfLocal, localOfInstant } from './zoned-time';

/** Where the time axis puts its ticks, and how each is labelled. */
export interface LocalTicks {
  /** Tick positions, epoch milliseconds. */
  readonly values: number[];
  /** `day`: "Tue 1 Dec"; `month`: "Dec 2026". */
  readonly label: 'day' | 'month';
}

/** Adds `days` to a local calendar date YYYY-MM-DD. */
function addDays(date: string, days: number): string {
  const at = new Date(`${date}T00:00:00Z`);
  at.setUTCDate(at.getUTCDate() + days);
  return at.toISOString().slice(0, 10);
}

/** Adds `months` to a local calendar month YYYY-MM (first of the month). */
function addMonths(month: string, months: number): string {
  const at = new Date(`${month}-01T00:00:00Z`);
  at.setUTCMonth(at.getUTCMonth() + months);
  return at.toISOString().slice(0, 7);
}

/**
 * Ticks at local midnights of the series' time zone (not the browser's), so a planner reads days as
 * the utility lives them: every day up to two weeks, every few days up to two months, then month
 * starts (every month, or every quarter beyond two years).
 */
export function localTicks(min: number, max: number, timeZone: string): LocalTicks {
  const spanDays = (max - min) / 86_400_000;
  const values: number[] = [];
  if (spanDays <= 62) {
    const step = spanDays <= 14 ? 1 : spanDays <= 31 ? 3 : 7;
    let day = localOfInstant(new Date(min).toISOString(), timeZone).slice(0, 10);
    for (let guard = 0; guard < 400; guard++) {
      const at = Date.parse(instantOfLocal(`${day}T00:00`, timeZone)!);
      if (at > max) break;
      if (at >= min) values.push(at);
      day = addDays(day, at >= min ? step : 1);
    }
    return { values, label: 'day' };
  }
  const step = spanDays <= 730 ? 1 : 3;
  let month = localOfInstant(new Date(min).toISOString(), timeZone).slice(0, 7);
  for (let guard = 0; guard < 400; guard++) {
    const at = Date.parse(instantOfLocal(`${month}-01T00:00`, timeZone)!);
    if (at > max) break;
    if (at >= min) values.push(at);
    month = addMonths(month, at >= min ? step : 1);
  }
  return { values, label: 'month' };
}
