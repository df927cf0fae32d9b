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
// Settings trials: proposed settings backtested against the current ones, stored, then applied or not.
export * from './trials/settings-trial-queue';
export * from './trials/settings-trial-store';
export { runSettingsTrial, type SettingsTrialOutcome } from './trials/run-settings-trial';
export { readTrialHistory, TRIAL_MIN_HISTORY_HOURS, type TrialHistory } from './trials/trial-history';
export { inputsAtOrigin, trialOrigins, TRIAL_SEASON } from './trials/trial-backtest';
