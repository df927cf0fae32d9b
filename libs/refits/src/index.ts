/** @loadwright/refits: the public surface of the library. */
export * from './holiday-calendar';
export * from './model-settings-service';
export * from './refit-queues';
export * from './refit-series';
export * from './refit-status';
export * from './start-run';
