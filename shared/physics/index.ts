/**
 * The Sheaf physics engine: error sets, parametrised inputs and fits, LO evolution, LO kernels
 * and studies, uncertainty prescriptions. Pure TypeScript (no Vue, no Nitro, no I/O), shared by
 * the worker, the server routes and the command line. Each group below is a folder with its own
 * index; import from here, or from a folder's index for a narrower dependency. Every name is
 * defined in one module only.
 */

// Core: data types, physical constants (PDG 2024), Gauss–Legendre quadrature, JSON paths in
// messages
export * from './types'
export * from './constants'
export * from './quadrature'
export * from './json-path'

// Sets & interpolation: the set-file format, its parser and writer, TOY sets; (ln x, ln Q²)
// interpolation of member grids
export * from './sets'
export * from './interpolation'

// Inputs & fits: parametrised input documents, models and sum rules; Hessian members and
// replicas from a parameter covariance
export * from './input'
export * from './fit'

// Evolution: one-loop α_s through thresholds; LO DGLAP in x space and Mellin space; error sets
// built from a fit
export * from './alphas'
export * from './evolution'

// Kernels & studies: LO partonic kernels, the study specification, precomputed plans, direct
// evaluation, scale variation and the evaluation benchmark
export * from './kernels'
export * from './study'

// Uncertainties: every prescription on member-value matrices, covariances, combinations of
// sets, χ² against data
export * from './uncertainty'
