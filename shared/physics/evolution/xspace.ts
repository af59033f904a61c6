/**
 * LO DGLAP evolution in x space (the engine's primary method).
 *
 * The densities F = x·f live on the nodes of an x grid, represented by piecewise Lagrange
 * polynomials in ln x (convolution.ts); the convolutions are precomputed matrices M_ij. In the
 * evolution time s = ∫ α_s/(2π) d ln μ² (alphas.ts: exact at one loop) the LO equations have a
 * constant kernel within a range of fixed n_f,
 *   ∂V_i/∂s = M_qq V_i,  ∂T_i/∂s = M_qq T_i,
 *   ∂Σ/∂s = M_qq Σ + 2n_f M_qg g,  ∂g/∂s = M_gq Σ + (M_gg + β₀/2) g,
 * (flavour-basis.ts). Because the kernel is constant, a step F → exp(hM)F is taken exactly up to
 * the order-p Taylor polynomial Σ_{k≤p} (hM)^k/k! (p = 4 is the classical Runge–Kutta rule,
 * whose truncation error on the stiff large-x modes, |λ| ≈ 2C_A|ln(1−x)| ≈ 10–30, reached 5e-5
 * at x ≈ 0.7; the default p = 6 brings it below the interpolation error everywhere),
 * with steps h ≤ `maxStep` that land on every output Q² node. At a threshold of the variable
 * scheme the heavy quark joins at zero (LO matching: every density continuous) and the basis is
 * rebuilt for n_f + 1. Fragmentation functions (direction 'timelike') use the same matrices with
 * the singlet's couplings interchanged: ∂Σ/∂s = M_qq Σ + 2n_f M_gq g, ∂g/∂s = M_qg Σ + … (timelike.ts).
 *
 * Accuracy (tests/unit/physics/evolution, against the Mellin-space solution, mellin.ts): about
 * 4e-6 relative for 1e-5 ≤ x ≤ 0.7 on the default grid (100 nodes 1e-6…0.99, degree 7, order 6,
 * h ≤ 0.03), 1e-5 at x = 0.9; degree 5 gives ~5e-5 (see shared/physics/README.md,
 * "x-space method"). Speed (`npm run bench`, part (c)): one member on 100 x × 40 Q² nodes in
 * ~13–18 ms once compiled on the project machine; in a fresh process the first member takes
 * ~30–40 ms (the JIT) after a plan of ~10–15 ms (matrices, cached per grid).
 */
import { activeFlavours, betaZero, checkScheme, flavourThresholdsGeV2, makeAlphas, strictlyBelow, strictlyBetween, type AlphasReference } from '../alphas'
import { EVOLVED_FLAVOURS, GLUON_SLOT, N_SLOTS, quarkSlots } from '../input/flavours'
import { partonName } from '../partons'
import type { FlavourScheme, MemberGrid } from '../types'
import { convolutionMatrices, type ConvolutionMatrices } from './convolution'
import { toEvolutionBasis } from './flavour-basis'
import { DEFAULT_Q2_GRID, q2Nodes, type Q2GridSpec } from './q2-grid'
import { pggDelta } from './splitting'
import type { EvolutionDirection } from './timelike'
import { DEFAULT_X_GRID, xNodes, type XGridSpec } from './x-grid'

/** What to evolve from, and onto which grid. */
export interface EvolutionSetup {
  /** Starting scale μ₀² in GeV², where the input densities are given. */
  startScaleGeV2: number
  alphas: AlphasReference
  scheme: FlavourScheme
  /** x nodes (default 100 nodes 1e-6…0.99, see x-grid.ts). */
  x?: XGridSpec
  /** Q² nodes (default 40 values μ₀²…1e8 GeV², thresholds doubled, see q2-grid.ts). */
  q2?: Q2GridSpec
  /** Lagrange interpolation degree in ln x, 3..8 (default 7). */
  interpolationDegree?: number
  /** Largest step in evolution time s (default 0.03). */
  maxStep?: number
  /** Order of the Taylor expansion of exp(hM) per step, 4..16 (default 6; 4 is classical RK4). */
  taylorOrder?: number
  /**
   * 'spacelike' (default): parton densities x·f; 'timelike': fragmentation functions z·D, whose
   * singlet couplings are interchanged (timelike.ts).
   */
  direction?: EvolutionDirection
}

type Op =
  | { kind: 'evolve', nf: number, ds: number, steps: number }
  | { kind: 'switch', nf: number }
  | { kind: 'emit', index: number }

/** A prepared evolution: grid, matrices and the step programme; reuse it for every member. */
export interface EvolutionPlan {
  readonly x: Float64Array
  readonly q2: Float64Array
  readonly flavours: number[]
  readonly setup: Readonly<EvolutionSetup>
  readonly matrices: ConvolutionMatrices
  /** n_f active at μ₀². */
  readonly nfStart: number
  readonly ops: readonly Op[]
  readonly taylorOrder: number
  readonly direction: EvolutionDirection
  /** Description of the method, for provenance strings. */
  readonly method: string
}

/**
 * Prepares an evolution: nodes, convolution matrices (cached per x grid and degree) and the
 * Runge–Kutta programme through the Q² nodes and thresholds.
 * @throws RangeError for a bad scheme, α_s reference, grid or step.
 * @example const plan = createEvolutionPlan({ startScaleGeV2: 2, alphas: { value: 0.35, scaleGeV2: 2 }, scheme })
 */
export function createEvolutionPlan(setup: EvolutionSetup): EvolutionPlan {
  checkScheme(setup.scheme)
  const degree = setup.interpolationDegree ?? 7
  const maxStep = setup.maxStep ?? 0.03
  if (!(maxStep > 0 && maxStep <= 0.1)) throw new RangeError(`maxStep must be in (0, 0.1] (evolution time s); got ${maxStep}`)
  const taylorOrder = setup.taylorOrder ?? 6
  if (!Number.isInteger(taylorOrder) || taylorOrder < 4 || taylorOrder > 16) throw new RangeError(`taylorOrder must be an integer 4..16; got ${taylorOrder}`)
  const x = xNodes(setup.x ?? DEFAULT_X_GRID)
  const q2 = q2Nodes(setup.q2 ?? DEFAULT_Q2_GRID, setup.startScaleGeV2, setup.scheme)
  const matrices = convolutionMatrices(x, degree)
  const alphas = makeAlphas(setup.alphas, setup.scheme)
  const thresholds = flavourThresholdsGeV2(setup.scheme).filter(t => strictlyBetween(t, setup.startScaleGeV2, Infinity))
  const nfStart = activeFlavours(setup.startScaleGeV2, setup.scheme)
  // `thresholds` holds the thresholds not yet switched on, ascending; `current` never passes one
  // of them, but may sit on it (a node exactly at m_h², whose value is the n_f side below it).
  const ops: Op[] = []
  let nf = nfStart
  let current = setup.startScaleGeV2
  const leg = (to: number) => {
    if (to <= current) return
    const ds = (2 / betaZero(nf)) * Math.log(alphas(current) / alphas(to))
    ops.push({ kind: 'evolve', nf, ds, steps: Math.max(1, Math.ceil(ds / maxStep - 1e-9)) })
    current = to
  }
  for (let iq = 0; iq < q2.length; iq++) {
    const target = q2[iq]!
    if (iq > 0 && q2[iq - 1] === target) {
      nf += 1
      ops.push({ kind: 'switch', nf })
      thresholds.shift()
    } else {
      // Every pending threshold below the target is crossed on the way, including one that the
      // previous node sits on (leg() is then empty): the heavy quark joins there at zero.
      while (thresholds.length > 0 && strictlyBelow(thresholds[0]!, target)) {
        const t = thresholds.shift()!
        leg(t)
        nf += 1
        ops.push({ kind: 'switch', nf })
      }
      leg(target)
    }
    ops.push({ kind: 'emit', index: iq })
  }
  const direction = setup.direction ?? 'spacelike'
  if (direction !== 'spacelike' && direction !== 'timelike') throw new RangeError(`direction must be 'spacelike' or 'timelike'; got ${String(direction)}`)
  const method = `LO ${direction === 'timelike' ? 'timelike (fragmentation) ' : ''}x-space DGLAP: Lagrange degree ${degree} in ln x on ${x.length} nodes, order-${taylorOrder} Taylor steps of exp(hM) in evolution time (h ≤ ${maxStep}), one-loop α_s`
  return { x, q2, flavours: [...EVOLVED_FLAVOURS], setup, matrices, nfStart, ops, taylorOrder, direction, method }
}

/**
 * Working state in the evolution basis: the non-singlet stack column-major [v·n + k] with Σ
 * last, and g. The T_i sum to zero (Σ_i T_i = Σ − n_f·Σ/n_f), an identity the evolution keeps
 * because every T_i evolves with the same P_qq, so T_1 is not carried but rebuilt as −Σ_{i>1} T_i.
 */
interface State {
  nf: number
  /** Which basis vectors are carried (V_1..V_nf, T_2..T_nf); zero ones are skipped. */
  carried: { type: 'V' | 'T', flavour: number }[]
  stack: Float64Array
  gluon: Float64Array
}

function toState(slots: Float64Array[], nf: number, n: number): State {
  const b = toEvolutionBasis(slots, nf)
  const carried: State['carried'] = []
  const vecs: Float64Array[] = []
  for (let q = 1; q <= nf; q++) {
    if (b.valence[q - 1]!.some(v => v !== 0)) { carried.push({ type: 'V', flavour: q }); vecs.push(b.valence[q - 1]!) }
    if (q > 1 && b.tplus[q - 1]!.some(v => v !== 0)) { carried.push({ type: 'T', flavour: q }); vecs.push(b.tplus[q - 1]!) }
  }
  vecs.push(b.sigma)
  const stack = new Float64Array(n * vecs.length)
  vecs.forEach((vec, v) => stack.set(vec, v * n))
  return { nf, carried, stack, gluon: b.gluon }
}

/**
 * Writes x·f of the 13 slots at the n x nodes into out[base + ix·13 + slot], from the state:
 * q_i + q̄_i = T_i + Σ/n_f, q_i = (q_i + q̄_i + V_i)/2, q̄_i = (q_i + q̄_i − V_i)/2 (as
 * fromEvolutionBasis); flavours above n_f are left as they are in `out` (zero in a fresh array).
 */
function writeSlots(state: State, n: number, out: Float64Array, base: number): void {
  const slotCount = N_SLOTS
  const gluonSlot = GLUON_SLOT
  const { nf, carried, stack, gluon } = state
  const sigBase = carried.length * n
  // Column of V_q and of T_q in the stack, −1 when zero (not carried); T_1 = −Σ_{q>1} T_q.
  const vCol = new Int32Array(nf + 1).fill(-1)
  const tCol = new Int32Array(nf + 1).fill(-1)
  carried.forEach((c, v) => { (c.type === 'V' ? vCol : tCol)[c.flavour] = v * n })
  const quarkSlot = new Int32Array(nf + 1)
  const antiSlot = new Int32Array(nf + 1)
  for (let q = 1; q <= nf; q++) ({ quark: quarkSlot[q], anti: antiSlot[q] } = quarkSlots(q))
  for (let ix = 0; ix < n; ix++) {
    const row = base + ix * slotCount
    const sigmaPart = stack[sigBase + ix]! / nf
    let tSum = 0
    for (let q = 2; q <= nf; q++) if (tCol[q]! >= 0) tSum += stack[tCol[q]! + ix]!
    for (let q = 1; q <= nf; q++) {
      const t = q === 1 ? -tSum : tCol[q]! >= 0 ? stack[tCol[q]! + ix]! : 0
      const v = vCol[q]! >= 0 ? stack[vCol[q]! + ix]! : 0
      const plus = t + sigmaPart
      out[row + quarkSlot[q]!] = 0.5 * (plus + v)
      out[row + antiSlot[q]!] = 0.5 * (plus - v)
    }
    out[row + gluonSlot] = gluon[ix]!
  }
}

function toSlots(state: State, n: number): Float64Array[] {
  const flat = new Float64Array(n * N_SLOTS)
  writeSlots(state, n, flat, 0)
  return Array.from({ length: N_SLOTS }, (_, slot) => {
    const col = new Float64Array(n)
    for (let ix = 0; ix < n; ix++) col[ix] = flat[ix * N_SLOTS + slot]!
    return col
  })
}

/**
 * out = M·in for the coupled system. The non-singlet stack holds w columns of n values
 * (column-major, [v·n + k]) with Σ last; each matrix row is read once per column from cache and
 * every dot product runs over contiguous memory. `up` is the Σ ← g matrix (times 2n_f) and
 * `down` the g ← Σ matrix: P_qg and P_gq spacelike, P_gq and P_qg timelike (timelike.ts).
 */
function applyKernel(m: ConvolutionMatrices, up: Float64Array, down: Float64Array, nf: number, w: number, stackIn: Float64Array, gIn: Float64Array, stackOut: Float64Array, gOut: Float64Array): void {
  const n = m.x.length
  const twoNf = 2 * nf
  const delta = pggDelta(nf)
  const { qq, gg, rowStart } = m
  const sigBase = (w - 1) * n
  for (let i = 0; i < n; i++) {
    const row = i * n
    const k0 = rowStart[i]!
    let v = 0
    // Four columns per sweep share each load of the matrix row.
    for (; v + 3 < w; v += 4) {
      const b0 = v * n
      const b1 = b0 + n
      const b2 = b1 + n
      const b3 = b2 + n
      let a0 = 0
      let a1 = 0
      let a2 = 0
      let a3 = 0
      for (let k = k0; k < n; k++) {
        const a = qq[row + k]!
        a0 += a * stackIn[b0 + k]!
        a1 += a * stackIn[b1 + k]!
        a2 += a * stackIn[b2 + k]!
        a3 += a * stackIn[b3 + k]!
      }
      stackOut[b0 + i] = a0
      stackOut[b1 + i] = a1
      stackOut[b2 + i] = a2
      stackOut[b3 + i] = a3
    }
    for (; v < w; v++) {
      const base = v * n
      let acc = 0
      for (let k = k0; k < n; k++) acc += qq[row + k]! * stackIn[base + k]!
      stackOut[base + i] = acc
    }
    let sq = 0
    let gAcc = 0
    for (let k = k0; k < n; k++) {
      const gk = gIn[k]!
      sq += up[row + k]! * gk
      gAcc += down[row + k]! * stackIn[sigBase + k]! + gg[row + k]! * gk
    }
    stackOut[sigBase + i]! += twoNf * sq
    gOut[i] = gAcc + delta * gIn[i]!
  }
}

function evolveState(m: ConvolutionMatrices, direction: EvolutionDirection, state: State, ds: number, steps: number, order: number): void {
  const n = m.x.length
  const up = direction === 'timelike' ? m.gq : m.qg
  const down = direction === 'timelike' ? m.qg : m.gq
  const w = state.carried.length + 1
  const h = ds / steps
  const coef: number[] = []
  for (let k = 1, c = 1; k <= order; k++) { c *= h / k; coef.push(c) }
  const bufS = [new Float64Array(n * w), new Float64Array(n * w)]
  const bufG = [new Float64Array(n), new Float64Array(n)]
  for (let step = 0; step < steps; step++) {
    let inS = state.stack
    let inG = state.gluon
    const newS = Float64Array.from(state.stack)
    const newG = Float64Array.from(state.gluon)
    for (let k = 0; k < order; k++) {
      const outS = bufS[k % 2]!
      const outG = bufG[k % 2]!
      applyKernel(m, up, down, state.nf, w, inS, inG, outS, outG)
      const c = coef[k]!
      for (let j = 0; j < newS.length; j++) newS[j]! += c * outS[j]!
      for (let j = 0; j < n; j++) newG[j]! += c * outG[j]!
      inS = outS
      inG = outG
    }
    state.stack = newS
    state.gluon = newG
  }
}

/**
 * Evolves one member from its x·f values at μ₀² on the plan's x nodes to a MemberGrid.
 * @param initialXf x·f at μ₀², `initialXf[ix·13 + slot]` (EVOLVED_FLAVOURS order), as
 * `evaluateXf` returns it.
 * @returns a MemberGrid with flavours −6…6 (no 0) and 21; inactive heavy flavours are zero.
 * @throws RangeError for a wrong length, a non-finite value, or a non-zero density of a flavour
 * that is not active at μ₀².
 * @example evolveMember(plan, evaluateXf(bindParameters(model), plan.x))
 */
export function evolveMember(plan: EvolutionPlan, initialXf: Float64Array): MemberGrid {
  const n = plan.x.length
  const slotCount = N_SLOTS // a local: an imported binding may be a property read in the loops
  if (initialXf.length !== n * slotCount) {
    throw new RangeError(`the input needs ${n * N_SLOTS} values (${n} x nodes × ${N_SLOTS} flavours); got ${initialXf.length}`)
  }
  const slots = Array.from({ length: N_SLOTS }, (_, s) => {
    const col = new Float64Array(n)
    for (let ix = 0; ix < n; ix++) {
      const v = initialXf[ix * slotCount + s]!
      if (!Number.isFinite(v)) throw new RangeError(`input x·${partonName(EVOLVED_FLAVOURS[s]!)} at x = ${plan.x[ix]} is ${v}`)
      col[ix] = v
    }
    return col
  })
  EVOLVED_FLAVOURS.forEach((pdg, s) => {
    const q = Math.abs(pdg)
    if (pdg !== 21 && q > plan.nfStart && slots[s]!.some(v => v !== 0)) {
      throw new RangeError(`flavour ${partonName(pdg)} is not active at μ₀² = ${plan.setup.startScaleGeV2} GeV² (n_f = ${plan.nfStart}) but its input density is not zero`)
    }
  })
  const nq = plan.q2.length
  const values = new Float64Array(nq * n * slotCount)
  let state = toState(slots, plan.nfStart, n)
  for (const op of plan.ops) {
    if (op.kind === 'evolve') {
      evolveState(plan.matrices, plan.direction, state, op.ds, op.steps, plan.taylorOrder)
    } else if (op.kind === 'switch') {
      state = toState(toSlots(state, n), op.nf, n)
    } else {
      writeSlots(state, n, values, op.index * n * slotCount)
    }
  }
  return { x: Float64Array.from(plan.x), q2: Float64Array.from(plan.q2), flavours: [...plan.flavours], values }
}
