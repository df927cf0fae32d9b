export * from './summing-matrix';
export * from './shrink-covariance';
export * from './reconciliation-matrix';
export * from './reconcile-forecasts';
