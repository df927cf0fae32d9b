/** @loadwright/forecasts: the public surface of the library. */
export * from './adjustment-layer';
export * from './approval-preview';
export * from './forecast-adjustments';
export * from './forecast-approvals';
export * from './forecast-repository';
export * from './forecast-review';
export * from './local-time';
export * from './series-scope';
export * from './hierarchy-coherence';
export * from './hierarchy-reconciliation';
export * from './reconciled-sets';
export * from './assumed-temperatures';
export * from './temperature-scenarios';
