/**
 * Compiling a validated input document into the engine's model of a fit: pieces with flavour
 * weights in the 13 evolved slots, terms whose coefficients are numbers or indices into the
 * parameter vector, and (for a nuclear modification) each bound-proton term as the product of a
 * baseline term and a modification term.
 */
import type { AlphasReference } from '../alphas'
import type { SetDensity } from '../fragmentation/species'
import { MZ_GEV } from '../constants'
import type { FlavourScheme, SetTarget } from '../types'
import { InputError, type InputIssue } from './errors'
import { centralTermIssues, q2GridIssues } from './feasibility'
import { N_SLOTS, slotOf } from './flavours'
import type { InputDocument } from './parse'
import {
  describeMassNumberCoefficient, isMassNumberCoefficient, nucleusProblem,
  type MassNumberRef, type ModificationCoefficientDoc, type Nucleus
} from './mass-number'
import type { GridSpec, MembersSpec, ModificationTermDoc, ParametrisedInputDoc, TermDoc } from './schema'

/**
 * A coefficient after compilation: a number, `{ param: i }` = the i-th fit parameter, or an
 * A-dependent coefficient fixed to one nucleus (mass-number.ts).
 */
export type CoefficientRef = number | { param: number } | MassNumberRef

/** One factor A·x^a·(1−x)^b·(1 + Σ c_k x^{k/2}) with compiled coefficients. */
export interface FactorRef {
  A: CoefficientRef
  a: CoefficientRef
  b: CoefficientRef
  c: CoefficientRef[]
}

/** A piece of the model: flavour weights per slot and terms, each term a product of factors. */
export interface ModelPiece {
  id: string
  /** Weight of this piece in each of the 13 evolved flavour slots (EVOLVED_FLAVOURS order). */
  weights: Float64Array
  /** Terms; each is the product of its factors (one factor for a proton input). */
  terms: FactorRef[][]
  /**
   * Where each term comes from in the document, for messages: the JSON path of the term that
   * carries its free parameters (`pieces[i].terms[k]`; for a nuclear modification
   * `modifications[m].terms[r]`, with the baseline term it multiplies in `baselineTerm`).
   */
  termSources?: TermSource[]
}

/** The document place of a compiled term (see ModelPiece.termSources). */
export interface TermSource {
  path: string
  /** For a bound-proton term: the baseline term it multiplies, e.g. `pieces[0].terms[1]`. */
  baselineTerm?: string
}

/** Indices (into `pieces`) of the pieces normalised by each sum rule. */
export interface SumRuleTargets {
  uValence?: number
  dValence?: number
  momentum?: number
}

/** A fit ready for binding parameter vectors: everything the engine needs from a document. */
export interface InputModel {
  name: string
  family: string
  version: string
  description: string
  target: SetTarget
  /** Starting scale μ₀² in GeV². */
  startScaleGeV2: number
  alphas: AlphasReference
  scheme: FlavourScheme
  parameterNames: string[]
  /** Central parameter vector, in `parameterNames` order. */
  central: Float64Array
  /** Parameter covariance (rows), when the document gives one. */
  covariance?: number[][]
  pieces: ModelPiece[]
  sumRules: SumRuleTargets
  members?: MembersSpec
  grid?: GridSpec
  /** For a nuclear modification: the baseline it multiplies. */
  baseline?: { name: string, version: string }
  /**
   * For a nuclear modification: how its coefficients depend on the nucleus, one line per
   * A-dependent coefficient ("modifications[0].terms[1].A = shadow_v·(1 + −1·A^(−1/3))"); empty
   * when the modification is the same for every nucleus.
   */
  massNumberDependence?: string[]
  /** For a nuclear modification: the nucleus its document names as target (the family's reference). */
  documentNucleus?: Nucleus
  /**
   * What the pieces describe (fragmentation/species.ts): absent for parton densities; for
   * fragmentation functions z·D_i^h the sets built say so and evolve with the timelike kernels.
   */
  density?: SetDensity
}

/** Options of compileInput. */
export interface CompileOptions {
  /**
   * For a nuclear modification: the nucleus to build for (default: the document's target). The
   * A-dependent coefficients are evaluated for it, and the model's target is it.
   */
  nucleus?: Nucleus
}

function compileCoefficient(v: number | string, index: Map<string, number>, fixed: Map<string, number>): CoefficientRef {
  if (typeof v === 'number') return v
  const i = index.get(v)
  if (i !== undefined) return { param: i }
  const f = fixed.get(v)
  if (f !== undefined) return f
  // parse.ts has already refused unknown names; reaching here is a programming error.
  throw new RangeError(`unknown parameter "${v}"`)
}

function compileFactor(t: TermDoc, index: Map<string, number>, fixed: Map<string, number>): FactorRef {
  return {
    A: compileCoefficient(t.A, index, fixed),
    a: compileCoefficient(t.a, index, fixed),
    b: compileCoefficient(t.b, index, fixed),
    c: t.c.map(c => compileCoefficient(c, index, fixed))
  }
}

/** A modification coefficient for one nucleus: plain, or A-dependent evaluated at `nucleus`. */
function compileModificationCoefficient(v: ModificationCoefficientDoc, index: Map<string, number>, fixed: Map<string, number>, nucleus: Nucleus): CoefficientRef {
  if (!isMassNumberCoefficient(v)) return compileCoefficient(v, index, fixed)
  const plain = (c: number | string) => compileCoefficient(c, index, fixed) as number | { param: number }
  return {
    ofA: v.ofA.map(t => ({ k: plain(t.k), power: plain(t.power), c: t.c.map(plain), excess: t.excess.map(plain) })),
    nucleus: { z: nucleus.z, a: nucleus.a }
  }
}

function compileModificationFactor(t: ModificationTermDoc, index: Map<string, number>, fixed: Map<string, number>, nucleus: Nucleus): FactorRef {
  const one = (v: ModificationCoefficientDoc) => compileModificationCoefficient(v, index, fixed, nucleus)
  return { A: one(t.A), a: one(t.a), b: one(t.b), c: t.c.map(one) }
}

/** One line per A-dependent coefficient of the modifications, e.g. "modifications[0].terms[1].A = s·(1 + −1·A^(−1/3))". */
function massNumberLines(modifications: ReadonlyArray<{ terms: ModificationTermDoc[] }>): string[] {
  const lines: string[] = []
  modifications.forEach((m, i) => m.terms.forEach((t, r) => {
    const at = `modifications[${i}].terms[${r}]`
    const each = (v: ModificationCoefficientDoc, key: string) => {
      if (isMassNumberCoefficient(v)) lines.push(`${at}.${key} = ${describeMassNumberCoefficient(v)}`)
    }
    each(t.A, 'A')
    each(t.a, 'a')
    each(t.b, 'b')
    t.c.forEach((c, k) => each(c, `c[${k}]`))
  }))
  return lines
}

function weightsOf(flavours: Record<string, number>): Float64Array {
  const w = new Float64Array(N_SLOTS)
  for (const [k, v] of Object.entries(flavours)) w[slotOf(Number(k))]! += v
  return w
}

function baseModel(doc: ParametrisedInputDoc, fixed: Map<string, number>, index: Map<string, number>): Omit<InputModel, 'parameterNames' | 'central'> {
  const pieceIndex = new Map(doc.pieces.map((p, i) => [p.id, i]))
  const rules: SumRuleTargets = {}
  if (doc.sumRules?.uValence) rules.uValence = pieceIndex.get(doc.sumRules.uValence)
  if (doc.sumRules?.dValence) rules.dValence = pieceIndex.get(doc.sumRules.dValence)
  if (doc.sumRules?.momentum) rules.momentum = pieceIndex.get(doc.sumRules.momentum)
  return {
    name: doc.name,
    family: doc.family,
    version: doc.version,
    description: doc.description,
    target: doc.target,
    startScaleGeV2: doc.startScaleGeV2,
    alphas: { value: doc.alphas.value, scaleGeV2: doc.alphas.scaleGeV2 === 'mz' ? MZ_GEV * MZ_GEV : doc.alphas.scaleGeV2 },
    scheme: doc.scheme,
    covariance: doc.covariance,
    pieces: doc.pieces.map((p, i) => ({
      id: p.id,
      weights: weightsOf(p.flavours),
      terms: p.terms.map(t => [compileFactor(t, index, fixed)]),
      termSources: p.terms.map((_, k) => ({ path: `pieces[${i}].terms[${k}]` }))
    })),
    sumRules: rules,
    members: doc.members,
    grid: doc.grid,
    ...(doc.density?.type === 'fragmentation' ? { density: doc.density } : {})
  }
}

/**
 * The model of a parametrised-input document.
 * @example compileParametrisedInput(parseInputText(text, 'fit.json').doc)
 */
export function compileParametrisedInput(doc: ParametrisedInputDoc): InputModel {
  const index = new Map(doc.parameters.map((p, i) => [p.name, i]))
  return {
    ...baseModel(doc, new Map(), index),
    parameterNames: doc.parameters.map(p => p.name),
    central: Float64Array.from(doc.parameters.map(p => p.value))
  }
}

/**
 * The model of a document; a nuclear modification needs its baseline document.
 *
 * Nuclear: each bound-proton piece is the baseline piece with every term multiplied by every term
 * of the modification R that applies to it, f^{p/A} = R·f^p at μ₀²; baseline parameters are
 * frozen at their central values; the free parameters and covariance are the modification's;
 * α_s, scheme, μ₀² and sum rules are the baseline's; target, names and members the document's;
 * the grid the document's, else the baseline's. `options.nucleus` builds the modification for
 * another nucleus than the document's target (A-dependent coefficients evaluated there).
 * @throws InputError when the baseline is missing, has another name, is itself nuclear, or the
 * modifications do not cover each baseline piece exactly once; and (kind 'physics') when a term
 * is not integrable at the central values or the Q² grid does not fit the baseline's thresholds
 * (feasibility.ts).
 * @example compileInput(nuclearDocument, baselineDocument)
 * @example compileInput(familyDocument, baselineDocument, 'family.json', { nucleus: { z: 26, a: 56 } })
 */
export function compileInput(document: InputDocument, baseline?: InputDocument, source = 'input', options: CompileOptions = {}): InputModel {
  if (document.kind === 'parametrised') {
    if (options.nucleus) throw new InputError(source, [{ path: 'nucleus', message: 'only a nuclear modification (sheaf.nuclear-modification) can be built for a chosen nucleus' }])
    return checkedModel(compileParametrisedInput(document.doc), [], source)
  }
  const nuc = document.doc
  const nucleus: Nucleus = options.nucleus ?? { z: nuc.target.z, a: nuc.target.a }
  const problem = nucleusProblem(nucleus)
  if (problem) throw new InputError(source, [{ path: 'nucleus', message: problem, kind: 'physics' }])
  const issues: InputIssue[] = []
  if (!baseline) {
    throw new InputError(source, [{ path: 'baseline', message: `this nuclear modification needs its baseline input "${nuc.baseline.name}"${nuc.baseline.file ? ` (file ${nuc.baseline.file})` : ''}` }])
  }
  if (baseline.kind !== 'parametrised') {
    throw new InputError(source, [{ path: 'baseline', message: 'the baseline must be a parametrised (proton) input, not another nuclear modification' }])
  }
  const base = baseline.doc
  if (base.name !== nuc.baseline.name) {
    issues.push({ path: 'baseline.name', message: `this document modifies "${nuc.baseline.name}" but the baseline given is "${base.name}"` })
  }
  if (nuc.baseline.version !== undefined && nuc.baseline.version !== base.version) {
    issues.push({ path: 'baseline.version', message: `this document modifies version "${nuc.baseline.version}" but the baseline given is version "${base.version}"` })
  }
  if (base.target.type !== 'proton') {
    issues.push({ path: 'baseline', message: 'the baseline must be a free-proton input' })
  }
  if (base.density?.type === 'fragmentation') {
    issues.push({ path: 'baseline', message: 'the baseline describes fragmentation functions; a nuclear modification multiplies parton densities' })
  }
  const baseNames = new Set(base.parameters.map(p => p.name))
  nuc.parameters.forEach((p, i) => {
    if (baseNames.has(p.name)) issues.push({ path: `parameters[${i}].name`, message: `"${p.name}" is also a parameter of the baseline; give the nuclear parameter its own name` })
  })
  const pieceIds = base.pieces.map(p => p.id)
  const coveredBy = new Map<string, number>()
  nuc.modifications.forEach((m, i) => {
    m.appliesTo.forEach((id, k) => {
      if (!pieceIds.includes(id)) {
        issues.push({ path: `modifications[${i}].appliesTo[${k}]`, message: `baseline "${base.name}" has no piece "${id}" (pieces: ${pieceIds.join(', ')})` })
      } else if (coveredBy.has(id)) {
        issues.push({ path: `modifications[${i}].appliesTo[${k}]`, message: `piece "${id}" is already modified by modifications[${coveredBy.get(id)}]` })
      } else {
        coveredBy.set(id, i)
      }
    })
  })
  const uncovered = pieceIds.filter(id => !coveredBy.has(id))
  if (uncovered.length > 0) {
    issues.push({ path: 'modifications', message: `every baseline piece needs a modification (use a term { "A": 1, "a": 0, "b": 0 } for R = 1); uncovered: ${uncovered.join(', ')}` })
  }
  if (issues.length > 0) throw new InputError(source, issues)

  const fixed = new Map(base.parameters.map(p => [p.name, p.value]))
  const index = new Map(nuc.parameters.map((p, i) => [p.name, i]))
  const model = baseModel(base, fixed, new Map())
  const pieces = model.pieces.map((piece, i) => {
    const m = coveredBy.get(pieceIds[i]!)!
    const rFactors = nuc.modifications[m]!.terms.map(t => compileModificationFactor(t, index, fixed, nucleus))
    return {
      ...piece,
      terms: piece.terms.flatMap(factors => rFactors.map(r => [...factors, r])),
      termSources: piece.terms.flatMap((_, k) => rFactors.map((_r, r) => ({ path: `modifications[${m}].terms[${r}]`, baselineTerm: `pieces[${i}].terms[${k}]` })))
    }
  })
  return checkedModel({
    ...model,
    name: nuc.name,
    family: nuc.family,
    version: nuc.version,
    description: nuc.description,
    target: { type: 'nucleus', z: nucleus.z, a: nucleus.a },
    parameterNames: nuc.parameters.map(p => p.name),
    central: Float64Array.from(nuc.parameters.map(p => p.value)),
    covariance: nuc.covariance,
    pieces,
    members: nuc.members,
    grid: nuc.grid ?? base.grid,
    baseline: { name: base.name, version: base.version },
    massNumberDependence: massNumberLines(nuc.modifications),
    documentNucleus: { z: nuc.target.z, a: nuc.target.a }
  }, nuc.grid ? q2GridIssues(nuc.grid, base.startScaleGeV2, base.scheme) : [], source)
}

/** The model, unless a term diverges at the central values or `issues` has problems (InputError). */
function checkedModel(model: InputModel, issues: InputIssue[], source: string): InputModel {
  const all = [...issues, ...centralTermIssues(model)]
  if (all.length > 0) throw new InputError(source, all)
  return model
}
