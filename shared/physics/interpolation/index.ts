/**
 * Interpolation of member grids in (ln x, ln Q²): stencils, flattened weights for precomputed
 * plans, and values at points. See interpolation/stencil.ts for the method and its accuracy.
 */

// Axes
export type { GridAxes, PreparedAxes } from './axes'
export { prepareAxes, preparedAxesOf } from './axes'

// Stencils and weights
export type { OutsidePolicy, InterpolationOptions, Stencil, PointWeights } from './stencil'
export { EDGE_SLACK, lagrangeWeights, interpolationStencil, interpolationWeights } from './stencil'

// Values
export type { ManyPoints } from './member'
export { applyStencil, interpolateXf, interpolateFlavours, interpolateMany } from './member'
