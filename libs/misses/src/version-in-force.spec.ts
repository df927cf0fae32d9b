import { describe, expect, it } from 'vitest';
import { versionInForce } from './version-in-force';

const at = (iso: string) => new Date(iso);
const versions = [
  { id: 1, origin: at('2026-06-01T00:00:00Z'), horizonHours: 168, approvedAt: at('2026-06-01T06:00:00Z') },
  { id: 2, origin: at('2026-06-02T00:00:00Z'), horizonHours: 168, approvedAt: null },
  { id: 3, origin: at('2026-06-03T00:00:00Z'), horizonHours: 168, approvedAt: at('2026-06-03T06:00:00Z') },
];

describe('versionInForce', () => {
  it('prefers the approved version over a newer draft', () => {
    expect(versionInForce(versions, at('2026-06-02T12:00:00Z'))!.id).toBe(1);
  });

  it('takes the newest approved version covering the hour', () => {
    expect(versionInForce(versions, at('2026-06-04T12:00:00Z'))!.id).toBe(3);
  });

  it('falls back to the draft where no approved version covers the hour', () => {
    // Version 1 covers up to 2026-06-08T00:00Z (exclusive); version 3 covers until 06-10; the draft until 06-09.
    expect(versionInForce(versions.slice(0, 2), at('2026-06-08T12:00:00Z'))!.id).toBe(2);
    expect(versionInForce(versions, at('2026-05-31T23:00:00Z'))).toBeNull();
  });
});
