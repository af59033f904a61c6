/**
 * Coefficients of a nuclear modification that depend on the nucleus (see
 * shared/physics/README.md, "Nuclear families"). In a modification term, any of A, a, b, c_k may
 * be, besides a number or a parameter name, an object written with the same coefficients:
 *
 *   { "ofA": [ { "k": …, "power": …, "c": [c₁, c₂, …], "excess": [e₁, e₂, …] }, … ] }
 *
 * meaning Σ_j k_j · A^{p_j} · (1 + Σ_m c_jm A^{−m/3}) · (1 + Σ_n e_jn δⁿ), δ = (A − 2Z)/A the
 * neutron excess, each k, p, c, e a number or a fit parameter (k defaults to 1, power to 0). It
 * mirrors a term A x^a (1−x)^b (1 + Σ c_k x^{k/2}) with A^{−1/3} in place of √x: a power of A
 * ({ "k": "s", "power": "gamma" }), a polynomial in A^{−1/3} ({ "k": "s", "c": [-1] } is
 * s(1 − A^{−1/3})) and a Z dependence through δ. Once the nucleus is fixed, the value is a
 * function of the parameter vector alone, so one fit and covariance give members for any nucleus.
 */
import { z } from 'zod'

/** A nucleus: Z protons and A − Z neutrons, integers 1 ≤ Z ≤ A ≤ 300. */
export interface Nucleus {
  z: number
  a: number
}

const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_.]*$/

/** A plain coefficient: a number or the name of a fit parameter (as in a term). */
const PlainCoefficient = z.union([z.number(), z.string().regex(NAME_PATTERN)], {
  error: 'expected a number or the name of a fit parameter (letters, digits, _ and ., not starting with a digit)'
})

/** One term k · A^p · (1 + Σ c_m A^{−m/3}) · (1 + Σ e_n δⁿ) of an A-dependent coefficient. */
export const MassNumberTermSchema = z.object({
  k: PlainCoefficient.default(1),
  power: PlainCoefficient.default(0),
  c: z.array(PlainCoefficient).max(6).default([]),
  excess: z.array(PlainCoefficient).max(4).default([])
}).strict()

/** An A-dependent coefficient: { "ofA": [terms] }. */
export const MassNumberCoefficientSchema = z.object({
  ofA: z.array(MassNumberTermSchema).min(1, { error: 'ofA needs at least one term' }).max(8)
}).strict()

export type MassNumberTermDoc = z.infer<typeof MassNumberTermSchema>
export type MassNumberCoefficientDoc = z.infer<typeof MassNumberCoefficientSchema>

/** A coefficient of a modification term as written: number, parameter name or A-dependent. */
export type ModificationCoefficientDoc = number | string | MassNumberCoefficientDoc

/** Whether a written coefficient depends on the nucleus. */
export const isMassNumberCoefficient = (v: unknown): v is MassNumberCoefficientDoc =>
  typeof v === 'object' && v !== null && 'ofA' in v

/** A compiled plain coefficient: a number, or the i-th fit parameter. */
export type PlainRef = number | { param: number }

/** A compiled A-dependent coefficient, for one nucleus. */
export interface MassNumberRef {
  ofA: Array<{ k: PlainRef, power: PlainRef, c: PlainRef[], excess: PlainRef[] }>
  nucleus: Nucleus
}

const plain = (ref: PlainRef, params: ArrayLike<number>) => (typeof ref === 'number' ? ref : params[ref.param]!)

/** 1 + Σ_m coefficients[m−1]·base^m. */
function polynomial(coefficients: readonly PlainRef[], base: number, params: ArrayLike<number>): number {
  let poly = 1
  let w = 1
  for (const c of coefficients) {
    w *= base
    poly += plain(c, params) * w
  }
  return poly
}

/**
 * The value of an A-dependent coefficient at parameter vector `params` (NaN or ±∞ when the
 * parameters make it so; the feasibility checks report that). A single term with k only and no
 * power, c or excess gives k exactly, bit for bit.
 * @example massNumberValue({ ofA: [{ k: 2, power: 0, c: [-1], excess: [] }], nucleus: { z: 4, a: 8 } }, []) // 2(1 − 8^{−1/3}) = 1
 */
export function massNumberValue(ref: MassNumberRef, params: ArrayLike<number>): number {
  const { a, z: zz } = ref.nucleus
  const inverseCubeRoot = Math.cbrt(1 / a)
  const excess = (a - 2 * zz) / a
  let sum = 0
  for (const t of ref.ofA) {
    let value = plain(t.k, params)
    const p = plain(t.power, params)
    if (p !== 0) value *= Math.pow(a, p)
    if (t.c.length > 0) value *= polynomial(t.c, inverseCubeRoot, params)
    if (t.excess.length > 0) value *= polynomial(t.excess, excess, params)
    sum += value
  }
  return sum
}

const fmtNumber = (v: number) => (Number.isInteger(v) ? String(v) : Number(v.toPrecision(6)).toString())

/**
 * The formula of a written A-dependent coefficient in words, e.g.
 * "shadow_v·(1 − 1·A^(−1/3))" or "s0·A^(gamma)".
 */
export function describeMassNumberCoefficient(doc: MassNumberCoefficientDoc): string {
  const coef = (v: number | string) => (typeof v === 'number' ? fmtNumber(v) : v)
  const poly = (list: Array<number | string>, base: (m: number) => string) =>
    `(1${list.map((c, m) => ` + ${coef(c)}·${base(m + 1)}`).join('')})`
  return doc.ofA.map((t) => {
    const parts = [coef(t.k)]
    if (t.power !== 0) parts.push(`A^(${coef(t.power)})`)
    if (t.c.length > 0) parts.push(poly(t.c, m => `A^(−${m}/3)`))
    if (t.excess.length > 0) parts.push(poly(t.excess, m => (m === 1 ? 'δ' : `δ^${m}`)))
    return parts.join('·')
  }).join(' + ')
}

/** Why `nucleus` is not a nucleus the engine builds for, or null. */
export function nucleusProblem(nucleus: { z: unknown, a: unknown }): string | null {
  const { z: zz, a } = nucleus
  if (typeof zz !== 'number' || typeof a !== 'number' || !Number.isInteger(zz) || !Number.isInteger(a)) return `Z and A must be integers; got Z = ${String(zz)}, A = ${String(a)}`
  if (zz < 1) return `Z = ${zz}: a nucleus needs at least one proton`
  if (a > 300) return `A = ${a} is above 300, the largest mass number the engine builds for`
  if (zz > a) return `Z = ${zz} exceeds A = ${a}`
  return null
}
