import { describe, expect, it } from 'vitest'
import { gammaGG, gammaGQ, gammaQG, gammaQQ } from '~/shared/physics/evolution/anomalous-dimensions'
import { fragmentationMomentumSums } from '~/shared/physics/evolution/fragmentation-sums'
import { evolveMellin, momentumBelowMellin } from '~/shared/physics/evolution/mellin'
import { singletCouplings, singletOffDiagonalMoments } from '~/shared/physics/evolution/timelike'
import { createEvolutionPlan, evolveMember, type EvolutionSetup } from '~/shared/physics/evolution/xspace'
import { bindParameters } from '~/shared/physics/input/bind'
import { cAdd, cMul, cSub, complex } from '~/shared/physics/input/complex'
import { evaluateXf } from '~/shared/physics/input/evaluate'
import { EVOLVED_FLAVOURS } from '~/shared/physics/input/flavours'
import type { InputModel } from '~/shared/physics/input/model'
import { partonName } from '~/shared/physics/partons'
import type { FlavourScheme } from '~/shared/physics/types'
import { expectClose } from '../close'
import { TOY_MASSES, toyFragmentation, type ToyPiece } from './fragmentation-toy'

// Timelike LO evolution of fragmentation functions: ∂D_i/∂ln μ² = (α_s/2π) Σ_j P_ji ⊗ D_j, the
// transpose of the spacelike kernel in the parton indices (R. K. Ellis, W. J. Stirling, B. R.
// Webber, "QCD and Collider Physics", the fragmentation-function section of the e⁺e⁻ chapter —
// chapter and section from memory; B. R. Webber, hep-ph/9912399, sect. 2). The derivation of the
// singlet form is in shared/physics/README.md, "Timelike evolution".

const cf = 4 / 3 // C_F = (N_c² − 1)/(2N_c) with N_c = 3

describe('timelike kernel entries against the spacelike ones (hand-worked)', () => {
  it.each([
    // n_f = 4, z = 0.5: T_R[z² + (1−z)²] = 0.5·0.5 = 0.25; C_F[1 + (1−z)²]/z = (4/3)·1.25/0.5 = 10/3.
    // spacelike: Σ ← g = 2n_f·0.25 = 2, g ← Σ = 10/3; timelike: Σ ← g = 2n_f·10/3 = 80/3, g ← Σ = 0.25.
    [4, 0.5, { sigmaFromGluon: 2, gluonFromSigma: 10 / 3 }, { sigmaFromGluon: 80 / 3, gluonFromSigma: 0.25 }],
    // n_f = 3, z = 0.2: T_R[0.04 + 0.64] = 0.34; C_F[1 + 0.64]/0.2 = (4/3)·8.2 = 10.9333…
    [3, 0.2, { sigmaFromGluon: 6 * 0.34, gluonFromSigma: cf * 8.2 }, { sigmaFromGluon: 6 * cf * 8.2, gluonFromSigma: 0.34 }],
    // n_f = 5, z = 0.9: T_R[0.81 + 0.01] = 0.41; C_F[1 + 0.01]/0.9 = (4/3)·1.01/0.9 = 1.49629…
    [5, 0.9, { sigmaFromGluon: 10 * 0.41, gluonFromSigma: (cf * 1.01) / 0.9 }, { sigmaFromGluon: (10 * cf * 1.01) / 0.9, gluonFromSigma: 0.41 }]
  ])('n_f = %i, z = %f: the off-diagonal entries change places, the 2n_f stays with Σ ← g', (nf, z, space, time) => {
    const s = singletCouplings('spacelike', nf, z)
    const t = singletCouplings('timelike', nf, z)
    expectClose(s.sigmaFromGluon, space.sigmaFromGluon, 1e-14)
    expectClose(s.gluonFromSigma, space.gluonFromSigma, 1e-14)
    expectClose(t.sigmaFromGluon, time.sigmaFromGluon, 1e-14)
    expectClose(t.gluonFromSigma, time.gluonFromSigma, 1e-14)
    // Timelike Σ ← g per quark flavour equals spacelike g ← Σ: (2n_f)⁻¹ · 2n_f P_gq = P_gq.
    expectClose(t.sigmaFromGluon / (2 * nf), s.gluonFromSigma, 1e-14)
    expectClose(t.gluonFromSigma * 2 * nf, s.sigmaFromGluon, 1e-14)
  })

  it.each([3, 4, 5, 6])('n_f = %i, N = 2: momentum is conserved parton by parton, Γ_T·(2n_f, 1) = 0', (nf) => {
    // Every (anti)quark and the gluon carry momentum fraction 1 into all hadrons: D_Σ moment 2n_f,
    // D_g moment 1. Hand-worked: γ_qq(2) = −16/9, γ_gq(2) = 16/9, γ_qg(2) = 1/6, γ_gg(2) = −n_f/3, so
    // row Σ: 2n_f(−16/9) + 2n_f(16/9) = 0; row g: 2n_f/6 − n_f/3 = 0.
    const n = complex(2)
    const { b, c } = singletOffDiagonalMoments(n, nf, 'timelike')
    expectClose(b.re, 2 * nf * (16 / 9), 1e-13)
    expectClose(c.re, 1 / 6, 1e-13)
    const rowSigma = 2 * nf * gammaQQ(n).re + b.re
    const rowGluon = 2 * nf * c.re + gammaGG(n, nf).re
    expect(Math.abs(rowSigma)).toBeLessThan(1e-13)
    expect(Math.abs(rowGluon)).toBeLessThan(1e-13)
  })

  it.each([[complex(2.5, 0)], [complex(1.7, 3.2)], [complex(4, -1)]])('Γ_T has the eigenvalues of the spacelike Γ (same trace and determinant) at N = %o', (n) => {
    // det = γ_qq γ_gg − 2n_f γ_qg γ_gq for both: only the off-diagonal product enters.
    const nf = 4
    const time = singletOffDiagonalMoments(n, nf, 'timelike')
    const space = singletOffDiagonalMoments(n, nf, 'spacelike')
    const product = (m: { b: ReturnType<typeof complex>, c: ReturnType<typeof complex> }) => cMul(m.b, m.c)
    const diff = cSub(product(time), product(space))
    expect(Math.hypot(diff.re, diff.im)).toBeLessThan(1e-13 * Math.hypot(product(space).re, product(space).im))
    const expected = cMul(cMul(complex(2 * nf), gammaQG(n)), gammaGQ(n))
    const d2 = cSub(product(time), expected)
    expect(Math.hypot(d2.re, d2.im)).toBeLessThan(1e-13 * Math.hypot(expected.re, expected.im))
    expect(cAdd(time.b, time.c)).not.toEqual(cAdd(space.b, space.c))
  })

  it('is not the spacelike evolution: one input evolved both ways differs in the singlet', () => {
    const model = toyFragmentation('pi+', PI_PLUS, { type: 'fixed', nf: 3, massesGeV: TOY_MASSES })
    const base = { startScaleGeV2: 2, alphas: model.alphas, scheme: model.scheme, x: { count: 40, min: 1e-3, max: 0.99 }, q2: { nodesGeV2: [2, 100] } }
    const input = (plan: ReturnType<typeof createEvolutionPlan>) => evaluateXf(bindParameters(model), plan.x)
    const space = createEvolutionPlan(base)
    const time = createEvolutionPlan({ ...base, direction: 'timelike' })
    const a = evolveMember(space, input(space)).values
    const b = evolveMember(time, input(time)).values
    const gluon = 12
    const at = (v: Float64Array, iz: number) => v[(40 + iz) * 13 + gluon]!
    // z = 0.5-ish node: timelike g receives T_R-weighted quarks, spacelike g the C_F/z-weighted ones.
    expect(Math.abs(at(a, 20) - at(b, 20))).toBeGreaterThan(1e-3 * Math.abs(at(b, 20)))
  })
})

// The invented pion world of the sum-rule check: π⁺, π⁻, π⁰ are the only hadrons, and every
// parton's momentum goes to them in full (0.5 + 0.2 + 0.3 = 1, 0.3 + 0.3 + 0.4 = 1).
const HEAVY = [4, 5, -4, -5]
const PI_PLUS: ToyPiece[] = [
  { partons: [2, -1], momentum: 0.5, shape: 'z(1-z)^2' },
  { partons: [-2, 1], momentum: 0.2, shape: 'z(1-z)^3' },
  { partons: [3, -3], momentum: 0.3, shape: 'z(1-z)^3' },
  { partons: [21], momentum: 0.3, shape: 'z^2(1-z)^3' }
]
const PI_MINUS: ToyPiece[] = [
  { partons: [-2, 1], momentum: 0.5, shape: 'z(1-z)^2' },
  { partons: [2, -1], momentum: 0.2, shape: 'z(1-z)^3' },
  { partons: [3, -3], momentum: 0.3, shape: 'z(1-z)^3' },
  { partons: [21], momentum: 0.3, shape: 'z^2(1-z)^3' }
]
const PI_ZERO: ToyPiece[] = [
  { partons: [2, -1, -2, 1], momentum: 0.3, shape: 'z^2(1-z)^3' },
  { partons: [3, -3], momentum: 0.4, shape: 'z(1-z)^2' },
  { partons: [21], momentum: 0.4, shape: 'z(1-z)^3' }
]
const withHeavy = (pieces: ToyPiece[], momentum: number): ToyPiece[] => [...pieces, { partons: HEAVY, momentum, shape: 'z(1-z)^3' }]

function pionWorld(scheme: FlavourScheme): InputModel[] {
  const heavy = scheme.nf >= 5
  return [
    toyFragmentation('pi+', heavy ? withHeavy(PI_PLUS, 0.3) : PI_PLUS, scheme),
    toyFragmentation('pi-', heavy ? withHeavy(PI_MINUS, 0.3) : PI_MINUS, scheme),
    toyFragmentation('pi0', heavy ? withHeavy(PI_ZERO, 0.4) : PI_ZERO, scheme)
  ]
}

describe('momentum sum rule of a complete set of species under timelike evolution', () => {
  // The grid stops at z₀ = 1e-8. Timelike evolution makes z·D grow steeply at small z, so the
  // momentum below z₀ is not negligible at high Q² (up to ~5e-5 at 10⁶ GeV²) and a power law
  // through the two smallest nodes estimates it only to a few per cent. The check therefore
  // takes the part on [z₀, 1] from the x-space grid (the method under test) and the part below z₀
  // from the Mellin-space solution of the same equations (momentumBelowMellin: exact moments,
  // an independent method), and prints how far the power-law estimate is from it.
  it.each([
    ['fixed n_f = 3', { type: 'fixed', nf: 3, massesGeV: TOY_MASSES }],
    ['fixed n_f = 5 (c and b given at μ₀²)', { type: 'fixed', nf: 5, massesGeV: TOY_MASSES }]
  ] as [string, FlavourScheme][])('%s: Σ_h ∫ z D_i^h dz = 1 for every active parton to ≤ 1e-6 at Q² = μ₀², 10, 10², 10⁴, 10⁶ GeV²', (label, scheme) => {
    const models = pionWorld(scheme)
    const q2 = [2, 10, 100, 1e4, 1e6]
    const setup = { startScaleGeV2: 2, alphas: models[0]!.alphas, scheme, direction: 'timelike' as const }
    const plan = createEvolutionPlan({ ...setup, x: { count: 120, min: 1e-8, max: 0.99 }, q2: { nodesGeV2: q2 } })
    const bound = models.map(m => bindParameters(m))
    const grids = bound.map(b => evolveMember(plan, evaluateXf(b, plan.x)))
    const active = EVOLVED_FLAVOURS.map((pdg, s) => [pdg, s] as const).filter(([pdg]) => pdg === 21 || Math.abs(pdg) <= scheme.nf)
    let worst = 0
    let tailMax = 0
    let estimateMiss = 0
    q2.forEach((q, iq) => {
      const sums = fragmentationMomentumSums(grids, iq)
      const below = new Float64Array(13)
      for (const b of bound) momentumBelowMellin(b, setup, { x: plan.x[0]!, q2GeV2: q }).forEach((v, s) => { below[s]! += v })
      for (const [pdg, s] of active) {
        const total = sums.momentum[s]! - sums.tail[s]! + below[s]!
        worst = Math.max(worst, Math.abs(total - 1))
        tailMax = Math.max(tailMax, below[s]!)
        estimateMiss = Math.max(estimateMiss, Math.abs(sums.tail[s]! - below[s]!))
        expect(Math.abs(total - 1), `${partonName(pdg)} at Q² = ${q} GeV²: ${total} (below z₀: ${below[s]})`).toBeLessThanOrEqual(1e-6)
      }
    })
    console.info(`timelike momentum sums, ${label}: largest |Σ_h ∫ z D dz − 1| = ${worst.toExponential(2)} (grid part by x space, part below z = 1e-8 by Mellin, at most ${tailMax.toExponential(2)}); the power-law tail estimate differs from the Mellin tail by up to ${estimateMiss.toExponential(2)}`)
  }, 60_000)

  it('with a heavy quark joining at zero at its threshold the gluon\'s sum is no longer 1 above it (LO matching; see the physics notes)', () => {
    const scheme: FlavourScheme = { type: 'variable', nf: 5, massesGeV: TOY_MASSES }
    // μ₀² = 2 GeV² is above m_c² = 1.99996 GeV²: u, d, s, c are active; b joins at zero at 20.25 GeV².
    const models = pionWorld({ type: 'fixed', nf: 3, massesGeV: TOY_MASSES }).map(m => ({ ...m, scheme }))
    const plan = createEvolutionPlan({ startScaleGeV2: 2, alphas: models[0]!.alphas, scheme, direction: 'timelike', x: { count: 120, min: 1e-8, max: 0.99 }, q2: { nodesGeV2: [2, 1e4] } })
    const grids = models.map(m => evolveMember(plan, evaluateXf(bindParameters(m), plan.x)))
    const last = grids[0]!.q2.length - 1
    const sums = fragmentationMomentumSums(grids, last)
    // The charm and bottom input is zero, so their sums start at 0 and the gluon feeds them while
    // losing what it gave: the gluon's sum leaves 1 by far more than the numerical accuracy.
    expect(Math.abs(sums.momentum[12]! - 1)).toBeGreaterThan(1e-3)
  }, 60_000)
})

describe('x-space timelike evolution against the Mellin-space solution of the same equations', () => {
  // On every node of the grid (z and Q² above μ₀²), every flavour: |a − b| ≤ 1e-5·max(|b|, 0.1),
  // i.e. relative 1e-5 where |z·D| ≥ 0.1 and absolute 1e-6 where it is smaller (near z → 1,
  // where the values fall like (1−z)^b, and for the heavy quarks just above their threshold).
  it.each([
    ['fixed n_f = 3', { type: 'fixed', nf: 3, massesGeV: TOY_MASSES }, 'pi+'],
    ['variable flavour, c active at μ₀², b joining at 20.25 GeV²', { type: 'variable', nf: 5, massesGeV: TOY_MASSES }, 'pi0']
  ] as [string, FlavourScheme, 'pi+' | 'pi0'][])('%s (%s input)', (label, scheme, hadron) => {
    const model = toyFragmentation(hadron, hadron === 'pi+' ? PI_PLUS : PI_ZERO, { type: 'fixed', nf: 3, massesGeV: TOY_MASSES })
    const setup: EvolutionSetup = { startScaleGeV2: 2, alphas: model.alphas, scheme, direction: 'timelike', x: { count: 60, min: 1e-3, max: 0.99 }, q2: { count: 6, maxGeV2: 1e4 } }
    const plan = createEvolutionPlan(setup)
    const bound = bindParameters({ ...model, scheme })
    const grid = evolveMember(plan, evaluateXf(bound, plan.x))
    const nz = grid.x.length
    let worst = { scaled: 0, abs: 0, where: '' }
    let nodes = 0
    for (let iq = 1; iq < grid.q2.length; iq++) {
      if (grid.q2[iq] === grid.q2[iq - 1]) continue // the copy above a threshold equals the one below at LO
      const ref = evolveMellin(bound, { startScaleGeV2: 2, alphas: model.alphas, scheme, direction: 'timelike' }, Array.from(grid.x, z => ({ x: z, q2GeV2: grid.q2[iq]! })))
      for (let iz = 0; iz < nz; iz++) {
        for (let s = 0; s < 13; s++) {
          const a = grid.values[(iq * nz + iz) * 13 + s]!
          const b = ref[iz * 13 + s]!
          const scaled = Math.abs(a - b) / Math.max(Math.abs(b), 0.1)
          nodes++
          if (scaled > worst.scaled) worst = { scaled, abs: Math.abs(a - b), where: `${partonName(EVOLVED_FLAVOURS[s]!)} at z = ${grid.x[iz]!.toPrecision(4)}, Q² = ${grid.q2[iq]!.toPrecision(4)} GeV² (x space ${a.toPrecision(8)}, Mellin ${b.toPrecision(8)})` }
        }
      }
    }
    console.info(`timelike x space vs Mellin, ${label}: ${nodes} node values, largest |a − b|/max(|b|, 0.1) = ${worst.scaled.toExponential(2)} (|a − b| = ${worst.abs.toExponential(2)}, ${worst.where})`)
    expect(worst.scaled).toBeLessThanOrEqual(1e-5)
  }, 120_000)
})

describe('momentum below z₀ from Mellin space', () => {
  it.each([1e-8, 1e-4, 0.05])('at μ₀² equals the hand-worked ∫₀^{z₀} A z(1−z)² dz = A(z₀²/2 − 2z₀³/3 + z₀⁴/4) at z₀ = %f', (z0) => {
    // u in π⁺ is 0.5·12 z(1−z)² at μ₀² (PI_PLUS): A = 6.
    const model = toyFragmentation('pi+', PI_PLUS, { type: 'fixed', nf: 3, massesGeV: TOY_MASSES })
    const got = momentumBelowMellin(bindParameters(model), { startScaleGeV2: 2, alphas: model.alphas, scheme: model.scheme, direction: 'timelike' }, { x: z0, q2GeV2: 2 })
    const expected = 6 * (z0 ** 2 / 2 - (2 * z0 ** 3) / 3 + z0 ** 4 / 4)
    // Relative 1e-9, plus 1e-18 absolute: at z₀ = 1e-8 the value is 3e-16 and the contour
    // integral's error (~1e-21) is absolute rather than relative to it.
    expectClose(got[EVOLVED_FLAVOURS.indexOf(2)]!, expected, 1e-9, 1e-18)
  })
})
