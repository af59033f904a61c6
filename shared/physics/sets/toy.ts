import jStat from 'jstat'
import { normalStream } from '../random'
import type { SetDensity } from '../fragmentation/species'
import type { ErrorSet, FlavourScheme, Pdg, SetHeader, SetKind } from '../types'
import { NO_TARGET } from './header'
import { toyZD } from './toy-fragmentation'

/**
 * TOY error sets from analytic functions — for demos, samples, tests of the plumbing and the
 * benchmark. They are NOT fits to data and NOT solutions of DGLAP: the Q² dependence is a
 * made-up smooth form. Valence sums ∫u_v = 2, ∫d_v = 1 hold at every Q² by construction;
 * momentum is not conserved exactly.
 */

/** Options of {@link toyQ2Nodes}. */
export interface ToyQ2Options {
  q2MinGeV2: number
  q2MaxGeV2: number
  /** Total node count (before threshold duplicates), ≥ 2 per sub-grid. */
  count: number
  /** Thresholds m_h² (GeV²) inside the range at which a node is repeated. */
  thresholdsGeV2?: number[]
}

/**
 * x nodes: two thirds log-spaced in [xMin, 0.1), the rest linear in [0.1, xMax].
 * @example toyXNodes(30, 1e-5, 0.95).length // 30
 */
export function toyXNodes(count: number, xMin = 1e-5, xMax = 0.95): Float64Array {
  if (!(count >= 4) || !(xMin > 0 && xMin < 0.1) || !(xMax > 0.1 && xMax < 1)) throw new RangeError('toy x nodes need count ≥ 4, xMin in (0, 0.1), xMax in (0.1, 1)')
  const nLog = Math.round(count * 2 / 3)
  const nLin = count - nLog
  const out = new Float64Array(count)
  for (let i = 0; i < nLog; i++) out[i] = i === 0 ? xMin : Math.exp(Math.log(xMin) + (Math.log(0.1) - Math.log(xMin)) * i / nLog)
  for (let i = 0; i < nLin; i++) out[nLog + i] = 0.1 + (xMax - 0.1) * i / (nLin - 1)
  return out
}

/**
 * Q² nodes log-spaced over [q2Min, q2Max] with each threshold node repeated (types.ts
 * convention), the nodes shared out among the sub-grids by their log-length (≥ 2 each).
 */
export function toyQ2Nodes(options: ToyQ2Options): Float64Array {
  const { q2MinGeV2: lo, q2MaxGeV2: hi } = options
  const cuts = [lo, ...(options.thresholdsGeV2 ?? []).filter(t => t > lo && t < hi).sort((a, b) => a - b), hi]
  const total = Math.log(hi / lo)
  const nodes: number[] = []
  for (let r = 0; r + 1 < cuts.length; r++) {
    const a = cuts[r]!
    const b = cuts[r + 1]!
    const n = Math.max(2, Math.round(options.count * Math.log(b / a) / total))
    for (let i = 0; i < n; i++) nodes.push(i === 0 ? a : i === n - 1 ? b : Math.exp(Math.log(a) + Math.log(b / a) * i / (n - 1)))
  }
  return Float64Array.from(nodes)
}

/** The toy's flavours for n_f active flavours: −n_f … −1, 1 … n_f, 21. */
export function toyFlavours(nf: number): Pdg[] {
  const out: Pdg[] = []
  for (let q = nf; q >= 1; q--) out.push(-q)
  for (let q = 1; q <= nf; q++) out.push(q)
  out.push(21)
  return out
}

const betaCache = new Map<string, number>()
function beta(a: number, b: number): number {
  const key = `${a},${b}`
  let v = betaCache.get(key)
  if (v === undefined) {
    v = jStat.betafn(a, b) as number
    betaCache.set(key, v)
  }
  return v
}

/**
 * TOY momentum density x·f(x, Q²) of flavour `pdg` (dimensionless). With L = ln(Q²/1 GeV²) ≥ 0
 * (Q² below 1 GeV² is treated as 1 GeV²): x u_v = 2 x^0.7 (1−x)^{3+0.15L} / B(0.7, 4+0.15L),
 * x d_v = x^0.7 (1−x)^{4+0.15L} / B(0.7, 5+0.15L), x ū = 0.12 x^{−a}(1−x)^7,
 * x d̄ = 0.14 x^{−a}(1−x)^7, a = 0.15 + 0.02L, x s = x s̄ = ¼(x ū + x d̄),
 * heavy quarks x h = x h̄ = 0.1 ln(Q²/m_h²)·½(x ū + x d̄) above m_h² (0 below; for the
 * flavours of a variable scheme), x g = 1.7 x^{−0.2−0.03L}(1−x)^5.
 * @example toyXf(2, 0.1, 10, scheme) // x u at x = 0.1, Q² = 10 GeV²
 */
export function toyXf(pdg: Pdg, x: number, q2GeV2: number, scheme: FlavourScheme): number {
  const L = Math.max(0, Math.log(q2GeV2))
  const a = 0.15 + 0.02 * L
  const ubar = 0.12 * x ** -a * (1 - x) ** 7
  const dbar = 0.14 * x ** -a * (1 - x) ** 7
  const heavy = (m: number, nfNeeded: number) => {
    if (scheme.nf < nfNeeded) return 0
    if (scheme.type === 'fixed') return 0
    const m2 = m * m
    return q2GeV2 <= m2 ? 0 : 0.1 * Math.log(q2GeV2 / m2) * 0.5 * (ubar + dbar)
  }
  switch (pdg) {
    case 2: {
      const b = 3 + 0.15 * L
      return 2 * x ** 0.7 * (1 - x) ** b / beta(0.7, b + 1) + ubar
    }
    case 1: {
      const b = 4 + 0.15 * L
      return x ** 0.7 * (1 - x) ** b / beta(0.7, b + 1) + dbar
    }
    case -2: return ubar
    case -1: return dbar
    case 3: case -3: return 0.25 * (ubar + dbar)
    case 4: case -4: return heavy(scheme.massesGeV.charm, 4)
    case 5: case -5: return heavy(scheme.massesGeV.bottom, 5)
    case 6: case -6: return heavy(scheme.massesGeV.top, 6)
    case 21: return 1.7 * x ** (-0.2 - 0.03 * L) * (1 - x) ** 5
    default: return 0
  }
}

/** Options of {@link toyErrorSet}. */
export interface ToySetOptions {
  kind: SetKind
  /** Eigenvectors (Hessian) or replicas. */
  errorMembers: number
  x: Float64Array
  q2: Float64Array
  scheme: FlavourScheme
  /** Seed of the replicas' normal deviates (random.ts, stream { purpose: 'toy-sets', index: 0 }), default 1. */
  seed?: number
  name?: string
  /** Size of each eigenvector's relative variation, default 0.03. */
  amplitude?: number
  /**
   * What the set holds: parton densities ({@link toyXf}, the default) or fragmentation functions
   * into one hadron ({@link toyZD}, with x read as z).
   */
  density?: SetDensity
}

/**
 * A TOY error set on the given grid: member 0 is {@link toyXf}; eigenvector k multiplies every
 * density by 1 ± δ_k with δ_k = amplitude · cos(k (ln x)/3 + 0.7 k · slot) (a smooth, flavour-
 * dependent pattern); one-sided members use + only; replicas are central × (1 + Σ_k z_rk δ_k/√N)
 * over N = 4 patterns with seeded normal z, and member 0 is then replaced by the replica mean.
 * Provenance says TOY. Deterministic for a given seed.
 * @example toyErrorSet({ kind: 'hessian-pairs', errorMembers: 4, x, q2, scheme }).members.length // 9
 */
export function toyErrorSet(options: ToySetOptions): ErrorSet {
  const { x, q2, scheme, kind } = options
  const flavours = toyFlavours(scheme.nf === 6 ? 5 : scheme.nf)
  const nx = x.length
  const nq = q2.length
  const nf = flavours.length
  const amplitude = options.amplitude ?? 0.03
  const density = options.density
  const value = density?.type === 'fragmentation'
    ? (pdg: Pdg, z: number, q: number) => toyZD(density.hadron, pdg, z, q, scheme)
    : (pdg: Pdg, xv: number, q: number) => toyXf(pdg, xv, q, scheme)
  const central = new Float64Array(nx * nq * nf)
  // Threshold duplicates: the lower copy of a repeated node takes the value from below.
  for (let iq = 0; iq < nq; iq++) {
    const below = iq + 1 < nq && q2[iq + 1] === q2[iq]
    const q = below ? q2[iq]! * (1 - 1e-12) : q2[iq]!
    for (let ix = 0; ix < nx; ix++) {
      for (let s = 0; s < nf; s++) central[(iq * nx + ix) * nf + s] = value(flavours[s]!, x[ix]!, q)
    }
  }
  const pattern = (k: number, out: Float64Array) => {
    for (let iq = 0; iq < nq; iq++) {
      for (let ix = 0; ix < nx; ix++) {
        const lx = Math.log(x[ix]!)
        for (let s = 0; s < nf; s++) out[(iq * nx + ix) * nf + s] = amplitude * Math.cos(k * lx / 3 + 0.7 * k * s)
      }
    }
    return out
  }
  const members: Float64Array[] = [central]
  const n = options.errorMembers
  if (kind === 'replicas') {
    const draws = 4
    const deltas = Array.from({ length: draws }, (_, k) => pattern(k + 1, new Float64Array(central.length)))
    const gen = normalStream(options.seed ?? 1, { purpose: 'toy-sets', index: 0 })
    const z = () => gen.next()
    const sum = new Float64Array(central.length)
    for (let r = 0; r < n; r++) {
      const coeffs = Array.from({ length: draws }, () => z() / Math.sqrt(draws))
      const m = new Float64Array(central.length)
      for (let t = 0; t < m.length; t++) {
        let f = 1
        for (let k = 0; k < draws; k++) f += coeffs[k]! * deltas[k]![t]!
        m[t] = central[t]! * f
        sum[t]! += m[t]!
      }
      members.push(m)
    }
    if (n > 0) {
      const mean = new Float64Array(central.length)
      for (let t = 0; t < mean.length; t++) mean[t] = sum[t]! / n
      members[0] = mean
    }
  } else {
    const delta = new Float64Array(central.length)
    for (let k = 1; k <= n; k++) {
      pattern(k, delta)
      const signs = kind === 'hessian-pairs' ? [1, -1] : [1]
      for (const sign of signs) {
        const m = new Float64Array(central.length)
        for (let t = 0; t < m.length; t++) m[t] = central[t]! * (1 + sign * delta[t]!)
        members.push(m)
      }
    }
  }
  const header: SetHeader = {
    name: options.name ?? `toy-${kind}`,
    family: 'sheaf-toy',
    version: '1',
    kind,
    confidenceLevelPercent: 68,
    alphasMzCentral: 0.118,
    order: 'LO',
    scheme,
    target: density?.type === 'fragmentation' ? { ...NO_TARGET } : { type: 'proton' },
    provenance: density?.type === 'fragmentation'
      ? 'TOY: analytic fragmentation functions made up for demos and tests (shared/physics/sets/toy-fragmentation.ts); not a fit to data, not an evolution.'
      : 'TOY: analytic functions made up for demos and tests (shared/physics/sets/toy.ts); not a fit to data, not an evolution.',
    memberCount: members.length,
    ...(kind === 'replicas' ? { replicaCentral: 'mean' as const } : {}),
    ...(density?.type === 'fragmentation' ? { density } : {})
  }
  return { header, x, q2, flavours, members }
}
