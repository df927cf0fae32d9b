import { describe, expect, it } from 'vitest';
import { localCalendar } from './local-calendar';

/** Local fields straight from Intl for every instant: the slow reference the cached offsets must equal. */
function intlReference(timestamps: number[], timeZone: string) {
  const format = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    weekday: 'short',
  });
  const weekdays = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
  return timestamps.map((t) => {
    const parts = Object.fromEntries(format.formatToParts(t).map((p) => [p.type, p.value]));
    return {
      hour: Number(parts['hour']),
      weekday: weekdays.indexOf(parts['weekday']!),
      date: `${parts['year']}-${parts['month']}-${parts['day']}`,
    };
  });
}

describe('localCalendar against Intl at every hour', () => {
  for (const zone of ['America/Chicago', 'Europe/London', 'Australia/Lord_Howe', 'Asia/Kolkata', 'America/Phoenix', 'Pacific/Chatham']) {
    it(`agrees for three years of hours and some quarter-hours in ${zone}`, () => {
      const start = Date.UTC(2024, 0, 1);
      const timestamps: number[] = [];
      for (let h = 0; h < 3 * 8784; h++) timestamps.push(start + h * 3_600_000);
      for (let q = 0; q < 2000; q++) timestamps.push(Date.UTC(2025, 2, 29) + q * 900_000);
      const fast = localCalendar(timestamps, zone);
      const slow = intlReference(timestamps, zone);
      for (let i = 0; i < timestamps.length; i++) {
        if (fast.hourOfDay[i] !== slow[i]!.hour || fast.dayOfWeek[i] !== slow[i]!.weekday || fast.localDate[i] !== slow[i]!.date) {
          throw new Error(
            `${zone} at ${new Date(timestamps[i]!).toISOString()}: got ${fast.hourOfDay[i]} ${fast.dayOfWeek[i]} ${fast.localDate[i]}, Intl says ${JSON.stringify(slow[i])}`,
          );
        }
      }
      expect(fast.hourOfDay.length).toBe(timestamps.length);
    });
  }
});
