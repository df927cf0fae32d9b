export * from './autocovariance';
export * from './levinson-durbin';
export * from './pacf';
export * from './toeplitz-inverse';
