import type { RepeatedHourQuestion } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { choiceWords, reasonWords, zonedClock } from './repeated-hour-labels';

// America/Chicago falls back on 2026-11-01: 01:00 CDT is 06:00Z, 01:00 CST is 07:00Z.
const question: RepeatedHourQuestion = {
  seriesKey: 'tv-f101',
  local: '2026-11-01 01:00',
  timeZone: 'America/Chicago',
  reason: 'rows-out-of-order',
  daylightStart: '2026-11-01T06:00:00.000Z',
  standardStart: '2026-11-01T07:00:00.000Z',
  readings: [
    { sourceRow: 24, value: 1022 },
    { sourceRow: 25, value: 1023 },
  ],
  unit: 'kW',
};

describe('repeated-hour labels', () => {
  it('writes both readings of the hour in the zone with its abbreviation', () => {
    expect(zonedClock(question.daylightStart, question.timeZone)).toBe('01:00 CDT');
    expect(zonedClock(question.standardStart, question.timeZone)).toBe('01:00 CST');
    expect(choiceWords(question)).toEqual({
      'first-is-daylight': 'Row 24 is daylight time (01:00 CDT), row 25 standard time (01:00 CST)',
      'second-is-daylight': 'Row 25 is daylight time (01:00 CDT), row 24 standard time (01:00 CST)',
      drop: 'Drop both readings',
    });
    expect(reasonWords(question)).toMatch(/^The file's rows for this series are not in time order/);
  });

  it('asks about a lone reading as daylight or standard time', () => {
    const lone = { ...question, reason: 'single-reading' as const, readings: [{ sourceRow: 3, value: 901 }] };
    expect(choiceWords(lone)).toEqual({
      'first-is-daylight': 'It is daylight time (01:00 CDT)',
      'second-is-daylight': 'It is standard time (01:00 CST)',
      drop: 'Drop this reading',
    });
  });
});
