import { describe, expect, it } from 'vitest';
import { parseTimestamp, slashedDateFields } from './parse-timestamp';

describe('parseTimestamp', () => {
  it('takes ISO 8601 with an offset as the instant it names', () => {
    expect(parseTimestamp('2025-03-09T02:00:00-06:00')).toEqual({ kind: 'instant', ms: Date.UTC(2025, 2, 9, 8), year: 2025 });
    expect(parseTimestamp('2025-03-09 02:00Z')).toEqual({ kind: 'instant', ms: Date.UTC(2025, 2, 9, 2), year: 2025 });
    expect(parseTimestamp('2025-03-09T02:00:00.250+0530')).toEqual({
      kind: 'instant',
      ms: Date.UTC(2025, 2, 8, 20, 30, 0, 250),
      year: 2025,
    });
  });

  it('reads times without an offset as wall-clock fields, US dates too, and 24:00 as the next midnight', () => {
    expect(parseTimestamp('2025-03-09 02:30')).toEqual({ kind: 'wall', wallMs: Date.UTC(2025, 2, 9, 2, 30), year: 2025 });
    expect(parseTimestamp('3/9/2025 14:05:09')).toEqual({ kind: 'wall', wallMs: Date.UTC(2025, 2, 9, 14, 5, 9), year: 2025 });
    expect(parseTimestamp('2025-03-09')).toEqual({ kind: 'wall', wallMs: Date.UTC(2025, 2, 9), year: 2025 });
    expect(parseTimestamp('2025-12-31 24:00')).toEqual({ kind: 'wall', wallMs: Date.UTC(2026, 0, 1), year: 2025 });
  });

  it('refuses what is not a date and time, or names one that does not exist', () => {
    for (const text of [
      '',
      'yesterday',
      '2025-13-01 00:00',
      '2025-02-29',
      '2025-03-09 25:00',
      '2025-03-09 24:30',
      '09.03.2025 02:00',
      '1741485600',
    ]) {
      expect(parseTimestamp(text), text).toBeNull();
    }
    expect(parseTimestamp('2024-02-29')).not.toBeNull();
  });

  it('reads a 12-hour clock with AM and PM: 12:00 AM is midnight, 12:00 PM noon', () => {
    const wall = (text: string) => (parseTimestamp(text) as { wallMs: number }).wallMs;
    expect(wall('3/9/2026 12:00 AM')).toBe(Date.UTC(2026, 2, 9, 0));
    expect(wall('3/9/2026 1:00 AM')).toBe(Date.UTC(2026, 2, 9, 1));
    expect(wall('3/9/2026 12:00 PM')).toBe(Date.UTC(2026, 2, 9, 12));
    expect(wall('3/9/2026 11:45 p.m.')).toBe(Date.UTC(2026, 2, 9, 23, 45));
    expect(parseTimestamp('3/9/2026 13:00 PM')).toBeNull();
    expect(parseTimestamp('3/9/2026 0:00 AM')).toBeNull();
  });

  it('reads slashed dates day first when told', () => {
    expect(parseTimestamp('13/3/2026 08:00', true)).toEqual({ kind: 'wall', wallMs: Date.UTC(2026, 2, 13, 8), year: 2026 });
    expect(parseTimestamp('13/3/2026 08:00')).toBeNull();
    expect(slashedDateFields(' 3/13/2026 1:00 PM')).toEqual([3, 13]);
    expect(slashedDateFields('2026-03-13')).toBeNull();
  });
});
