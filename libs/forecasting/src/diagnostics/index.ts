export * from './ljung-box';
export * from './residual-diagnostics';
export * from './fit-warnings';
