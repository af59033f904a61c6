/**
 * LO evolution: x-space DGLAP on an interpolation grid (primary), Mellin-space evolution (the
 * independent check), grids, sum-rule integrals and error-set building.
 */

// Grids
export { DEFAULT_X_GRID, checkedXNodes, xNodes, type XGridSpec } from './x-grid'
export { DEFAULT_Q2_GRID, q2Nodes, thresholdPairs, type Q2GridSpec, type ThresholdPair } from './q2-grid'

// Interpolation basis and convolution matrices
export { closedLogNodes, interpolateLogX, lagrangeBasis, stencilStart } from './lagrange'
export { convolutionMatrices, type ConvolutionMatrices } from './convolution'

// Splitting functions and anomalous dimensions
export { CA, CF, PQQ_DELTA, TR, pggDelta, pgq, pqg } from './splitting'
export { gammaGG, gammaGQ, gammaQG, gammaQQ } from './anomalous-dimensions'
export { fromEvolutionBasis, toEvolutionBasis, type EvolutionBasis } from './flavour-basis'
export { singletCouplings, singletOffDiagonalMoments, type EvolutionDirection } from './timelike'

// Evolution methods
export { createEvolutionPlan, evolveMember, type EvolutionPlan, type EvolutionSetup } from './xspace'
export { evolveMellin, momentumBelowMellin, type MellinPoint, type MellinSetup } from './mellin'

// Sum rules after evolution
export { gridSumRules, integrateX, integrateXParts, type GridSumRules } from './sum-rules'
export { fragmentationMomentumSums, type FragmentationSums } from './fragmentation-sums'
export { nucleusSumRules, perNucleonGrid, type NucleusSumRules } from './nuclear-sum-rules'

// Error sets from a fit
export {
  buildErrorSet, evolveModel, planForModel,
  nucleusProvenance, type BuildSetOptions, type MemberRequest, type ModelEvolutionOptions
} from './build-set'
export { buildNuclearFamily, type FamilyBuildOptions, type FamilyNucleus } from './build-family'
