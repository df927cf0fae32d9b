// Order selection over a grid of AR/ARMA orders by an information criterion.
export { selectOrder, type SelectOrderOptions, type OrderSelection, type OrderCandidate, type OrderCriterion } from './select-order';
