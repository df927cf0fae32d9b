import { describe, expect, it } from 'vitest';
import { parseTimestamp } from './parse-timestamp';

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
});
