import { ForecastingError, assertFinite } from '../core/errors';
import type { LocalCalendar } from './local-calendar';

/** Additive: y = level + effect[slot] + r. Multiplicative: y = effect[slot] · r, effect = slot mean / level. */
export type ProfileForm = 'additive' | 'multiplicative';

/** Which local-time slot a profile is indexed by. */
export type ProfileSlot = 'hour-of-day' | 'day-of-week' | 'hour-of-week';

/** A seasonal profile estimated from training data. */
export interface SeasonalProfile {
  slot: ProfileSlot;
  form: ProfileForm;
  /** Number of slots: 24, 7 or 168. */
  period: number;
  /** Overall mean of the training values. */
  level: number;
  /** Per slot: slot mean − level (additive) or slot mean / level (multiplicative). */
  effect: Float64Array;
  /** Training observations per slot (two on a fall-back day for the repeated hour, none for the skipped one). */
  count: Uint32Array;
}

/** Number of slots of each slot kind. */
export const PROFILE_PERIOD: Record<ProfileSlot, number> = { 'hour-of-day': 24, 'day-of-week': 7, 'hour-of-week': 168 };

/** The slot index of every observation for a slot kind. */
export function profileSlots(calendar: LocalCalendar, slot: ProfileSlot): ArrayLike<number> {
  if (slot === 'hour-of-day') return calendar.hourOfDay;
  if (slot === 'day-of-week') return calendar.dayOfWeek;
  return calendar.hourOfWeek;
}

/**
 * Estimates a seasonal profile as the mean per slot: additive effects are slot mean − overall mean
 * (count-weighted, so they average to zero over the training data); multiplicative effects are the
 * ratio of slot mean to the overall mean (the classical ratio-to-average index; common practice).
 *
 * @throws ForecastingError 'invalid-argument' when lengths differ, a slot has no observation (train on at
 *   least one full cycle), or a multiplicative profile meets a non-positive level or slot mean.
 */
export function estimateSeasonalProfile(
  values: ArrayLike<number>,
  slots: ArrayLike<number>,
  slot: ProfileSlot,
  form: ProfileForm,
): SeasonalProfile {
  const fn = 'estimateSeasonalProfile';
  assertFinite(fn, values);
  if (slots.length !== values.length) {
    throw new ForecastingError('invalid-argument', fn, `needs one slot per value, got ${slots.length} slots for ${values.length} values`);
  }
  const period = PROFILE_PERIOD[slot];
  const sum = new Float64Array(period);
  const count = new Uint32Array(period);
  let total = 0;
  for (let i = 0; i < values.length; i++) {
    sum[slots[i]] += values[i];
    count[slots[i]] += 1;
    total += values[i];
  }
  const level = total / values.length;
  const effect = new Float64Array(period);
  for (let k = 0; k < period; k++) {
    if (count[k] === 0) {
      throw new ForecastingError(
        'invalid-argument',
        fn,
        `${slot} slot ${k} has no observation: train on at least one full cycle of ${period} slots`,
      );
    }
    const slotMean = sum[k] / count[k];
    if (form === 'additive') {
      effect[k] = slotMean - level;
    } else {
      if (!(level > 0) || !(slotMean > 0)) {
        throw new ForecastingError(
          'invalid-argument',
          fn,
          `a multiplicative profile needs positive slot means, slot ${k} has ${slotMean}: use the additive form`,
        );
      }
      effect[k] = slotMean / level;
    }
  }
  return { slot, form, period, level, effect, count };
}

/** Removes the profile: y − effect (additive) or y / effect (multiplicative). */
export function removeSeasonalProfile(profile: SeasonalProfile, values: ArrayLike<number>, slots: ArrayLike<number>): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const e = profile.effect[slots[i]];
    out[i] = profile.form === 'additive' ? values[i] - e : values[i] / e;
  }
  return out;
}

/** Puts the profile back: r + effect (additive) or r · effect (multiplicative). */
export function restoreSeasonalProfile(profile: SeasonalProfile, values: ArrayLike<number>, slots: ArrayLike<number>): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const e = profile.effect[slots[i]];
    out[i] = profile.form === 'additive' ? values[i] + e : values[i] * e;
  }
  return out;
}
