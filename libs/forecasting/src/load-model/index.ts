// The load-model pipeline the nightly refit calls, and its building blocks.
export * from './load-model-spec';
export * from './degree-hours';
export * from './regressor-columns';
export * from './regression-arma-errors';
export * from './fit-arma-part';
export * from './seasonal-naive-model';
export * from './exact-arima-forecast';
export * from './fit-load-model';
export * from './forecast-load-model';
export * from './temperature-scenario';
