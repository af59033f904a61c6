import type { GridAxes, PreparedAxes } from '../interpolation/axes'
import { prepareAxes } from '../interpolation/axes'
import type { OutsidePolicy } from '../interpolation/stencil'
import { interpolationStencil } from '../interpolation/stencil'
import type { CombineOp } from '../kernels/ratios'
import { combineByMember } from '../kernels/ratios'
import type { KernelContext } from '../kernels/registry'
import { kernelDefinition } from '../kernels/registry'
import type { BilinearTerm, LinearTerm } from '../kernels/terms'
import type { DensitySource, ExpandedPart, ReachIssue, StudyAxes } from './expand'
import { expandStudy } from './expand'
import type { StudySpec } from './spec'
import { resultUnit } from './spec'

/**
 * The precomputed evaluation plan of a study (see shared/physics/README.md, "Study evaluation").
 * Built once per study and grid: every quadrature point's interpolation weights are folded with the
 * kernel coefficients and the quadrature weights, so that evaluating a member is
 *  - for DIS-like kernels, a sparse dot product of the member's values with one CSR row per bin;
 *  - for hadron–hadron kernels, a sparse bilinear form. A point's value is
 *    Σ_(a,b) w_ab x₁f_a x₂f_b with x·f = Σ_{i,j} α_i β_j v(x row i, Q² node j); both partons share
 *    μ_F², so points are grouped by μ_F² and the 4-node ln Q² stencil β is applied once per group
 *    to the x rows the group needs (H_r,a = Σ_j β_j v(r, j, a)). Expanding the x stencils, a bin
 *    is Σ_{(r, r′)} M_bin[r, r′] P[r, r′] with P[r, r′] = Σ_(a,b) w_ab H_r,a H_r′,b over the row
 *    pairs (x₁ row r, x₂ row r′) that the bin's points touch, and M_bin the folded
 *    quadrature × kernel × α₁ α₂ weights. Because x₁x₂ = M²/s is fixed within a group, the row
 *    pairs form a narrow band, so P costs little and is shared by all bins of the group.
 * All arrays are typed arrays; evaluation loops over members outermost so a member's grid stays
 * in cache. The plan holds no member values and can evaluate any set on the same grid.
 */

/** CSR form of a DIS-like observable: bin b = Σ_{t ∈ [rowStart[b], rowStart[b+1])} weight[t] · member[index[t]]. */
export interface LinearPlanPart {
  kind: 'linear'
  source: DensitySource
  valuesPerMember: number
  rowStart: Int32Array
  index: Int32Array
  weight: Float64Array
}

/** Layout of one density source of a bilinear part. */
interface Side {
  source: DensitySource
  nx: number
  nf: number
  valuesPerMember: number
}

/** Sparse bilinear form of a hadron–hadron observable (see the module comment). */
export interface BilinearPlanPart {
  kind: 'bilinear'
  source1: DensitySource
  source2: DensitySource
  /** One side when both beams read the same set, else [beam 1, beam 2]. */
  sides: Side[]
  nGroups: number
  /** Per group × side: first Q² node, node count, 4 weights, first x row, row count. */
  groupQ2Start: Int32Array
  groupQ2Count: Int32Array
  groupQ2Weight: Float64Array
  groupRowLo: Int32Array
  groupRowCount: Int32Array
  /** Row pairs of group g: [groupPairStart[g], groupPairStart[g+1]). */
  groupPairStart: Int32Array
  /** x₁ row (relative to the group's first beam-1 row) and x₂ row (relative to the beam-2 side's first row) of each pair. */
  pairRow1: Int32Array
  pairRow2: Int32Array
  pairPattern: Int32Array
  /** Bin b = Σ_{t ∈ [binStart[b], binStart[b+1])} binWeight[t] · P[binPair[t]]. */
  binStart: Int32Array
  binPair: Int32Array
  binWeight: Float64Array
  /** Flavour-pair patterns: entries [patternStart[p], patternStart[p+1]) of (slot A on beam 1's side, slot B on beam 2's side, weight W). */
  patternStart: Int32Array
  patternA: Int32Array
  patternB: Int32Array
  patternW: Float64Array
  maxRowsTimesNf: number[]
}

export type PlanPart = LinearPlanPart | BilinearPlanPart

/** A precomputed evaluation plan. */
export interface Plan {
  kernel: string
  nBins: number
  /** Unit of the results (resultUnit of the spec). */
  unit: string
  parts: PlanPart[]
  op?: CombineOp
  /** Bins with points outside a grid that were frozen at the edge (outside: 'freeze'). */
  outsideBins: ReachIssue[]
  /** Total quadrature points (for reporting). */
  points: number
  /**
   * For kernels ∝ α_s(μ_R²)^power (gg → H): μ_R² in GeV², the central α_s(μ_R²) folded into the
   * weights, and each part's power (0 for parts without α_s). evaluatePlan rescales member k by
   * (α_s,k(μ_R²)/reference)^power when given the members' α_s functions.
   */
  alphas?: { mu2GeV2: number, reference: number, powers: number[] }
}

/** Options of {@link evaluatePlan}. */
export interface EvaluateOptions {
  /**
   * α_s(μ²) of each main-set member passed to evaluatePlan (same order and length), so that a
   * kernel with α_s runs each member with its own α_s(M_Z) (memberAlphasFunctions). Without it
   * every member uses the central α_s the plan was built with.
   */
  memberAlphas?: ReadonlyArray<(q2GeV2: number) => number>
}

/** Options of {@link buildPlan}. */
export interface PlanOptions extends KernelContext {
  /** Grid of the second set (beam 2 of pA, or the nuclear set of a nuclear ratio). */
  second?: GridAxes
  /** 'error' (default): a RangeError listing unreachable bins; 'freeze': edge values, reported in outsideBins. */
  outside?: OutsidePolicy
}

/** Thrown when bins are out of reach; `issues` lists each bin with its message. */
export class StudyReachError extends RangeError {
  readonly issues: ReachIssue[]
  constructor(issues: ReachIssue[]) {
    super(issues.length === 1 ? issues[0]!.message : `${issues[0]!.message} (and ${issues.length - 1} more bin${issues.length > 2 ? 's' : ''} out of reach)`)
    this.name = 'StudyReachError'
    this.issues = issues
  }
}

/** CSR arrays of sparse rows given as (column → weight) maps, columns sorted within each row. */
function toCsr(rows: ReadonlyArray<Map<number, number>>): { rowStart: Int32Array, index: Int32Array, weight: Float64Array } {
  const rowStart = new Int32Array(rows.length + 1)
  const index: number[] = []
  const weight: number[] = []
  rows.forEach((row, b) => {
    for (const [column, w] of [...row.entries()].sort((u, v) => u[0] - v[0])) {
      index.push(column)
      weight.push(w)
    }
    rowStart[b + 1] = index.length
  })
  return { rowStart, index: Int32Array.from(index), weight: Float64Array.from(weight) }
}

function buildLinear(part: ExpandedPart, axes: PreparedAxes, outside: OutsidePolicy): LinearPlanPart {
  const rows = part.bins.map((bin) => {
    const acc = new Map<number, number>()
    bin.terms.forEach((t, i) => {
      const term = t as LinearTerm
      const c = bin.weights[i]! * term.factor
      if (c === 0) return
      const s = interpolationStencil(axes, term.x, term.mu2GeV2, { outside })
      for (const [pdg, w] of term.weights) {
        const slot = axes.flavourSlot.get(pdg)
        if (slot === undefined || w === 0) continue
        for (let j = 0; j < s.q2Count; j++) {
          for (let k = 0; k < s.xCount; k++) {
            const index = ((s.q2Start + j) * axes.nx + s.xStart + k) * axes.nf + slot
            acc.set(index, (acc.get(index) ?? 0) + c * w * s.q2Weights[j]! * s.xWeights[k]!)
          }
        }
      }
    })
    return acc
  })
  return { kind: 'linear', source: part.source1, valuesPerMember: axes.nx * axes.nq * axes.nf, ...toCsr(rows) }
}

function buildBilinear(part: ExpandedPart, prepared: Record<DensitySource, PreparedAxes | undefined>, outside: OutsidePolicy): BilinearPlanPart {
  const sameSide = part.source1 === part.source2
  const sideAxes = sameSide ? [prepared[part.source1]!] : [prepared[part.source1]!, prepared[part.source2]!]
  const side1 = 0
  const side2 = sameSide ? 0 : 1
  const S = sideAxes.length
  const ax1 = sideAxes[side1]!
  const ax2 = sideAxes[side2]!

  // Flavour-pair patterns on grid slots, deduplicated by content.
  const patternIds = new Map<string, number>()
  const patternStart: number[] = [0]
  const patternA: number[] = []
  const patternB: number[] = []
  const patternW: number[] = []
  const patternOf = (term: BilinearTerm): number => {
    const entries: Array<[number, number, number]> = []
    for (const { a, b, w } of term.pairs) {
      const sa = ax1.flavourSlot.get(a)
      const sb = ax2.flavourSlot.get(b)
      if (sa !== undefined && sb !== undefined && w !== 0) entries.push([sa, sb, w])
    }
    const key = entries.map(e => e.join(',')).join(';')
    const known = patternIds.get(key)
    if (known !== undefined) return known
    for (const [a, b, w] of entries) {
      patternA.push(a)
      patternB.push(b)
      patternW.push(w)
    }
    const id = patternStart.length - 1
    patternStart.push(patternA.length)
    patternIds.set(key, id)
    return id
  }

  // Points grouped by μ_F²: each point's x stencils on both beams, its weight and bin.
  interface PointRec { s1: ReturnType<typeof interpolationStencil>, s2: ReturnType<typeof interpolationStencil>, pattern: number, weight: number, bin: number }
  const groups = new Map<number, PointRec[]>()
  part.bins.forEach((bin, b) => {
    bin.terms.forEach((t, i) => {
      const term = t as BilinearTerm
      const weight = bin.weights[i]! * term.factor
      if (weight === 0) return
      const pattern = patternOf(term)
      if (patternStart[pattern + 1] === patternStart[pattern]) return
      let list = groups.get(term.mu2GeV2)
      if (!list) {
        list = []
        groups.set(term.mu2GeV2, list)
      }
      list.push({
        s1: interpolationStencil(ax1, term.x1, term.mu2GeV2, { outside }),
        s2: interpolationStencil(ax2, term.x2, term.mu2GeV2, { outside }),
        pattern,
        weight,
        bin: b
      })
    })
  })

  const nGroups = groups.size
  const groupQ2Start = new Int32Array(nGroups * S)
  const groupQ2Count = new Int32Array(nGroups * S)
  const groupQ2Weight = new Float64Array(nGroups * S * 4)
  const groupRowLo = new Int32Array(nGroups * S)
  const groupRowCount = new Int32Array(nGroups * S)
  const groupPairStart = new Int32Array(nGroups + 1)
  const pairRow1: number[] = []
  const pairRow2: number[] = []
  const pairPattern: number[] = []
  const maxRowsTimesNf = sideAxes.map(() => 0)
  // Per bin: global pair index → folded weight.
  const binAcc = part.bins.map(() => new Map<number, number>())

  let g = 0
  for (const [mu2, list] of groups) {
    const lo = sideAxes.map(() => Number.MAX_SAFE_INTEGER)
    const hi = sideAxes.map(() => -1)
    for (const rec of list) {
      lo[side1] = Math.min(lo[side1]!, rec.s1.xStart)
      hi[side1] = Math.max(hi[side1]!, rec.s1.xStart + rec.s1.xCount - 1)
      lo[side2] = Math.min(lo[side2]!, rec.s2.xStart)
      hi[side2] = Math.max(hi[side2]!, rec.s2.xStart + rec.s2.xCount - 1)
    }
    for (let side = 0; side < S; side++) {
      const ax = sideAxes[side]!
      const q = interpolationStencil(ax, ax.x[0]!, mu2, { outside })
      const k = g * S + side
      groupQ2Start[k] = q.q2Start
      groupQ2Count[k] = q.q2Count
      for (let j = 0; j < 4; j++) groupQ2Weight[k * 4 + j] = q.q2Weights[j]!
      groupRowLo[k] = lo[side]!
      groupRowCount[k] = hi[side]! - lo[side]! + 1
      maxRowsTimesNf[side] = Math.max(maxRowsTimesNf[side]!, groupRowCount[k]! * ax.nf)
    }
    groupPairStart[g] = pairRow1.length
    const pairIndex = new Map<number, number>()
    const width = groupRowCount[g * S + side2]!
    const lo1 = groupRowLo[g * S + side1]!
    const lo2 = groupRowLo[g * S + side2]!
    for (const rec of list) {
      const acc = binAcc[rec.bin]!
      for (let i = 0; i < rec.s1.xCount; i++) {
        const r1 = rec.s1.xStart + i - lo1
        const w1 = rec.weight * rec.s1.xWeights[i]!
        for (let j = 0; j < rec.s2.xCount; j++) {
          const r2 = rec.s2.xStart + j - lo2
          const key = (rec.pattern * 4096 + r1) * width + r2
          let q = pairIndex.get(key)
          if (q === undefined) {
            q = pairRow1.length
            pairRow1.push(r1)
            pairRow2.push(r2)
            pairPattern.push(rec.pattern)
            pairIndex.set(key, q)
          }
          acc.set(q, (acc.get(q) ?? 0) + w1 * rec.s2.xWeights[j]!)
        }
      }
    }
    g++
  }
  groupPairStart[nGroups] = pairRow1.length

  const bins = toCsr(binAcc)

  return {
    kind: 'bilinear',
    source1: part.source1,
    source2: part.source2,
    sides: sideAxes.map((ax, i) => ({ source: i === 0 ? part.source1 : part.source2, nx: ax.nx, nf: ax.nf, valuesPerMember: ax.nx * ax.nq * ax.nf })),
    nGroups,
    groupQ2Start,
    groupQ2Count,
    groupQ2Weight,
    groupRowLo,
    groupRowCount,
    groupPairStart,
    pairRow1: Int32Array.from(pairRow1),
    pairRow2: Int32Array.from(pairRow2),
    pairPattern: Int32Array.from(pairPattern),
    binStart: bins.rowStart,
    binPair: bins.index,
    binWeight: bins.weight,
    patternStart: Int32Array.from(patternStart),
    patternA: Int32Array.from(patternA),
    patternB: Int32Array.from(patternB),
    patternW: Float64Array.from(patternW),
    maxRowsTimesNf
  }
}

/**
 * Builds the evaluation plan of a validated study on a set's grid axes (and, for pA collisions
 * or nuclear ratios, a second set's axes). Cost: one interpolation stencil per distinct
 * quadrature point. Bins out of reach throw a {@link StudyReachError} listing them; with
 * `outside: 'freeze'` grid-reach problems are frozen at the grid edge and listed in
 * `plan.outsideBins` (points beyond the kinematic limit always throw). Kernels needing α_s
 * take `options.alphas`.
 * @example const plan = buildPlan(parseStudySpec(doc), set) // then evaluatePlan(plan, set.members)
 */
export function buildPlan(spec: StudySpec, axes: GridAxes, options: PlanOptions = {}): Plan {
  const outside = options.outside ?? 'error'
  const studyAxes: StudyAxes = { main: axes, second: options.second }
  const expanded = expandStudy(spec, studyAxes, options)
  const fatal = expanded.issues.filter(i => i.kind === 'kinematics' || outside === 'error')
  if (fatal.length > 0) throw new StudyReachError(fatal)
  const prepared: Record<DensitySource, PreparedAxes | undefined> = {
    main: prepareAxes(axes),
    second: options.second ? prepareAxes(options.second) : undefined
  }
  let points = 0
  const parts = expanded.parts.map((part) => {
    for (const bin of part.bins) points += bin.terms.length
    return part.kind === 'linear' ? buildLinear(part, prepared[part.source1]!, outside) : buildBilinear(part, prepared, outside)
  })
  return {
    kernel: spec.kernel,
    nBins: expanded.nBins,
    unit: resultUnit(spec),
    parts,
    op: expanded.op,
    outsideBins: expanded.issues,
    points,
    ...planAlphas(spec, expanded.parts, options)
  }
}

/** The α_s scaling record of a plan (see Plan.alphas), or nothing when no part has α_s. */
function planAlphas(spec: StudySpec, parts: ExpandedPart[], options: PlanOptions): { alphas?: Plan['alphas'] } {
  let mu2GeV2 = 0
  const powers = parts.map((part) => {
    const def = kernelDefinition(part.kernel)
    if (def.composite || !def.alphasScaling) return 0
    mu2GeV2 = def.alphasScaling.mu2GeV2(spec.options, spec.renormalisationScaleFactor ?? 1)
    return def.alphasScaling.power
  })
  if (!powers.some(p => p !== 0) || !options.alphas) return {}
  return { alphas: { mu2GeV2, reference: options.alphas(mu2GeV2), powers } }
}

type Members = readonly Float64Array[]

function pairing(n1: number, n2: number): number {
  if (n1 === 0 || n2 === 0) throw new RangeError('no members to evaluate: give at least the central member')
  if (n1 !== n2 && n1 !== 1 && n2 !== 1) throw new RangeError(`cannot pair ${n1} members of the main set with ${n2} members of the second set: give equal counts or a single member on one side`)
  return Math.max(n1, n2)
}

function checkLength(members: Members, expected: number, which: string): void {
  members.forEach((m, k) => {
    if (m.length !== expected) throw new RangeError(`${which} member ${k} has ${m.length} values; the plan's grid needs ${expected}`)
  })
}

function evaluateLinear(part: LinearPlanPart, members: Members, nBins: number): Float64Array {
  checkLength(members, part.valuesPerMember, part.source === 'main' ? 'main-set' : 'second-set')
  const out = new Float64Array(members.length * nBins)
  for (let k = 0; k < members.length; k++) sparseRows(part.rowStart, part.index, part.weight, members[k]!, out, k * nBins, nBins)
  return out
}

/** out[base + b] = Σ_{t ∈ [rowStart[b], rowStart[b+1])} weight[t] · values[index[t]] for each row b (CSR times a vector). */
function sparseRows(rowStart: Int32Array, index: Int32Array, weight: Float64Array, values: Float64Array, out: Float64Array, base: number, rows: number): void {
  for (let b = 0; b < rows; b++) {
    let sum = 0
    const end = rowStart[b + 1]!
    for (let t = rowStart[b]!; t < end; t++) sum += weight[t]! * values[index[t]!]!
    out[base + b] = sum
  }
}

function evaluateBilinear(part: BilinearPlanPart, members1: Members, members2: Members, nBins: number): Float64Array {
  const sameSide = part.sides.length === 1
  checkLength(members1, part.sides[0]!.valuesPerMember, part.source1 === 'main' ? 'main-set' : 'second-set')
  if (!sameSide) checkLength(members2, part.sides[1]!.valuesPerMember, part.source2 === 'main' ? 'main-set' : 'second-set')
  const count = sameSide ? members1.length : pairing(members1.length, members2.length)
  const out = new Float64Array(count * nBins)
  const S = part.sides.length
  const side2 = sameSide ? 0 : 1
  const H = part.maxRowsTimesNf.map(n => new Float64Array(Math.max(1, n)))
  const h1 = H[0]!
  const h2 = H[side2]!
  const nf1 = part.sides[0]!.nf
  const nf2 = part.sides[side2]!.nf
  const P = new Float64Array(Math.max(1, part.pairRow1.length))
  const {
    groupQ2Start, groupQ2Count, groupQ2Weight, groupRowLo, groupRowCount, groupPairStart, pairRow1, pairRow2,
    pairPattern, binStart, binPair, binWeight, patternStart, patternA, patternB, patternW
  } = part
  const grids: Float64Array[] = new Array(S)
  for (let k = 0; k < count; k++) {
    grids[0] = members1[members1.length === 1 ? 0 : k]!
    if (!sameSide) grids[1] = members2[members2.length === 1 ? 0 : k]!
    for (let g = 0; g < part.nGroups; g++) {
      // 1. The group's Q² stencil on the x rows it needs, all flavours (contiguous in memory).
      for (let side = 0; side < S; side++) {
        const gk = g * S + side
        const { nx, nf } = part.sides[side]!
        const len = groupRowCount[gk]! * nf
        const h = H[side]!
        const grid = grids[side]!
        const q0 = groupQ2Start[gk]!
        const qn = groupQ2Count[gk]!
        const lo = groupRowLo[gk]!
        let w = groupQ2Weight[gk * 4]!
        let src = (q0 * nx + lo) * nf
        for (let t = 0; t < len; t++) h[t] = w * grid[src + t]!
        for (let j = 1; j < qn; j++) {
          w = groupQ2Weight[gk * 4 + j]!
          src = ((q0 + j) * nx + lo) * nf
          for (let t = 0; t < len; t++) h[t]! += w * grid[src + t]!
        }
      }
      // 2. The flavour-pair sum for each row pair the group's bins touch.
      for (let q = groupPairStart[g]!; q < groupPairStart[g + 1]!; q++) {
        const o1 = pairRow1[q]! * nf1
        const o2 = pairRow2[q]! * nf2
        const pat = pairPattern[q]!
        let sum = 0
        for (let t = patternStart[pat]!; t < patternStart[pat + 1]!; t++) sum += patternW[t]! * h1[o1 + patternA[t]!]! * h2[o2 + patternB[t]!]!
        P[q] = sum
      }
    }
    // 3. Each bin: a sparse dot product with the row-pair values.
    sparseRows(binStart, binPair, binWeight, P, out, k * nBins, nBins)
  }
  return out
}

/**
 * Rescales each row of the parts with α_s from the central α_s(μ_R²) folded into the plan to the
 * member's own: row k × (α_s,k(μ_R²)/α_s,0(μ_R²))^power; a single main member serves every row.
 */
function applyMemberAlphas(plan: Plan, values: Float64Array[], mainCount: number, memberAlphas: NonNullable<EvaluateOptions['memberAlphas']>): void {
  const { mu2GeV2, reference, powers } = plan.alphas!
  if (memberAlphas.length !== mainCount) {
    throw new RangeError(`memberAlphas has ${memberAlphas.length} α_s functions but ${mainCount} main-set members were given: pass one per member`)
  }
  const factors = memberAlphas.map((alphas, k) => {
    const a = alphas(mu2GeV2)
    if (!(a > 0) || !Number.isFinite(a)) throw new RangeError(`member ${k}: α_s(μ_R²) must be a positive number; got ${a}`)
    return a / reference
  })
  values.forEach((v, p) => {
    const power = powers[p]!
    if (power === 0) return
    const rows = v.length / plan.nBins
    for (let k = 0; k < rows; k++) {
      const f = factors[mainCount === 1 ? 0 : k]! ** power
      if (f === 1) continue
      for (let b = 0; b < plan.nBins; b++) v[k * plan.nBins + b]! *= f
    }
  })
}

function membersFor(source: DensitySource, main: Members, second: Members | undefined): Members {
  if (source === 'main') return main
  if (!second) throw new RangeError('this plan was built with a second set: pass its members as well')
  return second
}

/**
 * Evaluates a plan for every member: returns members × bins values, row-major
 * (value of member k in bin b at k·nBins + b), in the plan's unit. `second` holds the second
 * set's members when the plan was built with `second` axes; main and second members are paired
 * index by index, or a single member on one side is used with every member of the other.
 * Composites (ratios, asymmetries) are combined member by member. Cost per member: one sparse
 * dot product (DIS) or bilinear form (hadron–hadron) over the grid; see the module comment.
 * Agrees with {@link evaluateDirect} to ~1e-14 relative (tested at 1e-12).
 * @example evaluatePlan(plan, set.members)[3 * plan.nBins + 0] // member 3, bin 1
 */
export function evaluatePlan(plan: Plan, members: Members, second?: Members, options: EvaluateOptions = {}): Float64Array {
  if (members.length === 0) throw new RangeError('no members to evaluate: give at least the central member')
  const values = plan.parts.map((part) => {
    if (part.kind === 'linear') return evaluateLinear(part, membersFor(part.source, members, second), plan.nBins)
    return evaluateBilinear(part, membersFor(part.source1, members, second), membersFor(part.source2, members, second), plan.nBins)
  })
  if (plan.alphas && options.memberAlphas) applyMemberAlphas(plan, values, members.length, options.memberAlphas)
  if (plan.op === undefined) return values[0]!
  return combineByMember(values[0]!, values[1]!, plan.nBins, plan.op)
}
