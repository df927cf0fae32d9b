/**
 * The MASE scale of a version: the in-sample mean absolute error of the seasonal-naive forecast over the
 * history just before its origin, Q = mean |y_t − y_{t−m}|.
 *
 * Method: Hyndman & Koehler (2006), Int. J. Forecasting 22(4), §3, scaled errors q_t = e_t / Q with Q the
 *   in-sample MAE of the naive forecast; for seasonal data the seasonal-naive version at period m
 *   (Hyndman & Athanasopoulos 2021, FPP3 §5.8).
 * Conventions (our choices, stated): m = 168 hours (same hour one week earlier), the period of hourly
 *   load's strongest cycle; the "training part" is the four weeks before the origin rather than the whole
 *   history, so a version is scaled by the load level and volatility it was made in; pairs with a missing
 *   actual are left out; fewer than one week of pairs, or Q = 0, give null (no MASE) rather than a
 *   scale from too little data or a division by zero.
 * References: Hyndman & Koehler (2006); Hyndman & Athanasopoulos (2021), FPP3 §5.8.
 */
import { mae } from '@loadwright/forecasting';

/** Seasonal period of hourly load for MASE and the naive benchmark: one week of hours. */
export const seasonalPeriodHours = 168;
/** Hours of history before the origin the scale is taken from: four weeks. */
export const scaleWindowHours = 4 * 168;

const hourMs = 3_600_000;

/** Q over [origin − 4 weeks, origin) from hourly actuals keyed by epoch milliseconds; null when too few pairs or 0. */
export function seasonalNaiveScale(actuals: ReadonlyMap<number, number>, originMs: number): number | null {
  const now: number[] = [];
  const weekBefore: number[] = [];
  for (let t = originMs - scaleWindowHours * hourMs; t < originMs; t += hourMs) {
    const y = actuals.get(t);
    const lagged = actuals.get(t - seasonalPeriodHours * hourMs);
    if (y === undefined || lagged === undefined) continue;
    now.push(y);
    weekBefore.push(lagged);
  }
  if (now.length < seasonalPeriodHours) return null;
  const scale = mae(now, weekBefore);
  return scale > 0 ? scale : null;
}

/**
 * The seasonal-naive forecast of the hour at `ts` made at `originMs`: the actual m·k hours earlier with
 * k = ⌊(h − 1)/m⌋ + 1, the latest same hour of the week known at the origin (FPP3 §5.2). Null when missing.
 */
export function seasonalNaiveAt(actuals: ReadonlyMap<number, number>, originMs: number, ts: number): number | null {
  const horizon = Math.round((ts - originMs) / hourMs) + 1;
  const seasonsBack = Math.floor((horizon - 1) / seasonalPeriodHours) + 1;
  return actuals.get(ts - seasonsBack * seasonalPeriodHours * hourMs) ?? null;
}
