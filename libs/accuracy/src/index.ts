/** @loadwright/accuracy: scoring forecast versions against actuals as they arrive, and the accuracy reports. */
export * from './accuracy-overview';
export * from './accuracy-summary';
export * from './day-peak-scores';
export * from './day-type';
export * from './score-repository';
export * from './score-series';
export * from './score-version';
export * from './scored-hour';
export * from './scoring-queue';
export * from './seasonal-naive-scale';
export * from './series-accuracy';
export * from './series-accuracy-report';
