// Per-eigenvector view of one bin of a Hessian result, for the bar chart: the engine's signed
// shift and variance share, and the shift of each member of the pair from the central value.
// No Nitro imports.
import type { SetHeader } from '../../../shared/physics/types'
import { clScaleFactor, eigenvectorContributions, withoutMembers, type MemberValues } from '../../../shared/physics/uncertainty'

/** One eigenvector's bar: shifts in the observable's unit at the requested CL. */
export interface EigenvectorBar {
  /** 1..N in the set's order. */
  eigenvector: number
  /** ½(X_k⁺ − X_k⁻) for pairs, X_k − X₀ for one-sided sets. */
  signed: number
  /** signed² over the sum of all signed²; null when every shift is 0. */
  fraction: number | null
  /** X_k⁺ − X₀ (for one-sided sets X_k − X₀). */
  plus: number
  /** X_k⁻ − X₀ for pairs; null for one-sided sets, which have no minus member. */
  minus: number | null
}

/**
 * The bars of 0-based `bin` of `matrix` (members of a set with `header`), at `clPercent`; α_s
 * members are left out. Member shifts scale with the same Gaussian CL factor as `signed`
 * (common practice). RangeError (from the engine) for replicas or a bad member count.
 */
export function eigenvectorBars(matrix: MemberValues, bin: number, header: SetHeader, clPercent: number) {
  const c = eigenvectorContributions(matrix, bin, { kind: header.kind, clFrom: header.confidenceLevelPercent, clTo: clPercent, alphasMembers: header.alphasMembers })
  const pdf = header.alphasMembers === undefined ? matrix : withoutMembers(matrix, header.alphasMembers)
  const factor = clScaleFactor(header.confidenceLevelPercent, clPercent)
  const at = (member: number) => (pdf.values[member * pdf.bins + bin]! - pdf.values[bin]!) * factor
  const pairs = header.kind === 'hessian-pairs'
  const bars: EigenvectorBar[] = Array.from(c.eigenvector, (k, i) => ({
    eigenvector: k,
    signed: c.signed[i]!,
    fraction: Number.isFinite(c.fraction[i]!) ? c.fraction[i]! : null,
    plus: at(pairs ? 2 * k - 1 : k),
    minus: pairs ? at(2 * k) : null
  }))
  return { total: c.total, eigenvectors: bars }
}
