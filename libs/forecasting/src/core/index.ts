export * from './errors';
export * from './types';
export * from './incomplete-gamma';
export * from './normal';
export * from './chi-square';
export * from './arma-filter';
export * from './ar-stationarity';
export * from './information-criteria';
