import { makeAlphas } from '../alphas'
import { MZ_GEV } from '../constants'
import type { SetHeader } from '../types'

/**
 * The α_s(μ²) function of every member of a set, for kernels with α_s (gg → H): member k runs
 * with one-loop α_s from its own α_s(M_Z) (SetHeader.alphasMz[k]) in the set's flavour scheme
 * (see shared/physics/README.md, "Running coupling" and "Higgs"). A set without per-member values
 * gives every member the central α_s(M_Z), so its α_s members then differ by their densities only.
 * Members sharing a value share one function.
 *
 * Unit: α_s dimensionless, μ² in GeV². Domain: a valid set header (validateHeader).
 * @example memberAlphasFunctions(header)[header.alphasMembers![1]]!(125.2 ** 2) // α_s⁺(M_H²)
 */
export function memberAlphasFunctions(header: Pick<SetHeader, 'alphasMz' | 'alphasMzCentral' | 'scheme' | 'memberCount'>): Array<(q2GeV2: number) => number> {
  const byValue = new Map<number, (q2GeV2: number) => number>()
  return Array.from({ length: header.memberCount }, (_, k) => {
    const value = header.alphasMz?.[k] ?? header.alphasMzCentral
    let f = byValue.get(value)
    if (!f) {
      f = makeAlphas({ value, scaleGeV2: MZ_GEV * MZ_GEV }, header.scheme)
      byValue.set(value, f)
    }
    return f
  })
}
