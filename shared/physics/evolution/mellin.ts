/**
 * LO evolution in Mellin space: the engine's independent second method, used to check the
 * x-space evolution (and available to callers who need a few points very precisely).
 *
 * Per moment N the LO solution is exact: within a range of fixed n_f and evolution time s
 * (alphas.ts), non-singlets V_i, T_i are multiplied by e^{s γ_qq(N)} and the singlet (Σ, g) by
 * the 2×2 exponential exp(sΓ), Γ = [[γ_qq, 2n_f γ_qg], [γ_gq, γ_gg]], evaluated as
 * e^{s(a+d)/2}[cosh(sr) 𝟙 + sinh(sr)/r (Γ − (a+d)/2 𝟙)], r² = ((a−d)/2)² + 2n_f γ_qg γ_gq.
 * Timelike (fragmentation functions): Γ = [[γ_qq, 2n_f γ_gq], [γ_qg, γ_gg]] (timelike.ts), same r.
 * The input moments are exact Beta functions (input/moments.ts). At a threshold the heavy quark
 * joins at zero. The inverse transform
 *   f(x) = (1/π) ∫₀^∞ dt Im[e^{iφ} x^{−N(t)} f̃(N(t))],  N(t) = c + t e^{iφ},  φ = 3π/4,
 * runs along a contour right of every singularity (c = max(1.5, 1.5 − min a) for input powers
 * x^a of x·f), with 16-point Gauss–Legendre panels no longer than 4/(|ln x| sin φ) (a few
 * points per oscillation) out to where |x^{−N}| has fallen by e^{−37}.
 * Accuracy: at μ₀² it returns the input to 1e-13 (x ≤ 0.7); after evolution, doubling the points,
 * halving the panels and extending the contour change results by < 2e-8 relative for
 * 1e-7 ≤ x ≤ 0.7 and < 1e-5 at x = 0.9. Cost: ~10–20 ms per point (tests and checks, not grids).
 */
import { activeFlavours, betaZero, checkScheme, flavourThresholdsGeV2, makeAlphas, strictlyBetween, type AlphasReference } from '../alphas'
import type { BoundInput } from '../input/bind'
import { cAdd, cDiv, cExp, cMul, cScale, cSqrt, cSub, complex, type Complex } from '../input/complex'
import { flavourMomentsComplex } from '../input/evaluate'
import { N_SLOTS } from '../input/flavours'
import type { FlavourScheme } from '../types'
import { gammaGG, gammaQQ } from './anomalous-dimensions'
import { fromEvolutionBasis, toEvolutionBasis } from './flavour-basis'
import { gaussLegendre } from '../quadrature'
import { singletOffDiagonalMoments, type EvolutionDirection } from './timelike'

/** Scales and scheme of a Mellin-space evolution. */
export interface MellinSetup {
  startScaleGeV2: number
  alphas: AlphasReference
  scheme: FlavourScheme
  /** 'spacelike' (default) or 'timelike' (fragmentation functions: singlet couplings interchanged, timelike.ts). */
  direction?: EvolutionDirection
}

/** One output point: x in (0, 1) and Q² ≥ μ₀² in GeV². */
export interface MellinPoint {
  x: number
  q2GeV2: number
}

const PHI = (3 * Math.PI) / 4
const E_PHI = complex(Math.cos(PHI), Math.sin(PHI))

/** Segments of fixed n_f from μ₀² to Q²: evolution time and n_f of each. */
function segments(setup: MellinSetup, q2: number): { nf: number, s: number }[] {
  const alphas = makeAlphas(setup.alphas, setup.scheme)
  const cuts = flavourThresholdsGeV2(setup.scheme).filter(t => strictlyBetween(t, setup.startScaleGeV2, q2))
  const edges = [setup.startScaleGeV2, ...cuts, q2]
  return edges.slice(1).map((hi, i) => {
    const lo = edges[i]!
    const nf = activeFlavours(lo, setup.scheme)
    return { nf, s: (2 / betaZero(nf)) * Math.log(alphas(lo) / alphas(hi)) }
  })
}

function cCosh(w: Complex): Complex {
  const e = cExp(w)
  const ei = cExp(complex(-w.re, -w.im))
  return cScale(cAdd(e, ei), 0.5)
}

function cSinhOver(w: Complex, r: Complex, s: number): Complex {
  // sinh(w)/r with w = s·r; series near w = 0 avoids 0/0.
  if (Math.hypot(w.re, w.im) < 1e-6) return complex(s, 0)
  const e = cExp(w)
  const ei = cExp(complex(-w.re, -w.im))
  return cDiv(cScale(cSub(e, ei), 0.5), r)
}

/** Evolves the 13 slot moments at one N through the segments (in place on re/im arrays). */
function evolveMoments(n: Complex, re: Float64Array, im: Float64Array, segs: { nf: number, s: number }[], nfStart: number, direction: EvolutionDirection): void {
  const gqq = gammaQQ(n)
  let nf = nfStart
  let slotsRe: Float64Array[] = Array.from(re, v => Float64Array.of(v))
  let slotsIm: Float64Array[] = Array.from(im, v => Float64Array.of(v))
  for (const seg of segs) {
    nf = seg.nf
    const bRe = toEvolutionBasis(slotsRe, nf)
    const bIm = toEvolutionBasis(slotsIm, nf)
    const ns = cExp(cScale(gqq, seg.s))
    const mulNs = (r: Float64Array, i: Float64Array) => {
      const v = cMul(ns, complex(r[0]!, i[0]!))
      r[0] = v.re
      i[0] = v.im
    }
    for (let q = 0; q < nf; q++) {
      mulNs(bRe.valence[q]!, bIm.valence[q]!)
      mulNs(bRe.tplus[q]!, bIm.tplus[q]!)
    }
    const a = gqq
    const { b, c } = singletOffDiagonalMoments(n, nf, direction)
    const d = gammaGG(n, nf)
    const half = cScale(cAdd(a, d), 0.5)
    const diffHalf = cScale(cSub(a, d), 0.5)
    const r = cSqrt(cAdd(cMul(diffHalf, diffHalf), cMul(b, c)))
    const w = cScale(r, seg.s)
    const pre = cExp(cScale(half, seg.s))
    const ch = cCosh(w)
    const sh = cSinhOver(w, r, seg.s)
    const e11 = cMul(pre, cAdd(ch, cMul(sh, diffHalf)))
    const e22 = cMul(pre, cSub(ch, cMul(sh, diffHalf)))
    const e12 = cMul(pre, cMul(sh, b))
    const e21 = cMul(pre, cMul(sh, c))
    const sig = complex(bRe.sigma[0]!, bIm.sigma[0]!)
    const glu = complex(bRe.gluon[0]!, bIm.gluon[0]!)
    const sigNew = cAdd(cMul(e11, sig), cMul(e12, glu))
    const gluNew = cAdd(cMul(e21, sig), cMul(e22, glu))
    bRe.sigma[0] = sigNew.re
    bIm.sigma[0] = sigNew.im
    bRe.gluon[0] = gluNew.re
    bIm.gluon[0] = gluNew.im
    slotsRe = fromEvolutionBasis(bRe)
    slotsIm = fromEvolutionBasis(bIm)
  }
  for (let s = 0; s < N_SLOTS; s++) {
    re[s] = slotsRe[s]![0]!
    im[s] = slotsIm[s]![0]!
  }
}

/**
 * (1/π) ∫₀^∞ dt Im[e^{iφ} w(N) f̃(N, Q²)] along the contour for all 13 slots, where f̃ is the
 * evolved moment ∫ x^{N−1} f dx and w(N) = e^{−N ln x}·weightFactor(N): x^{−N} gives f(x),
 * x₀^{2−N}/(2 − N) gives ∫₀^{x₀} x f dx (valid for Re N < 2 on the contour).
 */
function invertAt(bound: BoundInput, setup: MellinSetup, c: number, lnx: number, segs: { nf: number, s: number }[], nfStart: number, weightFactor: (n: Complex) => Complex): Float64Array {
  const rule = gaussLegendre(16)
  const re = new Float64Array(N_SLOTS)
  const im = new Float64Array(N_SLOTS)
  const omega = Math.abs(lnx) * Math.sin(PHI)
  const tMax = Math.min(4000, 37 / omega)
  const acc = new Float64Array(N_SLOTS)
  let t0 = 0
  while (t0 < tMax) {
    const width = Math.min(Math.max(0.5, t0), 4 / omega, tMax - t0)
    const half = width / 2
    for (let q = 0; q < rule.nodes.length; q++) {
      const t = t0 + half * (1 + rule.nodes[q]!)
      const wq = half * rule.weights[q]!
      const n = complex(c + t * E_PHI.re, t * E_PHI.im)
      const m = flavourMomentsComplex(bound, n)
      re.set(m.re)
      im.set(m.im)
      if (segs.length > 0) evolveMoments(n, re, im, segs, nfStart, setup.direction ?? 'spacelike')
      // e^{iφ} x^{−N} w(N) = e^{iφ} e^{−N ln x} w(N)
      const kern = cMul(cMul(E_PHI, cExp(cScale(n, -lnx))), weightFactor(n))
      for (let s = 0; s < N_SLOTS; s++) {
        acc[s]! += wq * (kern.re * im[s]! + kern.im * re[s]!)
      }
    }
    t0 += width
  }
  for (let s = 0; s < N_SLOTS; s++) acc[s]! /= Math.PI
  return acc
}

/** The contour's real part: right of every singularity of the input moments and of N = 1. */
function contourStart(bound: BoundInput): number {
  let minA = Infinity
  for (const p of bound.pieces) for (const t of p.terms) minA = Math.min(minA, t.a)
  return Math.max(1.5, 1.5 - minA)
}

const ONE = complex(1, 0)

/**
 * x·f_i(x, Q²) of all 13 evolved flavours at each point, by exact LO evolution of the Mellin
 * moments of a bound input and numerical inversion (see the module comment).
 * @returns result[p·13 + slot] in EVOLVED_FLAVOURS order.
 * @throws RangeError for x outside (0, 1) or Q² below μ₀².
 * @example evolveMellin(bindParameters(model), setup, [{ x: 1e-3, q2GeV2: 1e4 }])[12] // x·g
 */
export function evolveMellin(bound: BoundInput, setup: MellinSetup, points: readonly MellinPoint[]): Float64Array {
  checkScheme(setup.scheme)
  const out = new Float64Array(points.length * N_SLOTS)
  const c = contourStart(bound)
  const nfStart = activeFlavours(setup.startScaleGeV2, setup.scheme)
  points.forEach((pt, ip) => {
    checkPoint(pt, setup, ip)
    const segs = pt.q2GeV2 > setup.startScaleGeV2 ? segments(setup, pt.q2GeV2) : []
    const acc = invertAt(bound, setup, c, Math.log(pt.x), segs, nfStart, () => ONE)
    for (let s = 0; s < N_SLOTS; s++) out[ip * N_SLOTS + s] = pt.x * acc[s]!
  })
  return out
}

function checkPoint(pt: MellinPoint, setup: MellinSetup, ip: number): void {
  if (!(pt.x > 0 && pt.x < 1)) throw new RangeError(`point ${ip}: x = ${pt.x} must lie in (0, 1)`)
  if (!(pt.q2GeV2 >= setup.startScaleGeV2)) throw new RangeError(`point ${ip}: Q² = ${pt.q2GeV2} GeV² lies below μ₀² = ${setup.startScaleGeV2} GeV²`)
}

/**
 * ∫₀^{x₀} x·f_i(x, Q²) dx of all 13 evolved flavours (the momentum below x₀, e.g. below a grid's
 * first node), from the same exact moments: (1/2πi) ∫ dN f̃(N, Q²) x₀^{2−N}/(2 − N) along the
 * contour, whose real part (1.5 for inputs with every a ≥ 0) lies left of the pole at N = 2.
 * Accuracy (engine tests, against hand-worked integrals at μ₀²): ~1e-9 relative for
 * x₀ ≥ 1e-4; for tiny values the error is absolute, ~1e-21 at x₀ = 1e-8 where the value is 3e-16.
 * @returns result[slot] in EVOLVED_FLAVOURS order.
 * @throws RangeError for x₀ outside (0, 1), Q² below μ₀², or an input with a term a < −0.5 (the
 * contour would have to pass right of N = 2).
 * @example momentumBelowMellin(bindParameters(model), setup, { x: 1e-8, q2GeV2: 1e4 })[12] // gluon
 */
export function momentumBelowMellin(bound: BoundInput, setup: MellinSetup, point: MellinPoint): Float64Array {
  checkScheme(setup.scheme)
  checkPoint(point, setup, 0)
  const c = contourStart(bound)
  if (!(c < 2)) throw new RangeError(`the momentum below x₀ needs every term's a ≥ −0.5 (the contour at Re N = ${c} must stay left of N = 2)`)
  const segs = point.q2GeV2 > setup.startScaleGeV2 ? segments(setup, point.q2GeV2) : []
  const lnx = Math.log(point.x)
  // x₀^{2−N}/(2 − N) = x₀^{−N} · x₀²/(2 − N)
  const x2 = point.x * point.x
  return invertAt(bound, setup, c, lnx, segs, activeFlavours(setup.startScaleGeV2, setup.scheme), n => cDiv(complex(x2, 0), complex(2 - n.re, -n.im)))
}
