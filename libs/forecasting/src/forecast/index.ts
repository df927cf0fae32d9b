export * from './psi-weights';
export * from './forecast-arma';
export * from './intervals';
