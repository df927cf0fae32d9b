// Seasonal structure and calendar regressors for hourly load.
export * from './local-calendar';
export * from './seasonal-profile';
export * from './seasonal-difference';
export * from './lag-polynomial';
export * from './log-transform';
export * from './holiday-calendar';
export * from './day-type';
