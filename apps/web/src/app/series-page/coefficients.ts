/** One estimated coefficient as the model card lists it. */
export interface CoefficientRow {
  /** Symbol and what it multiplies, e.g. "φ₂ (lag 2)". */
  readonly name: string;
  readonly value: number;
  /** Standard error, when the fit recorded one. */
  readonly standardError: number | null;
}

/** Subscript digits for coefficient symbols. */
const subscripts = '₀₁₂₃₄₅₆₇₈₉';
/** "φ₁₂" from ("φ", 12). */
const symbol = (letter: string, index: number) => letter + String(index).replace(/\d/g, (digit) => subscripts[Number(digit)]!);

/** Reads a list of numbers, or null when the value is not one. */
function numbers(value: unknown): (number | null)[] | null {
  return Array.isArray(value) ? value.map((entry) => (typeof entry === 'number' && Number.isFinite(entry) ? entry : null)) : null;
}

/** Reads a finite number, or null. */
function finite(value: unknown): number | null {
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

/**
 * The coefficients of a fit's stored parameters (`{ mean, ar, ma, regression: { names, coefficients } }`),
 * with standard errors from `parameters.standardErrors` (or `stderr`) when the fit carries them. AR lags
 * a penalised fit set to exactly zero are left out and counted, so a lasso over 168 lags stays readable.
 */
export function coefficientRows(parameters: Record<string, unknown>): { rows: CoefficientRow[]; zeroLags: number } {
  const errors = (parameters['standardErrors'] ?? parameters['stderr'] ?? {}) as Record<string, unknown>;
  const rows: CoefficientRow[] = [];
  const mean = finite(parameters['mean']);
  if (mean !== null) rows.push({ name: 'μ (mean)', value: mean, standardError: finite(errors['mean']) });
  let zeroLags = 0;
  const arErrors = numbers(errors['ar']);
  (numbers(parameters['ar']) ?? []).forEach((value, index) => {
    if (value === null) return;
    if (value === 0) {
      zeroLags++;
      return;
    }
    rows.push({ name: `${symbol('φ', index + 1)} (AR lag ${index + 1})`, value, standardError: arErrors?.[index] ?? null });
  });
  const maErrors = numbers(errors['ma']);
  (numbers(parameters['ma']) ?? []).forEach((value, index) => {
    if (value !== null)
      rows.push({ name: `${symbol('θ', index + 1)} (MA lag ${index + 1})`, value, standardError: maErrors?.[index] ?? null });
  });
  const regression = (parameters['regression'] ?? {}) as Record<string, unknown>;
  const names = Array.isArray(regression['names']) ? (regression['names'] as unknown[]).map(String) : [];
  const coefficients = numbers(regression['coefficients']) ?? [];
  const regressionErrors = numbers(errors['regression']);
  names.forEach((name, index) => {
    const value = coefficients[index];
    if (value !== null && value !== undefined) rows.push({ name: `β ${name}`, value, standardError: regressionErrors?.[index] ?? null });
  });
  return { rows, zeroLags };
}
