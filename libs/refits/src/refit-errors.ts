/** Errors of the refit that retrying cannot fix: the series' data or settings are not usable. */
import { ForecastingError, type ForecastingErrorCode } from '@loadwright/forecasting';

/** A refit that cannot succeed with the series as it stands; the message says why, in words. */
export class RefitDataError extends Error {
  override readonly name = 'RefitDataError';
}

/** Engine refusals that come from the data, not from a passing fault. */
const permanentEngineCodes = new Set<ForecastingErrorCode>([
  'too-few-observations',
  'constant-series',
  'non-finite-input',
  'invalid-argument',
  'non-stationary',
]);

/** True when retrying would fail again the same way (bad data or settings). */
export function isPermanentRefitError(error: unknown): boolean {
  return error instanceof RefitDataError || (error instanceof ForecastingError && permanentEngineCodes.has(error.code));
}

/** The message kept on the run-series row: short, one line, no stack. */
export function describeRefitError(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  return text.replace(/\s+/g, ' ').slice(0, 500);
}
