/**
 * Input checks shared by the evaluation metrics: equal lengths, at least one point, finite values.
 * @throws ForecastingError 'too-few-observations' for empty input, 'invalid-argument' for unequal lengths,
 *   'non-finite-input' for NaN or ±Infinity.
 */
import { ForecastingError, assertFinite } from '../core/errors';

/** Throws unless every named array is finite, non-empty and as long as the first. */
export function checkAligned(fn: string, arrays: Record<string, ArrayLike<number>>): number {
  const entries = Object.entries(arrays);
  const n = entries[0][1].length;
  if (n === 0) throw new ForecastingError('too-few-observations', fn, `needs at least 1 point, got an empty ${entries[0][0]}`);
  for (const [name, values] of entries) {
    if (values.length !== n) {
      throw new ForecastingError(
        'invalid-argument',
        fn,
        `${name} has ${values.length} values but ${entries[0][0]} has ${n}; pass aligned arrays`,
      );
    }
    assertFinite(fn, values, name);
  }
  return n;
}
