/**
 * Uncertainty prescriptions of the Sheaf engine (see shared/physics/README.md, "Uncertainty
 * prescriptions"): bands, covariances, correlations, combinations of sets, replica ↔ Hessian
 * conversions and χ² against data. All functions take member-value matrices (members × bins) and
 * return new typed arrays.
 */

// Inputs and results
export { type MemberValues, type SpreadOptions, type SquareMatrix, memberValuesFromRows, assertMemberValues, withoutMembers, binColumn } from './matrix'
export { type Band, type BandJson, type BandRow, type BandView, makeBands, scaleBands, bandRows, bandToJson } from './band'

// One entry point for a study's band
export {
  PRESCRIPTIONS, PRESCRIPTIONS_BY_KIND, type Prescription, type BandOptions, type BandResult, type IntervalRule,
  isPrescription, prescriptionsFor, computeBands, intervalRule
} from './bands'

// Confidence levels
export { ONE_SIGMA_CL_PERCENT, sigmaMultiple, clScaleFactor, coverageFraction, centralPercentiles } from './confidence'

// Prescriptions one by one
export { eigenvectorCount, eigenvectorDeviations, hessianSymmetric, hessianAsymmetric, hessianOneSided } from './hessian'
export { replicaCount, replicaMoments, replicaMeanSd, replicaMedianInterval } from './replicas'
export { sampleQuantile, sortedCopy, quantilesOfSorted } from './quantile'
export { alphasShift, alphasVariationError } from './alphas-members'
export { addBandsInQuadrature, addInQuadrature } from './in-quadrature'

// Covariance, correlation, per-eigenvector diagnostics
export {
  type CovarianceOptions, deviationRows, binCovariance, gram, correlationFromCovariance, binCorrelation,
  observableCorrelation
} from './covariance'
export { type EigenvectorContributions, eigenvectorContributions } from './contributions'

// Combining sets
export { bandEnvelope } from './envelope'
export { type PoolMember, type PooledSets, hessianToReplicas, poolSets } from './pooling'
export { type ReductionOptions, type ReducedHessian, reduceReplicasToHessian } from './pca'

// Comparison with data
export { type Measurement, type ChiSquareResult, experimentalCovariance, chiSquare, compareWithSet } from './chi2'

// Numerical helpers
export { NeumaierSum, neumaierSum } from './summation'

// Predictions on two sets (paired members, or each set varied apart)
export { type TwoSetVariation, pairable, twoSetVariation, variationText, splitApart, combineApart, apartCovariance } from './two-sets'
