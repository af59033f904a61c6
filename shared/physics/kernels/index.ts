/**
 * Leading-order kernels of the Sheaf engine. Each kernel gives, at a kinematic point, a linear
 * (DIS) or bilinear (hadron–hadron) form in the momentum densities x·f; see terms.ts.
 */

// Forms and their evaluation
export type { FlavourWeights, PairWeight, LinearTerm, BilinearTerm, Term, XfFunction } from './terms'
export { evaluateTerm, addWeight, mergePairs } from './terms'

// Hadrons, couplings, kinematics, units
export type { Hadron } from './hadrons'
export { hadronSchema, PROTON, composition, onProton, pairsOnProton } from './hadrons'
export type { CkmChoice } from './couplings'
export { QUARKS, UP_TYPE, DOWN_TYPE, quarkCharge, zCouplings, quarkZCoupling2, vSquared } from './couplings'
export { partonFractions, rapidityReach, inelasticity } from './kinematics'
export type { CrossSectionUnit } from './units'
export { crossSectionUnitSchema, perPb, gev2ToUnit } from './units'

// DIS
export type { NcObservable, NcOptions, NcExchange, NcLepton } from './dis-neutral'
export { f2PhotonWeights, etaGammaZ, gammaZWeights, ncTerm, f2NeutralCurrent, flNeutralCurrent, twoXF1NeutralCurrent, d2SigmaDxDQ2NeutralCurrent } from './dis-neutral'
export type { CcBeam, CcStructure, CcOptions, CcCrossSectionOptions } from './dis-charged'
export { ccWeights, ccStructureTerm, ccStructureFunction, ccCrossSectionTerm, d2SigmaDxDyChargedCurrent } from './dis-charged'

// Hadron production with fragmentation functions
export type { AnnihilationExchange, AnnihilationOptions } from './electron-positron'
export { annihilationPropagators, effectiveCharge2, producedFlavours, annihilationTerm } from './electron-positron'
export type { FragmentationCombination } from './semi-inclusive'
export { fragmentationPairs, semiInclusiveYieldTerm, semiInclusiveQuarkSumTerm } from './semi-inclusive'
export type { DensityType, KernelDensities } from './densities'
export { DENSITY_WORDS, PARTON_SLOTS, SEMI_INCLUSIVE_SLOTS, ANNIHILATION_SLOTS, SPECIES_RATIO_SLOTS } from './densities'

// Hadron–hadron
export type { CollisionOptions } from './collider'
export { collisionTerm, integrateOverRapidity } from './collider'
export type { DrellYanOptions } from './drell-yan'
export { drellYanPairs, drellYanTerm, d2SigmaDMDyDrellYan } from './drell-yan'
export type { VectorBoson, VectorBosonOptions } from './vector-boson'
export { vectorBosonPairs, vectorBosonMassGeV, vectorBosonTerm, dSigmaDyVectorBoson } from './vector-boson'
export type { HiggsOptions } from './higgs'
export { GLUON_PAIR, higgsSigma0GeV2, higgsTerm, dSigmaDyHiggs } from './higgs'
export type { LuminosityChannel } from './luminosity'
export { luminosityPairs, luminosityTerm } from './luminosity'

// Electroweak widths (checks of the couplings)
export { wLeptonicWidthGeV, wHadronicWidthGeV, zChargedLeptonWidthGeV, zNeutrinoWidthGeV, zHadronicWidthGeV } from './widths'

// Ratios and asymmetries, member by member
export type { CombineOp } from './ratios'
export { combineByMember } from './ratios'

// User-defined kernels
export type { CompiledExpression } from './expression'
export { EXPRESSION_FUNCTIONS, EXPRESSION_CONSTANTS, ExpressionError, compileExpression } from './expression'
export type { UserKernelOptions, UserKernel } from './user-kernel'
export { userWeightRowSchema, userKernelOptionsSchema, userKernelVariables, buildUserKernel } from './user-kernel'

// Catalogue used by studies
export type { VariableName, VariableSpec, KernelContext, PointEvaluator, KernelDefinition, CompositePart, CompositeDefinition, AnyKernelDefinition } from './registry'
export { KERNEL_IDS, kernelDefinition, kernelCatalogue, kernelKind, kernelLabel, kernelDensities } from './registry'
