export * from './autocovariance';
export * from './levinson-durbin';
export * from './pacf';
