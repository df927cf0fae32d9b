// Regularised AR over wide lag sets: ridge and lasso, penalty by BIC or rolling-origin validation.
export { ridgeAr, ridgePath } from './ridge';
export { lassoAr, lassoPath, lassoLambdaMax, softThreshold, type LassoArOptions } from './lasso';
export { buildLaggedDesign, type LaggedDesign } from './lagged-design';
export type { RegularisedFit, RegularisedArOptions, PenaltyPathPoint, PenaltySelection } from './regularised-fit';
