import { describe, expect, it } from 'vitest';
import { zonedClock } from '../series-page/zoned-time';
import { clockText } from './clock-text';

describe('clockText', () => {
  it('names the zone as the series page does: CST in winter and CDT in summer for America/Chicago, never GMT-6', () => {
    expect(clockText('2026-12-03T15:15:33Z', 'America/Chicago')).toBe('3 Dec 09:15:33 CST');
    expect(clockText('2026-07-03T15:15:33Z', 'America/Chicago', false)).toBe('3 Jul 10:15 CDT');
    expect(zonedClock('2026-12-03T15:15:33Z', 'America/Chicago')).toContain('CST');
  });

  it('says a missing time plainly', () => {
    expect(clockText(null, 'America/Chicago')).toBe('—');
  });
});
