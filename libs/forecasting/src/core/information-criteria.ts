/**
 * Conditional Gaussian log-likelihood and the information criteria AIC, AICc and BIC for a fitted
 * ARMA(p, q) model with mean.
 *
 * ℓ = −(m/2)(log(2πσ²) + 1) with m = n − p observations in the conditional likelihood and σ² the
 * estimator's innovation variance; k = p + q + 2 parameters (φ, θ, μ, σ²);
 * AIC = −2ℓ + 2k, AICc = AIC + 2k(k + 1)/(m − k − 1), BIC = −2ℓ + k·log(m).
 *
 * Method: the concentrated conditional likelihood (Box, Jenkins, Reinsel & Ljung 2016, Time Series
 * Analysis, 5th ed., §7.1.2); Akaike (1974), IEEE Trans. Autom. Control 19(6); Hurvich & Tsai (1989),
 * Biometrika 76(2) for AICc; Schwarz (1978), Ann. Stat. 6(2) for BIC.
 *
 * Conventions: m = n − p, the observations the conditional likelihood is built on (common practice
 * for conditional fits); AICc is null when m − k − 1 ≤ 0.
 *
 * @throws ForecastingError('invalid-argument') when σ² ≤ 0 or m < 1.
 *
 * References: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §5.5.
 */
import { ForecastingError } from './errors';

/** The likelihood and criteria of one fit. */
export interface InformationCriteria {
  /** Conditional Gaussian log-likelihood ℓ. */
  loglik: number;
  /** −2ℓ + 2k. */
  aic: number;
  /** AIC + 2k(k + 1)/(m − k − 1), null when m − k − 1 ≤ 0. */
  aicc: number | null;
  /** −2ℓ + k·log(m). */
  bic: number;
}

/** ℓ, AIC, AICc and BIC for an ARMA(p, q) with mean fitted on n observations with innovation variance σ². */
export function conditionalInformationCriteria(n: number, p: number, q: number, sigma2: number): InformationCriteria {
  const m = n - p;
  if (!(sigma2 > 0) || !Number.isFinite(sigma2)) {
    throw new ForecastingError('invalid-argument', 'conditionalInformationCriteria', `needs a positive finite σ², got ${sigma2}`);
  }
  if (m < 1) throw new ForecastingError('invalid-argument', 'conditionalInformationCriteria', `needs n − p ≥ 1, got n = ${n}, p = ${p}`);
  const k = p + q + 2;
  const loglik = -(m / 2) * (Math.log(2 * Math.PI * sigma2) + 1);
  const aic = -2 * loglik + 2 * k;
  const aicc = m - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (m - k - 1) : null;
  const bic = -2 * loglik + k * Math.log(m);
  return { loglik, aic, aicc, bic };
}
