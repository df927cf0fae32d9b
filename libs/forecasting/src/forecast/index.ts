export * from './psi-weights';
export * from './forecast-arma';
export * from './intervals';
export * from './empirical-bands';
