// Cold start: peer-group priors and conjugate normal updates for series with little history.
export { conjugateNormalUpdate, type GaussianBelief, type GaussianPosterior } from './conjugate-normal';
export { gaussianPriorFromEstimates, peerProfilePrior, type CycleSeries, type ProfilePrior } from './peer-prior';
export { coldStartEstimate, type ColdStartEstimate } from './young-series-estimate';
