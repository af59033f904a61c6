/**
 * What a new measurement does to a set (see shared/physics/README.md, section 21): per-bin
 * K-factors, Bayesian reweighting of replica sets and its unweighting, Hessian profiling, and
 * sensitivity maps. Pure functions over member-value matrices and error sets.
 */

export {
  type KFactors, type KFactorBands, type KFactorReport, checkKFactors, applyKFactors, applyKFactorsToRows, kFactorErrors, kFactorReportOf, kFactorBands
} from './k-factors'
export {
  type WeightForm, type ReweightOptions, type ReweightResult, WEIGHT_FORMS, replicaChi2, reweightingWeights,
  effectiveReplicas, weightedMoments, weightedBand, chi2Profile, reweight
} from './reweighting'
export { type DerivedSetInfo, derivedHeader } from './derived-set'
export { type UnweightingOptions, unweightedCopies, unweightedMatrix, unweightingErrors, unweightedSet } from './unweighting'
export {
  type HessianKind, type EigenvectorModel, type ProfilingOptions, type ProfilingResult, eigenvectorModel, evaluateModel,
  profile, profiledMembers, profiledSet
} from './profiling'
export { type CorrelationMap, densityValues, correlationMap, predictionErrors, sensitivityMap } from './sensitivity'
