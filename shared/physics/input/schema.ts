/**
 * JSON schemas (zod) of Sheaf's two input documents: a parametrised input at a starting scale,
 * and a nuclear modification of such an input. The format is Sheaf's own; it is described here
 * and in the README.
 *
 * ## Parametrised input (`"format": "sheaf.parametrised-input"`, `"formatVersion": 1`)
 * ```jsonc
 * {
 *   "format": "sheaf.parametrised-input", "formatVersion": 1,
 *   "name": "Example-1", "family": "Example", "version": "1.0",
 *   "description": "free text; say here if the fit is invented",
 *   "target": { "type": "proton" },
 *   "startScaleGeV2": 2,                          // μ₀² in GeV²
 *   "alphas": { "value": 0.35, "scaleGeV2": 2 },  // α_s at μ² (a number of GeV², or "mz" for M_Z²)
 *   "scheme": { "type": "variable", "nf": 5, "massesGeV": { "charm": 1.4142, "bottom": 4.5, "top": 175 } },
 *   "parameters": [ { "name": "a_uv", "value": 0.8 } ],      // the fit's central parameter vector
 *   "covariance": [ [ 0.0004 ] ],                           // optional, rows in parameter order
 *   "pieces": [
 *     { "id": "uv", "flavours": { "2": 1 },
 *       "terms": [ { "A": 5.1072, "a": "a_uv", "b": 3, "c": [0, 0] } ] }
 *   ],
 *   "sumRules": { "uValence": "uv", "dValence": "dv", "momentum": "g" },   // optional
 *   "members": { "type": "hessian", "tolerance": 1.64485, "confidenceLevelPercent": 90 },   // optional
 *   "grid": { "x": { "count": 100, "min": 1e-6, "max": 0.99 }, "q2": { "count": 40, "maxGeV2": 1e8 } },
 *   "density": { "type": "fragmentation", "hadron": "pi+" }   // optional; absent = parton densities
 * }
 * ```
 * - **density** (optional) says what the pieces describe: parton densities x·f (absent, or
 *   `{ "type": "parton" }`) or fragmentation functions z·D_i^h of the partons i into one hadron
 *   species h (fragmentation/species.ts), x read as z. A fragmentation input takes no `sumRules`
 *   and a free-proton `target` (the field is not used); its members are checked for z·D ≥ 0 and
 *   ∫ z·D dz ≤ 1 per parton (fragmentation.ts) and evolved with the timelike kernels.
 * - A **piece** is one function of x with a list of PDG flavours it adds to, each with a weight:
 *   x·f_i(x, μ₀²) = Σ_pieces w_{piece,i} · Σ_terms term(x). Keys are PDG codes as strings
 *   ("1".."6", "-1".."-6", "21"). Standard combinations map as follows:
 *   valence u_v = u − ū → `{ "2": 1 }` (u = u_v + ū, with ū from its own piece);
 *   valence d_v → `{ "1": 1 }`; an antiquark sea ū that also sits in u → `{ "-2": 1, "2": 1 }`;
 *   a symmetric strange sea s = s̄ → `{ "3": 1, "-3": 1 }`; the gluon → `{ "21": 1 }`.
 * - A **term** is x·f contribution A·x^a·(1−x)^b·(1 + c₁√x + c₂x + c₃x^{3/2} + …): `"c"` lists
 *   c₁, c₂, … (c_k multiplies x^{k/2}); A defaults to 1, `"c"` to []. Each of A, a, b, c_k is a
 *   number or the name of a parameter.
 * - **sumRules** (optional) names the pieces whose overall normalisation is fixed, member by
 *   member, so that ∫(u − ū)dx = 2, ∫(d − d̄)dx = 1 and ∫ x Σ_i f_i dx = 1 (all flavours and the
 *   gluon). The named piece's terms then give its shape; the engine multiplies the whole piece
 *   by the factor that satisfies the rules (solved jointly when several are given).
 * - **members** (optional) is how the fit's spread is to be published: Hessian eigenvector pairs
 *   at tolerance T (Δχ² = T²) quoted at the given confidence level, or N Monte-Carlo replicas
 *   from a seed.
 *
 * ## Nuclear modification (`"format": "sheaf.nuclear-modification"`, `"formatVersion": 1`)
 * Bound-proton densities at μ₀² are R(x)·(proton piece) for each piece of a baseline parametrised
 * input, then evolved like any input. The document names its baseline (`"baseline": { "name",
 * "version"?, "file"? }`; the caller loads that file and the engine checks the name), a nucleus
 * target, its own parameters and covariance (the baseline is held at its central values: nuclear
 * and baseline uncertainties stay separate and are combined in quadrature, see
 * shared/physics/README.md, "Nuclear targets and isospin"), and `"modifications"`: functions R
 * built from the same terms, each listing the baseline pieces it multiplies (`"appliesTo"`); every
 * baseline piece must be covered exactly once. The baseline's sum rules are imposed again on the
 * bound proton. A modification term's coefficients may depend on the nucleus
 * (`{ "ofA": [ … ] }`, mass-number.ts), so that one document is a family: built for its own
 * `target` by default, or for any nucleus asked for.
 */
import { z } from 'zod'
import { setDensitySchema } from '../fragmentation/species'
import { MassNumberCoefficientSchema } from './mass-number'

const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_.]*$/

/** A coefficient: a number, or the name of a parameter. */
export const CoefficientSchema = z.union([z.number(), z.string().regex(NAME_PATTERN)], {
  error: 'expected a number or the name of a fit parameter (letters, digits, _ and ., not starting with a digit)'
})

/** A term A·x^a·(1−x)^b·(1 + Σ c_k x^{k/2}) whose coefficients follow `coefficient`. */
const termOf = <C extends typeof CoefficientSchema | typeof ModificationCoefficientSchema>(coefficient: C) => z.object({
  // Every coefficient schema accepts the number 1: the default amplitude.
  A: (coefficient as typeof CoefficientSchema).default(1) as unknown as z.ZodDefault<C>,
  a: coefficient,
  b: coefficient,
  c: z.array(coefficient).max(12).default([])
}).strict()

/** One term A·x^a·(1−x)^b·(1 + Σ c_k x^{k/2}) of x·f. */
export const TermSchema = termOf(CoefficientSchema)

/** A coefficient of a nuclear-modification term: a number, a parameter name, or A-dependent ({ "ofA": … }, mass-number.ts). */
export const ModificationCoefficientSchema = z.union([...CoefficientSchema.options, MassNumberCoefficientSchema], {
  error: 'expected a number, the name of a fit parameter, or an A-dependent coefficient { "ofA": [ { "k", "power", "c", "excess" } ] }'
})

/** A term of a nuclear modification R: as a term, each coefficient possibly A-dependent. */
export const ModificationTermSchema = termOf(ModificationCoefficientSchema)

const FlavourKey = z.string().regex(/^(-?[1-6]|21)$/, { error: 'flavour keys are PDG codes as strings: "1".."6", "-1".."-6" or "21"' })

/** A piece: a function of x (sum of terms) and the flavours it adds to, with weights. */
export const PieceSchema = z.object({
  id: z.string().regex(NAME_PATTERN, { error: 'a piece id is a short name (letters, digits, _ and .)' }),
  flavours: z.record(FlavourKey, z.number()),
  terms: z.array(TermSchema).min(1, { error: 'a piece needs at least one term' })
}).strict()

const ParameterSchema = z.object({
  name: z.string().regex(NAME_PATTERN, { error: 'a parameter name is letters, digits, _ and ., not starting with a digit' }),
  value: z.number()
}).strict()

const ProtonTarget = z.object({ type: z.literal('proton') }).strict()
const NucleusTarget = z.object({
  type: z.literal('nucleus'),
  z: z.number().int().min(1).max(120),
  a: z.number().int().min(1).max(300)
}).strict()

const SchemeSchema = z.object({
  type: z.enum(['fixed', 'variable']),
  nf: z.union([z.literal(3), z.literal(4), z.literal(5), z.literal(6)], { error: 'nf must be 3, 4, 5 or 6' }),
  massesGeV: z.object({
    charm: z.number().positive(),
    bottom: z.number().positive(),
    top: z.number().positive()
  }).strict()
}).strict()

const AlphasSchema = z.object({
  value: z.number().gt(0).lte(1.5),
  scaleGeV2: z.union([z.number().positive(), z.literal('mz')], { error: 'scaleGeV2 is a number of GeV² > 0 or "mz"' })
}).strict()

/** How the spread of a fit is to be published. */
export const MembersSpecSchema = z.discriminatedUnion('type', [
  z.object({
    type: z.literal('hessian'),
    tolerance: z.number().positive(),
    confidenceLevelPercent: z.number().gt(0).lt(100)
  }).strict(),
  z.object({
    type: z.literal('replicas'),
    count: z.number().int().min(2).max(10000),
    seed: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER),
    confidenceLevelPercent: z.number().gt(0).lt(100).default(68)
  }).strict()
])

/** Node counts and ranges of the output grid. */
export const GridSpecSchema = z.object({
  x: z.object({
    count: z.number().int().min(8).max(2000),
    min: z.number().gt(0).lt(1),
    max: z.number().gt(0).lt(1)
  }).strict().optional(),
  q2: z.object({
    count: z.number().int().min(2).max(2000),
    maxGeV2: z.number().positive()
  }).strict().optional()
}).strict()

const SumRulesSchema = z.object({
  uValence: z.string().optional(),
  dValence: z.string().optional(),
  momentum: z.string().optional()
}).strict()

const Header = {
  formatVersion: z.literal(1, { error: 'this engine reads formatVersion 1' }),
  name: z.string().min(1),
  family: z.string().min(1),
  version: z.string().min(1),
  description: z.string(),
  authors: z.array(z.string()).optional()
}

/** Schema of a parametrised input document. */
export const ParametrisedInputSchema = z.object({
  format: z.literal('sheaf.parametrised-input'),
  ...Header,
  density: setDensitySchema.optional(),
  target: z.discriminatedUnion('type', [ProtonTarget, NucleusTarget]),
  startScaleGeV2: z.number().positive(),
  alphas: AlphasSchema,
  scheme: SchemeSchema,
  parameters: z.array(ParameterSchema).default([]),
  covariance: z.array(z.array(z.number())).optional(),
  pieces: z.array(PieceSchema).min(1),
  sumRules: SumRulesSchema.optional(),
  members: MembersSpecSchema.optional(),
  grid: GridSpecSchema.optional()
}).strict()

/** Schema of a nuclear-modification document. */
export const NuclearModificationSchema = z.object({
  format: z.literal('sheaf.nuclear-modification'),
  ...Header,
  target: NucleusTarget,
  baseline: z.object({
    name: z.string().min(1),
    version: z.string().optional(),
    file: z.string().optional()
  }).strict(),
  parameters: z.array(ParameterSchema).default([]),
  covariance: z.array(z.array(z.number())).optional(),
  modifications: z.array(z.object({
    id: z.string().regex(NAME_PATTERN),
    appliesTo: z.array(z.string()).min(1),
    terms: z.array(ModificationTermSchema).min(1)
  }).strict()).min(1),
  members: MembersSpecSchema.optional(),
  grid: GridSpecSchema.optional()
}).strict()

/** A term as written in a document. */
export type TermDoc = z.infer<typeof TermSchema>
/** A nuclear-modification term as written (coefficients possibly A-dependent). */
export type ModificationTermDoc = z.infer<typeof ModificationTermSchema>
/** A piece as written in a document. */
export type PieceDoc = z.infer<typeof PieceSchema>
/** A validated parametrised-input document. */
export type ParametrisedInputDoc = z.infer<typeof ParametrisedInputSchema>
/** A validated nuclear-modification document. */
export type NuclearModificationDoc = z.infer<typeof NuclearModificationSchema>
/** How members are to be built. */
export type MembersSpec = z.infer<typeof MembersSpecSchema>
/** Output grid request. */
export type GridSpec = z.infer<typeof GridSpecSchema>
