import { z } from 'zod'
import { activeFlavours } from '../alphas'
import type { FlavourScheme } from '../types'
import type { CombineOp } from './ratios'
import { ccCrossSectionTerm, ccStructureTerm } from './dis-charged'
import { ncTerm } from './dis-neutral'
import { drellYanTerm } from './drell-yan'
import { annihilationTerm } from './electron-positron'
import { hadronSchema } from './hadrons'
import { semiInclusiveQuarkSumTerm, semiInclusiveYieldTerm } from './semi-inclusive'
import type { KernelDensities } from './densities'
import { ANNIHILATION_SLOTS, PARTON_SLOTS, SEMI_INCLUSIVE_SLOTS, SPECIES_RATIO_SLOTS } from './densities'
import { higgsTerm } from './higgs'
import { MH_GEV, PROTON_MASS_GEV } from '../constants'
import type { LuminosityChannel } from './luminosity'
import { luminosityTerm } from './luminosity'
import type { Term } from './terms'
import { crossSectionUnitSchema } from './units'
import { buildUserKernel, userKernelOptionsSchema } from './user-kernel'
import type { VectorBoson } from './vector-boson'
import { vectorBosonMassGeV, vectorBosonTerm } from './vector-boson'

/**
 * The catalogue of kernels a study can name: for each id its bin variables, options (zod),
 * result unit and a function giving the LO term at a kinematic point. Composite ids (ratios and
 * asymmetries) name two parts evaluated member by member.
 */

/**
 * Kinematic variables a bin can fix or range over. `y` is the inelasticity for DIS kernels and the
 * rapidity for hadron–hadron kernels; `z` the hadron's momentum fraction and `sqrtS` the e⁺e⁻
 * centre-of-mass energy of the hadron-production kernels.
 */
export type VariableName = 'x' | 'q2' | 'y' | 'm' | 'z' | 'sqrtS'

/** A bin variable of a kernel: its meaning, unit and domain check. */
export interface VariableSpec {
  name: VariableName
  label: string
  /** Power of GeV of the variable's unit (x, y: 0; M: 1; Q²: 2). */
  gevPower: 0 | 1 | 2
  /** A physicist-readable complaint about a value, or null when it is in the domain. */
  check: (value: number) => string | null
}

const X: VariableSpec = { name: 'x', label: 'Bjorken x', gevPower: 0, check: v => v > 0 && v < 1 ? null : 'x must be in (0, 1)' }
const Q2: VariableSpec = { name: 'q2', label: 'Q² in GeV²', gevPower: 2, check: v => v > 0 && Number.isFinite(v) ? null : 'Q² must be a positive number of GeV²' }
const INELASTICITY: VariableSpec = { name: 'y', label: 'inelasticity y', gevPower: 0, check: v => v > 0 && v <= 1 ? null : 'the inelasticity y must be in (0, 1]' }
const RAPIDITY: VariableSpec = { name: 'y', label: 'rapidity y', gevPower: 0, check: v => Number.isFinite(v) && Math.abs(v) <= 20 ? null : 'the rapidity y must be a finite number with |y| ≤ 20' }
const Z_FRACTION: VariableSpec = { name: 'z', label: 'hadron momentum fraction z', gevPower: 0, check: v => v > 0 && v < 1 ? null : 'z must be in (0, 1)' }
const ENERGY: VariableSpec = { name: 'sqrtS', label: '√s in GeV', gevPower: 1, check: v => v > 0 && v <= 1e5 ? null : '√s must be a positive number of GeV (at most 100000)' }
const MASS: VariableSpec = { name: 'm', label: 'mass M in GeV', gevPower: 1, check: v => v > 0 && Number.isFinite(v) ? null : 'the mass M must be a positive number of GeV' }

/** What the caller supplies beyond the spec: α_s for kernels that need it. */
export interface KernelContext {
  /** α_s(μ²), μ² in GeV²; needed by the gluon-fusion kernels (the central member's α_s). */
  alphas?: (q2GeV2: number) => number
  /** κ_R in μ_R = κ_R μ for kernels with α_s (default 1); the study sets it from its spec. */
  renormalisationScaleFactor?: number
  /**
   * The set's flavour scheme: charged-current DIS opens top production where it has six active
   * flavours at Q² (as the other kernels use a top density wherever the set has one).
   */
  scheme?: FlavourScheme
}

/** Whether a top can be produced at Q² in charged-current DIS: six active flavours in the set's scheme. */
function topOpen(context: KernelContext, q2GeV2: number): boolean {
  return context.scheme !== undefined && Number.isFinite(q2GeV2) && q2GeV2 > 0 && activeFlavours(q2GeV2, context.scheme) >= 6
}

/** The term at a kinematic point (variable name → value). */
export type PointEvaluator = (point: Readonly<Partial<Record<VariableName, number>>>) => Term

/** A single (non-composite) kernel. */
export interface KernelDefinition {
  id: string
  title: string
  composite: false
  /** Linear (DIS-like) or bilinear (hadron–hadron) forms; the user kernel decides by its options. */
  kind: 'linear' | 'bilinear' | ((options: Record<string, unknown>) => 'linear' | 'bilinear')
  optionsSchema: z.ZodType
  /** Bin variables for the (validated) options. */
  variables: (options: Record<string, unknown>) => readonly VariableSpec[]
  /** The result is a cross-section in options.unit (default pb) rather than a pure number. */
  crossSection: boolean
  /** The unit is divided by GeV to this power (e.g. 1 for pb/GeV). */
  gevPower: number
  /** Words for the result, e.g. "d²σ/dM dy". */
  quantity: string
  needsAlphas?: boolean
  /**
   * For kernels proportional to α_s(μ_R²)^power with one μ_R per study (gg → H: power 2,
   * μ_R = κ_R M_H): the power and μ_R² in GeV² for the given options and κ_R. The plan uses it to
   * give each member its own α_s (see shared/physics/README.md, "Higgs").
   */
  alphasScaling?: { power: number, mu2GeV2: (options: Record<string, unknown>, renormalisationScaleFactor: number) => number }
  /**
   * For totals and luminosities: the mass of the produced system at a point, whose whole
   * rapidity range each bin integrates over (within the grid's x range).
   */
  fullRapidityMass?: (options: Record<string, unknown>, point: Readonly<Partial<Record<VariableName, number>>>) => number
  /** Collider energy of hadron–hadron kernels (for rapidity ranges). */
  sqrtS?: (options: Record<string, unknown>) => number
  /** Prepares the point evaluator once per study (e.g. compiles a user expression). */
  prepare: (options: Record<string, unknown>, context: KernelContext) => PointEvaluator
  /** What the study's set slots hold (default: parton densities in both). */
  densities?: KernelDensities
  /** A building block of composites only: not offered to studies on its own. */
  partOnly?: true
}

/** One side of a composite: a kernel with its options, and whether its densities (DIS) or beam 2 (hadronic) come from the second set. */
export interface CompositePart {
  kernel: string
  options: Record<string, unknown>
  useSecond: boolean
}

/** A ratio or asymmetry of two kernels evaluated member by member. */
export interface CompositeDefinition {
  id: string
  title: string
  composite: true
  op: CombineOp
  optionsSchema: z.ZodType
  parts: (options: Record<string, unknown>) => [CompositePart, CompositePart]
  /** Words for what the composite divides by, for the given options (labels and exports). */
  describe?: (options: Record<string, unknown>) => string
  /** What the study's set slots hold (default: parton densities in both). */
  densities?: KernelDensities
  /** The observable's own name when it is not its parts' quantity divided (e.g. "M^h"). */
  quantity?: string
}

export type AnyKernelDefinition = KernelDefinition | CompositeDefinition

const disTarget = z.discriminatedUnion('type', [
  z.strictObject({ type: z.literal('proton') }),
  z.strictObject({ type: z.literal('neutron') }),
  z.strictObject({ type: z.literal('isoscalar') }),
  z.strictObject({ type: z.literal('nucleus'), z: z.number().int().min(1), a: z.number().int().min(1).max(300) })
    .refine(n => n.z <= n.a, { message: 'a nucleus needs Z ≤ A', path: ['z'] })
])
const sqrtS = z.number().positive('√s must be positive').max(1e6)
const ckm = z.enum(['pdg', 'diagonal'])
// Neutral current: 'photon' exchange (default) or 'gamma-z' (γ, γ/Z and Z); the lepton's charge
// sets the sign of xF̃₃ in the reduced and differential cross-sections with γ/Z.
const exchange = z.enum(['photon', 'gamma-z'])
const lepton = z.enum(['electron', 'positron'])
const needsLepton = (o: { exchange?: string, lepton?: string }) => o.exchange !== 'gamma-z' || o.lepton !== undefined
const leptonMessage = { message: 'γ/Z exchange needs the lepton: electron or positron (the sign of xF̃₃)', path: ['lepton'] }
const ncOptions = z.strictObject({ target: disTarget.optional(), exchange: exchange.optional(), lepton: lepton.optional() })
const ncEnergyOptions = z.strictObject({ target: disTarget.optional(), sqrtSGeV: sqrtS, exchange: exchange.optional(), lepton: lepton.optional() }).refine(needsLepton, leptonMessage)
const ncXsecOptions = z.strictObject({ target: disTarget.optional(), sqrtSGeV: sqrtS, unit: crossSectionUnitSchema.optional(), exchange: exchange.optional(), lepton: lepton.optional() }).refine(needsLepton, leptonMessage)
const ccOptions = z.strictObject({ beam: z.enum(['neutrino', 'antineutrino']), target: disTarget.optional(), ckm: ckm.optional() })
const ccXsecOptions = ccOptions.extend({ beamEnergyGeV: z.number().positive('the beam energy must be positive').max(1e7), unit: crossSectionUnitSchema.optional() })
const collider = z.strictObject({ sqrtSGeV: sqrtS, beam1: hadronSchema.optional(), beam2: hadronSchema.optional(), unit: crossSectionUnitSchema.optional() })
const wzOptions = collider.extend({ ckm: ckm.optional() })
const lumiOptions = z.strictObject({ sqrtSGeV: sqrtS, beam1: hadronSchema.optional(), beam2: hadronSchema.optional() })

/* eslint-disable @typescript-eslint/no-explicit-any -- options are validated by each kernel's schema before use */
const opt = (o: Record<string, unknown>) => o as any

function nc(id: string, observable: 'F2' | 'FL' | '2xF1' | 'reduced' | 'd2sigma', quantity: string, schema: z.ZodType): KernelDefinition {
  return {
    id, title: `DIS neutral current (γ, or γ/Z with exchange: gamma-z), ${quantity}`, composite: false, kind: 'linear', optionsSchema: schema,
    variables: () => [X, Q2], crossSection: observable === 'd2sigma', gevPower: observable === 'd2sigma' ? 2 : 0, quantity,
    prepare: o => p => ncTerm(observable, p.x!, p.q2!, opt(o))
  }
}

function cc(id: string, structure: 'F2' | 'xF3' | '2xF1', quantity: string): KernelDefinition {
  return {
    id, title: `DIS charged current (ν/ν̄), ${quantity}`, composite: false, kind: 'linear', optionsSchema: ccOptions,
    variables: () => [X, Q2], crossSection: false, gevPower: 0, quantity,
    prepare: (o, context) => p => ccStructureTerm(structure, p.x!, p.q2!, { ...opt(o), topOpen: topOpen(context, p.q2!) })
  }
}

function boson(id: string, v: VectorBoson, total: boolean): KernelDefinition {
  const name = v === 'Z' ? 'Z' : v === 'W+' ? 'W⁺' : 'W⁻'
  return {
    id, title: `${name} production (narrow width)${total ? ', total' : ''}`, composite: false, kind: 'bilinear', optionsSchema: wzOptions,
    variables: () => total ? [] : [RAPIDITY], crossSection: true, gevPower: 0, quantity: total ? 'σ' : 'dσ/dy',
    fullRapidityMass: total ? () => vectorBosonMassGeV(v) : undefined,
    sqrtS: o => opt(o).sqrtSGeV,
    prepare: o => p => vectorBosonTerm(v, p.y!, opt(o))
  }
}

function higgs(id: string, total: boolean): KernelDefinition {
  return {
    id, title: `gg → H (heavy-top limit)${total ? ', total' : ''}`, composite: false, kind: 'bilinear', optionsSchema: collider,
    variables: () => total ? [] : [RAPIDITY], crossSection: true, gevPower: 0, quantity: total ? 'σ' : 'dσ/dy', needsAlphas: true,
    alphasScaling: { power: 2, mu2GeV2: (_o, kappaR) => (kappaR * MH_GEV) ** 2 },
    fullRapidityMass: total ? () => MH_GEV : undefined,
    sqrtS: o => opt(o).sqrtSGeV,
    prepare: (o, context) => {
      const alphas = context.alphas
      if (!alphas) throw new RangeError('the gluon-fusion kernel needs α_s: pass an alphas(q2GeV2) function when building the study')
      return p => higgsTerm(p.y!, { ...opt(o), alphas, renormalisationScaleFactor: context.renormalisationScaleFactor })
    }
  }
}

function luminosity(id: string, channel: LuminosityChannel, name: string): KernelDefinition {
  return {
    id, title: `parton luminosity ${name}`, composite: false, kind: 'bilinear', optionsSchema: lumiOptions,
    variables: () => [MASS], crossSection: false, gevPower: 0, quantity: `dL_${channel}/dτ`,
    fullRapidityMass: (_o, p) => p.m!,
    sqrtS: o => opt(o).sqrtSGeV,
    prepare: o => p => luminosityTerm(channel, p.m!, p.y!, opt(o))
  }
}

const userKernel: KernelDefinition = {
  id: 'user', title: 'user-defined kernel', composite: false, kind: o => (opt(o).mode === 'hadron' ? 'bilinear' : 'linear'), optionsSchema: userKernelOptionsSchema,
  variables: o => opt(o).mode === 'hadron' ? [MASS, RAPIDITY] : [X, Q2],
  crossSection: false, gevPower: 0, quantity: 'user expression',
  sqrtS: o => opt(o).sqrtSGeV,
  prepare: o => {
    const k = buildUserKernel(opt(o))
    return p => k.term(p as Record<string, number>)
  }
}

const ccRatioOptions = z.strictObject({
  observable: z.enum(['d2sigma', 'F2', 'xF3']).optional(),
  beamEnergyGeV: z.number().positive().max(1e7).optional(),
  target: disTarget.optional(),
  ckm: ckm.optional()
}).refine(o => (o.observable ?? 'd2sigma') !== 'd2sigma' || o.beamEnergyGeV !== undefined, { message: 'the ν/ν̄ cross-section ratio needs beamEnergyGeV', path: ['beamEnergyGeV'] })

const annihilationOptions = z.strictObject({ exchange: exchange.optional() })
const sidisOptions = z.strictObject({ target: disTarget.optional() })
const yieldOptions = sidisOptions.extend({ combination: z.enum(['same', 'conjugate', 'difference']).optional() })
const SIDIS_VARIABLES: readonly VariableSpec[] = Object.freeze([X, Z_FRACTION, Q2])
const targetWords = (o: Record<string, unknown>) => {
  const t = opt(o).target
  if (!t || t.type === 'proton') return 'a proton target'
  if (t.type === 'nucleus') return t.z === 1 && t.a === 2 ? 'a deuteron target (per nucleon)' : `a nucleus Z = ${t.z}, A = ${t.a} (per nucleon)`
  return `a ${t.type} target`
}

const nuclearBases = ['drell-yan', 'w-plus', 'w-minus', 'z', 'higgs-ggf', 'dis-nc-f2', 'dis-cc-f2', 'dis-cc-xf3', 'dis-cc-d2sigma'] as const
const nuclearRatioOptions = z.looseObject({
  base: z.enum(nuclearBases),
  // 'proton' (default): per-nucleon σ_A over the free proton's; 'isospin': over the free
  // nucleons' (Z·p + N·n)/A from the baseline set, so that isospin does not count as a nuclear effect;
  // 'isoscalar': over ½(p + n) (F₂^A/F₂^{p+n}, σ_νA/σ_νN per nucleon); 'deuteron': over the
  // deuteron's (Z = 1, A = 2) per-nucleon density of the main set — the free-nucleon sum when the
  // main set is a proton set, a bound deuteron when it is the family's deuteron set.
  denominator: z.enum(['proton', 'isospin', 'isoscalar', 'deuteron']).optional(),
  nucleus: z.strictObject({ z: z.number().int().min(1), a: z.number().int().min(1).max(300) }).refine(n => n.z <= n.a, { message: 'a nucleus needs Z ≤ A', path: ['z'] })
})

const singles: KernelDefinition[] = [
  nc('dis-nc-f2', 'F2', 'F₂', ncOptions),
  nc('dis-nc-fl', 'FL', 'F_L', ncOptions),
  nc('dis-nc-2xf1', '2xF1', '2xF₁', ncOptions),
  nc('dis-nc-reduced', 'reduced', 'σ_r', ncEnergyOptions),
  nc('dis-nc-d2sigma', 'd2sigma', 'd²σ/dx dQ²', ncXsecOptions),
  cc('dis-cc-f2', 'F2', 'F₂'),
  cc('dis-cc-xf3', 'xF3', 'xF₃'),
  cc('dis-cc-2xf1', '2xF1', '2xF₁'),
  {
    id: 'dis-cc-d2sigma', title: 'DIS charged current (ν/ν̄), d²σ/dx dy', composite: false, kind: 'linear', optionsSchema: ccXsecOptions,
    variables: () => [X, INELASTICITY], crossSection: true, gevPower: 0, quantity: 'd²σ/dx dy',
    prepare: (o, context) => p => ccCrossSectionTerm(p.x!, p.y!, { ...opt(o), topOpen: topOpen(context, 2 * PROTON_MASS_GEV * opt(o).beamEnergyGeV * p.x! * p.y!) })
  },
  {
    id: 'drell-yan', title: 'Drell–Yan γ* → ℓ⁺ℓ⁻', composite: false, kind: 'bilinear', optionsSchema: collider,
    variables: () => [MASS, RAPIDITY], crossSection: true, gevPower: 1, quantity: 'd²σ/dM dy',
    sqrtS: o => opt(o).sqrtSGeV,
    prepare: o => p => drellYanTerm(p.m!, p.y!, opt(o))
  },
  boson('w-plus', 'W+', false), boson('w-minus', 'W-', false), boson('z', 'Z', false),
  boson('w-plus-total', 'W+', true), boson('w-minus-total', 'W-', true), boson('z-total', 'Z', true),
  higgs('higgs-ggf', false), higgs('higgs-ggf-total', true),
  {
    id: 'epem-hadron', title: 'e⁺e⁻ → h X (γ/Z exchange), normalised single-hadron cross-section', composite: false, kind: 'linear',
    optionsSchema: annihilationOptions, variables: () => [ENERGY, Z_FRACTION], crossSection: false, gevPower: 0,
    quantity: '(1/σ_tot) dσ^h/dz', densities: ANNIHILATION_SLOTS,
    prepare: (o, context) => {
      const scheme = context.scheme
      if (!scheme) throw new RangeError('the e⁺e⁻ kernel needs the set\'s flavour scheme (which quarks √s can produce): pass it when building the study')
      return p => annihilationTerm(p.z!, p.sqrtS!, { ...opt(o), scheme })
    }
  },
  {
    id: 'sidis-yield', title: 'semi-inclusive DIS Σ_q e_q² q(x) D_q^h(z) (numerator of M^h)', composite: false, kind: 'bilinear', partOnly: true,
    optionsSchema: yieldOptions, variables: () => SIDIS_VARIABLES, crossSection: false, gevPower: 0, quantity: 'Σ e_q² q D_q^h',
    densities: SEMI_INCLUSIVE_SLOTS,
    prepare: o => p => semiInclusiveYieldTerm(p.x!, p.z!, p.q2!, opt(o))
  },
  {
    id: 'sidis-quark-sum', title: 'semi-inclusive DIS Σ_q e_q² q(x) (denominator of M^h)', composite: false, kind: 'linear', partOnly: true,
    optionsSchema: sidisOptions, variables: () => SIDIS_VARIABLES, crossSection: false, gevPower: 0, quantity: 'Σ e_q² q',
    prepare: o => p => semiInclusiveQuarkSumTerm(p.x!, p.z!, p.q2!, opt(o))
  },
  luminosity('lumi-gg', 'gg', 'gg'), luminosity('lumi-qqbar', 'qqbar', 'qq̄ (summed over flavours)'), luminosity('lumi-qg', 'qg', 'qg (quarks and antiquarks)'),
  userKernel
]

const composites: CompositeDefinition[] = [
  {
    id: 'sidis-multiplicity', title: 'semi-inclusive DIS multiplicity M^h', composite: true, op: 'ratio', optionsSchema: sidisOptions,
    quantity: 'M^h', densities: SEMI_INCLUSIVE_SLOTS,
    parts: o => [{ kernel: 'sidis-yield', options: { ...o }, useSecond: true }, { kernel: 'sidis-quark-sum', options: { ...o }, useSecond: false }],
    describe: o => `Σ_q e_q² q(x) D_q^h(z) / Σ_q e_q² q(x) on ${targetWords(o)}; each bin the ratio of the two integrals`
  },
  {
    id: 'sidis-charge-ratio', title: 'semi-inclusive DIS charge ratio M^h/M^h̄', composite: true, op: 'ratio', optionsSchema: sidisOptions,
    quantity: 'M^h/M^h̄', densities: SEMI_INCLUSIVE_SLOTS,
    parts: o => [{ kernel: 'sidis-yield', options: { ...o }, useSecond: true }, { kernel: 'sidis-yield', options: { ...o, combination: 'conjugate' }, useSecond: true }],
    describe: o => `the antihadron h̄ from the same set by charge conjugation, D_q^h̄ = D_q̄^h, on ${targetWords(o)}`
  },
  {
    id: 'sidis-charge-difference', title: 'semi-inclusive DIS charge difference M^h − M^h̄', composite: true, op: 'ratio', optionsSchema: sidisOptions,
    quantity: 'M^h − M^h̄', densities: SEMI_INCLUSIVE_SLOTS,
    parts: o => [{ kernel: 'sidis-yield', options: { ...o, combination: 'difference' }, useSecond: true }, { kernel: 'sidis-quark-sum', options: { ...o }, useSecond: false }],
    describe: o => `Σ_q e_q² q (D_q^h − D_q̄^h) / Σ_q e_q² q, the antihadron by charge conjugation, on ${targetWords(o)}`
  },
  {
    id: 'epem-species-ratio', title: 'e⁺e⁻ → h X species ratio (dσ^h/dz)/(dσ^h′/dz)', composite: true, op: 'ratio', optionsSchema: annihilationOptions,
    quantity: 'R^{h/h′}', densities: SPECIES_RATIO_SLOTS,
    parts: o => [{ kernel: 'epem-hadron', options: { ...o }, useSecond: false }, { kernel: 'epem-hadron', options: { ...o }, useSecond: true }],
    describe: () => 'hadron h of the main set over hadron h′ of the second set (e.g. K⁺ over π⁺)'
  },
  {
    id: 'w-charge-ratio', title: 'W⁺/W⁻ ratio of dσ/dy', composite: true, op: 'ratio', optionsSchema: wzOptions,
    parts: o => [{ kernel: 'w-plus', options: o, useSecond: false }, { kernel: 'w-minus', options: o, useSecond: false }]
  },
  {
    id: 'w-charge-asymmetry', title: 'W charge asymmetry (W⁺ − W⁻)/(W⁺ + W⁻) of dσ/dy', composite: true, op: 'asymmetry', optionsSchema: wzOptions,
    parts: o => [{ kernel: 'w-plus', options: o, useSecond: false }, { kernel: 'w-minus', options: o, useSecond: false }]
  },
  {
    id: 'nu-nubar-ratio', title: 'ν/ν̄ charged-current ratio', composite: true, op: 'ratio', optionsSchema: ccRatioOptions,
    parts: o => {
      const { observable = 'd2sigma', ...rest } = opt(o)
      const kernel = observable === 'd2sigma' ? 'dis-cc-d2sigma' : observable === 'F2' ? 'dis-cc-f2' : 'dis-cc-xf3'
      if (kernel !== 'dis-cc-d2sigma') delete rest.beamEnergyGeV
      return [
        { kernel, options: { ...rest, beam: 'neutrino' }, useSecond: false },
        { kernel, options: { ...rest, beam: 'antineutrino' }, useSecond: false }
      ]
    }
  },
  {
    id: 'nuclear-ratio', title: 'nuclear ratio σ_pA/(A σ_pp) per nucleon', composite: true, op: 'ratio', optionsSchema: nuclearRatioOptions,
    parts: o => {
      const { base, nucleus, denominator = 'proton', ...rest } = opt(o)
      const target = { type: 'nucleus', z: nucleus.z, a: nucleus.a }
      // The denominator reads the baseline (free-proton) set: a free proton, or the free nucleons
      // of the same nucleus (Z p + N n)/A by isospin (see shared/physics/README.md, "Nuclear targets and isospin").
      const free = denominator === 'isospin' ? target
        : denominator === 'isoscalar' ? { type: 'isoscalar' }
          : denominator === 'deuteron' ? { type: 'nucleus', z: 1, a: 2 }
            : { type: 'proton' }
      const dis = String(base).startsWith('dis-')
      return dis
        ? [{ kernel: base, options: { ...rest, target }, useSecond: true }, { kernel: base, options: { ...rest, target: free }, useSecond: false }]
        : [{ kernel: base, options: { ...rest, beam2: target }, useSecond: true }, { kernel: base, options: { ...rest, beam2: free }, useSecond: false }]
    },
    describe: o => {
      const { nucleus, denominator = 'proton' } = opt(o)
      const n = nucleus ? `Z = ${nucleus.z}, A = ${nucleus.a}` : 'the nucleus'
      if (denominator === 'isoscalar') return `per nucleon, over an isoscalar nucleon ½(p + n) of the main set (${n} over p + n)`
      if (denominator === 'deuteron') return `per nucleon, over the deuteron of the main set (${n} over D; member by member when both come from one family)`
      return denominator === 'isospin'
        ? `per nucleon, over the free nucleons (Z·p + N·n)/A of ${n} (isospin-corrected)`
        : `per nucleon, over a free proton (isospin not corrected for ${n})`
    }
  }
]

/**
 * A kernel's title with what a composite divides by, e.g. "nuclear ratio σ_pA/(A σ_pp) per
 * nucleon — per nucleon, over the free nucleons (Z·p + N·n)/A of Z = 82, A = 208 (isospin-corrected)".
 */
export function kernelLabel(id: string, options: Record<string, unknown>): string {
  const def = kernelDefinition(id)
  return def.composite && def.describe ? `${def.title} — ${def.describe(options)}` : def.title
}

/** Whether a kernel gives linear or bilinear forms for the given options. */
export function kernelKind(def: KernelDefinition, options: Record<string, unknown>): 'linear' | 'bilinear' {
  return typeof def.kind === 'function' ? def.kind(options) : def.kind
}

const offered = [...singles.filter(k => !k.partOnly), ...composites]

/** All kernel ids a study may name, singles first (building blocks of composites excluded). */
export const KERNEL_IDS: readonly string[] = Object.freeze(offered.map(k => k.id))

const byId = new Map<string, AnyKernelDefinition>([...singles, ...composites].map(k => [k.id, k]))

/**
 * The definition of kernel `id`, or a RangeError listing the known ids.
 * @example kernelDefinition('drell-yan').quantity // 'd²σ/dM dy'
 */
export function kernelDefinition(id: string): AnyKernelDefinition {
  const k = byId.get(id)
  if (!k) throw new RangeError(`unknown kernel "${id}"; known kernels: ${KERNEL_IDS.join(', ')}`)
  return k
}

/** Every kernel definition, for catalogues in the app and the CLI help. */
export function kernelCatalogue(): readonly AnyKernelDefinition[] {
  return offered
}

/**
 * What kernel `id` reads in each set slot: parton densities or fragmentation functions, and
 * whether it needs a second set (shared/physics/README.md, "Hadron production: which set goes where").
 * @example kernelDensities('sidis-multiplicity') // { main: 'parton', second: 'fragmentation', secondRequired: true }
 */
export function kernelDensities(id: string): KernelDensities {
  return kernelDefinition(id).densities ?? PARTON_SLOTS
}
