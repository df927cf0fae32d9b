// ARMA estimation by nonlinear least squares on the conditional sum of squares, and its building blocks.
export { nlsArma, type NlsOptions, type NlsFitResult } from './nls';
export { hannanRissanen } from './hannan-rissanen';
export { exactLogLikelihood, autocovariances as armaAutocovariances } from './exact-likelihood';
export { cssSumOfSquares, cssNormalEquations, createCssWorkspace, cssParameterCount, type CssLayout, type CssWorkspace } from './css';
export { isStationary, isInvertible, reciprocalRoots, reflectAr, reflectMa, stabilise, type Complex } from './polynomial-roots';
