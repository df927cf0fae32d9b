/**
 * The planner's adjustment layer over a version's model numbers. The model's points are never
 * changed; this computes what the adjusted numbers are.
 *
 * Definition, for one interval starting at `ts`, over the adjustments with `from <= ts < to`:
 *   adjusted = model × (∏ scale factors) + (∑ shift amounts)
 * Scales act first whenever they were created, so a shift moves the forecast by exactly the amount
 * the planner typed, and adding a later scale does not stretch an earlier shift. Adjustments are
 * taken in creation order (id); for a product and a sum the order does not change the result, so
 * deleting and re-adding one gives the same numbers. Bounds move with the mean for a shift and are
 * multiplied for a scale (factors are > 0, so the order of the bounds is kept).
 */

/** A mean with its 80 % and 95 % bounds. */
export interface Band {
  mean: number;
  lower80: number;
  upper80: number;
  lower95: number;
  upper95: number;
}

/** One stored adjustment, as the layer needs it. */
export interface AdjustmentRule {
  id: number;
  periodStart: Date;
  periodEnd: Date;
  kind: 'shift' | 'scale';
  amount: number;
}

/** A model point with its start instant. */
export interface ModelPoint extends Band {
  ts: Date;
}

/** The combined effect of the adjustments covering one interval. */
export interface Effect {
  factor: number;
  shift: number;
}

/** True when the adjustment covers the interval starting at `ts` (half-open period). */
export function covers(rule: AdjustmentRule, ts: Date): boolean {
  const t = ts.getTime();
  return rule.periodStart.getTime() <= t && t < rule.periodEnd.getTime();
}

/** The factor and shift the rules (in creation order) put on the interval at `ts`; null when none covers it. */
export function effectAt(rules: readonly AdjustmentRule[], ts: Date): Effect | null {
  let factor = 1;
  let shift = 0;
  let any = false;
  for (const rule of rules) {
    if (!covers(rule, ts)) continue;
    any = true;
    if (rule.kind === 'scale') factor *= rule.amount;
    else shift += rule.amount;
  }
  return any ? { factor, shift } : null;
}

/** A band after an effect: every number scaled by the factor, then moved by the shift. */
export function applyEffect(band: Band, effect: Effect): Band {
  const move = (value: number) => value * effect.factor + effect.shift;
  return {
    mean: move(band.mean),
    lower80: move(band.lower80),
    upper80: move(band.upper80),
    lower95: move(band.lower95),
    upper95: move(band.upper95),
  };
}

/** Each point's adjusted band, or null where no adjustment covers it. */
export function adjustPoints(points: readonly ModelPoint[], rules: readonly AdjustmentRule[]): (Band | null)[] {
  const sorted = [...rules].sort((a, b) => a.id - b.id);
  return points.map((point) => {
    const effect = effectAt(sorted, point.ts);
    return effect ? applyEffect(point, effect) : null;
  });
}
