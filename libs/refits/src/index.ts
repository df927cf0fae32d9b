/** @loadwright/refits: the public surface of the library. */
export * from './holiday-calendar';
export * from './model-settings-service';
export * from './refit-queues';
export * from './refit-series';
export * from './refit-status';
export * from './start-run';
// The computing half of a refit, free of the database: the command line's `--method auto` runs it too.
export { autoSelect, candidateKeys, type AutoChoice, type AutoOptions, type CandidateKey } from './auto-select';
export { fitSeriesModel, type SeriesModelOutcome } from './fit-series-model';
export { defaultModelSettings } from './model-settings';
export { defaultBalancePoints } from './model-plan';
export type { RefitInputs } from './series-window';
