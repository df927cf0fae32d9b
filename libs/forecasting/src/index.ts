// Public face of libs/forecasting: each area re-exports its estimators from its own index.
export * from './core';
export * from './acf';
export * from './ar';
export * from './arma';
export * from './forecast';
export * from './diagnostics';
export * from './selection';
export * from './regularised';
export * from './seasonal';
export * from './evaluation';
export * from './coldstart';
export * from './load-model';
export * from './hierarchy';
