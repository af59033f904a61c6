/**
 * Studies: the JSON specification shared by the app, the worker and the CLI, its validation and
 * reach check, the precomputed evaluation plan (see shared/physics/README.md, "Study evaluation"),
 * direct evaluation for checks, factorisation-scale variation, and the evaluation benchmark.
 */

// Specification
export type { BinColumn, BinRow, StudySpecInput, StudySpec, StudyIssue, StudyCheck } from './spec'
export { BIN_COLUMNS, binRowSchema, studySpecSchema, StudySpecError, checkStudySpec, parseStudySpec, kernelVariables, resultUnit } from './spec'

// Expansion into quadrature points and reach
export type { StudyAxes, ExpandedBin, DensitySource, ExpandedPart, ReachIssue, ExpandedStudy } from './expand'
export { expandStudy, checkReach, variableNodes, LOG_VARIABLES } from './expand'

// Evaluation
export type { LinearPlanPart, BilinearPlanPart, PlanPart, Plan, PlanOptions, EvaluateOptions } from './plan'
export { StudyReachError, buildPlan, evaluatePlan } from './plan'
export type { SetMembers, DirectOptions } from './direct'
export { evaluateDirect } from './direct'
export { memberAlphasFunctions } from './member-alphas'
export type { QuadratureErrors } from './quadrature-error'
export { quadratureErrors } from './quadrature-error'
export type { ScaleVariation, ScalePoint } from './scale'
export { scaleVariation, studyHasAlphas } from './scale'

// Benchmark study (timed by scripts/cli/bench.ts)
export { benchmarkSpec } from './benchmark'
