/**
 * Parametrised inputs at a starting scale: the JSON documents (parametrised input and nuclear
 * modification), their validation, compilation into a model, parameter binding with sum rules,
 * exact Mellin moments and evaluation of x·f on any x grid.
 */

// Documents: schema, parsing, errors
export {
  CoefficientSchema, GridSpecSchema, MembersSpecSchema, ModificationCoefficientSchema, ModificationTermSchema,
  NuclearModificationSchema, ParametrisedInputSchema, PieceSchema, TermSchema,
  type GridSpec, type MembersSpec, type ModificationTermDoc, type NuclearModificationDoc, type ParametrisedInputDoc,
  type PieceDoc, type TermDoc
} from './schema'
export {
  MassNumberCoefficientSchema, MassNumberTermSchema, describeMassNumberCoefficient, isMassNumberCoefficient,
  massNumberValue, nucleusProblem, type MassNumberCoefficientDoc, type MassNumberRef, type Nucleus
} from './mass-number'
export { parseInputDocument, parseInputText, type InputDocument } from './parse'
export { InputError, onlyPhysics, type InputIssue } from './errors'
export {
  BUILD_LIMITS, alphasReference, buildSize, centralTermIssues, landauPoleGeV2, memberIssues, memberVectors,
  membersSpecIssues, q2GridIssues, startScaleIssues, xGridIssues, type BuildSize, type MemberVector
} from './feasibility'

// Model and parameter binding
export {
  compileInput, compileParametrisedInput,
  type CoefficientRef, type CompileOptions, type FactorRef, type InputModel, type ModelPiece, type SumRuleTargets, type TermSource
} from './model'
export { bindParameters, numericTerms, type BoundInput, type BoundPiece } from './bind'
export { FRAGMENTATION_MOMENTUM_LIMIT, fragmentationMomenta, fragmentationProblem } from './fragmentation'

// Moments and evaluation
export { multiplyTerms, termMoment, termMomentComplex, termXf, type NumericTerm } from './moments'
export { evaluateXf, flavourMoments, flavourMomentsComplex, minimumXf, sumRuleIntegrals } from './evaluate'

// Flavour slots
export { EVOLVED_FLAVOURS, GLUON_SLOT, N_SLOTS, quarkSlots, slotOf } from './flavours'

// Special functions and complex arithmetic
export {
  EULER_GAMMA, beta, betaComplex, digammaComplex, harmonicS1, lnBeta, lnGamma, lnGammaComplex
} from './special-functions'
export { cAdd, cDiv, cExp, cInv, cLog, cMul, cScale, cSqrt, cSub, complex, type Complex } from './complex'
