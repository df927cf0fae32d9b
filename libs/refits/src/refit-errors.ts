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

/** A PostgreSQL error as node-postgres raises it: SQLSTATE code and, for constraints, the constraint's name. */
interface DatabaseFault {
  code: string;
  constraint?: string;
}

/** True for an error raised by PostgreSQL (a five-character SQLSTATE code). */
function isDatabaseFault(error: unknown): error is DatabaseFault {
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    /^[0-9A-Z]{5}$/.test((error as { code: string }).code)
  );
}

/**
 * The message kept on the run-series row and shown in the Refits table: short, one line, no stack,
 * and never the database's own text (which names constraints and columns, not what happened).
 */
export function describeRefitError(error: unknown): string {
  // P0001 is a RAISE in our own triggers and functions, whose text is written for people.
  if (isDatabaseFault(error) && error.code !== 'P0001') {
    if (error.code === '23505' && error.constraint === 'forecast_versions_one_draft_key')
      return 'Another refit of this series wrote its draft at the same moment; this attempt was set aside.';
    if (error.code === '40P01' || error.code === '40001')
      return 'The database had to stop this write to let another one through; it is retried.';
    if (error.code.startsWith('08') || error.code === '57P01') return 'The connection to the database was lost during the refit.';
    return `The database refused to store this refit (code ${error.code}).`;
  }
  const text = error instanceof Error ? error.message : String(error);
  return text.replace(/\s+/g, ' ').slice(0, 500);
}
