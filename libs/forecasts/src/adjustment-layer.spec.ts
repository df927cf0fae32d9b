import { describe, expect, it } from 'vitest';
import { adjustPoints, type AdjustmentRule, type ModelPoint } from './adjustment-layer';

const at = (hour: number) => new Date(Date.UTC(2026, 11, 1, hour));
const point = (hour: number, mean: number): ModelPoint => ({
  ts: at(hour),
  mean,
  lower80: mean - 10,
  upper80: mean + 10,
  lower95: mean - 20,
  upper95: mean + 20,
});
const rule = (id: number, kind: 'shift' | 'scale', amount: number, from: number, to: number): AdjustmentRule => ({
  id,
  kind,
  amount,
  periodStart: at(from),
  periodEnd: at(to),
});

describe('adjustment layer', () => {
  it('leaves uncovered intervals alone and treats the period as [from, to)', () => {
    const result = adjustPoints([point(0, 100), point(1, 100), point(2, 100)], [rule(1, 'shift', 5, 1, 2)]);
    expect(result[0]).toBeNull();
    expect(result[1]).toEqual({ mean: 105, lower80: 95, upper80: 115, lower95: 85, upper95: 125 });
    expect(result[2]).toBeNull();
  });

  it('multiplies the bounds for a scale', () => {
    const [band] = adjustPoints([point(0, 100)], [rule(1, 'scale', 1.5, 0, 1)]);
    expect(band).toEqual({ mean: 150, lower80: 135, upper80: 165, lower95: 120, upper95: 180 });
  });

  it('scales before it shifts, whichever was created first', () => {
    // 100 × 1.1 + 5 = 115 both ways; shifting first would give (100 + 5) × 1.1 = 115.5.
    const shiftFirst = adjustPoints([point(0, 100)], [rule(1, 'shift', 5, 0, 1), rule(2, 'scale', 1.1, 0, 1)]);
    const scaleFirst = adjustPoints([point(0, 100)], [rule(1, 'scale', 1.1, 0, 1), rule(2, 'shift', 5, 0, 1)]);
    expect(shiftFirst[0]!.mean).toBeCloseTo(115, 12);
    expect(scaleFirst[0]!.mean).toBeCloseTo(115, 12);
  });

  it('multiplies scales together and adds shifts together where periods overlap', () => {
    const rules = [rule(1, 'scale', 2, 0, 2), rule(2, 'scale', 0.5, 1, 2), rule(3, 'shift', -3, 0, 2), rule(4, 'shift', 1, 1, 2)];
    const [first, second] = adjustPoints([point(0, 10), point(1, 10)], rules);
    expect(first!.mean).toBe(10 * 2 - 3);
    expect(second!.mean).toBe(10 * 2 * 0.5 - 3 + 1);
  });
});
