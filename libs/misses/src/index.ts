/** @loadwright/misses: miss rules, their evaluation and the explanation of misses. */
export * from './creeping-bias';
export * from './daily-peak-missed';
export * from './error-over-threshold';
export * from './evaluate-rule';
export * from './hour-point';
export * from './operational-misses';
export * from './outside-band';
export * from './rule-kinds';
export * from './rules-in-force';
export * from './detect-misses';
export * from './detection-queue';
export * from './miss-repository';
export * from './version-in-force';
export * from './explain-miss';
export * from './explain-event';
export * from './notify-misses';
export * from './miss-service';
