// Public face of libs/forecasting: each area re-exports its estimators from its own index.
export * from './core/errors';
export * from './core/types';
