/**
 * UTC offsets of an IANA time zone, cached per quarter hour of UTC (every offset change in the
 * tz database falls on a quarter hour), so resolving a million timestamps asks Intl a few thousand
 * times rather than a million.
 */
import { tzOffset } from '@date-fns/tz';

const quarterHourMs = 900_000;
const caches = new Map<string, Map<number, number>>();

/** Offset of `timeZone` at the instant `ms`, in milliseconds east of UTC. */
export function offsetMsAt(timeZone: string, ms: number): number {
  if (timeZone === 'UTC' || timeZone === 'Etc/UTC') return 0;
  let cache = caches.get(timeZone);
  if (!cache) caches.set(timeZone, (cache = new Map()));
  const bucket = Math.floor(ms / quarterHourMs);
  let offset = cache.get(bucket);
  if (offset === undefined) {
    offset = tzOffset(timeZone, new Date(bucket * quarterHourMs)) * 60_000;
    if (Number.isNaN(offset)) throw new RangeError(`Unknown time zone "${timeZone}"; use an IANA name such as America/Chicago.`);
    if (cache.size > 200_000) cache.clear();
    cache.set(bucket, offset);
  }
  return offset;
}

/** True when `timeZone` is an IANA name this runtime knows. */
export function isKnownTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone });
    return true;
  } catch {
    return false;
  }
}

/**
 * The instants whose local wall-clock reading in `timeZone` is `wallMs` (the local fields read as if
 * they were UTC): one normally, none in a spring-forward gap, two (earlier first) in a repeated
 * fall-back hour.
 */
export function instantsForWallClock(timeZone: string, wallMs: number): number[] {
  const dayMs = 86_400_000;
  const candidates = new Set([offsetMsAt(timeZone, wallMs - dayMs), offsetMsAt(timeZone, wallMs + dayMs), offsetMsAt(timeZone, wallMs)]);
  const found: number[] = [];
  for (const offset of candidates) {
    const instant = wallMs - offset;
    if (offsetMsAt(timeZone, instant) === offset && !found.includes(instant)) found.push(instant);
  }
  return found.sort((a, b) => a - b);
}
