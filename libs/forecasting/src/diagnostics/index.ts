export * from './ljung-box';
export * from './residual-diagnostics';
