/**
 * Reading input documents: JSON text → validated document, with every problem reported by its
 * JSON path (or line and column for a JSON syntax error). Pure: the caller reads the file.
 */
import type { ZodError } from 'zod'
import { activeFlavours, checkScheme } from '../alphas'
import { checkedCovariance } from '../fit/covariance'
import { formatPath } from '../json-path'
import { InputError, type InputIssue } from './errors'
import { alphasReference, membersSpecIssues, q2GridIssues, startScaleIssues, xGridIssues } from './feasibility'
import {
  NuclearModificationSchema, ParametrisedInputSchema,
  type ModificationTermDoc, type NuclearModificationDoc, type ParametrisedInputDoc, type TermDoc
} from './schema'
import { isMassNumberCoefficient, nucleusProblem, type ModificationCoefficientDoc } from './mass-number'

/** A validated input document of either kind. */
export type InputDocument =
  | { kind: 'parametrised', doc: ParametrisedInputDoc }
  | { kind: 'nuclear', doc: NuclearModificationDoc }

/** Line and column (1-based) of a character offset in a text. */
function lineColumn(text: string, offset: number): { line: number, column: number } {
  let line = 1
  let last = -1
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) { line++; last = i }
  }
  return { line, column: offset - last }
}

function zodIssues(error: ZodError): InputIssue[] {
  return error.issues.map((i) => {
    // A bad record key carries its own reason one level down.
    const inner = i.code === 'invalid_key' ? i.issues[0]?.message : undefined
    return { path: formatPath(i.path), message: inner ?? i.message }
  })
}

/**
 * Parses and validates an input document from JSON text.
 * @param text the file's contents.
 * @param source a label for messages, normally the file name.
 * @throws InputError (a RangeError) listing every problem: JSON syntax errors with line and
 * column, schema errors and consistency errors (unknown parameters, covariance shape and
 * definiteness, flavours not active at μ₀², …) with their JSON paths.
 * @example parseInputText(fs.readFileSync('samples/fits/minimal-input.json', 'utf8'), 'minimal-input.json')
 */
export function parseInputText(text: string, source = 'input'): InputDocument {
  let value: unknown
  try {
    value = JSON.parse(text)
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e)
    const pos = /position (\d+)/.exec(msg)
    const where = pos ? lineColumn(text, Number(pos[1])) : undefined
    throw new InputError(source, [{
      path: '',
      message: where ? `not valid JSON at line ${where.line}, column ${where.column} (${msg})` : `not valid JSON (${msg})`
    }])
  }
  return parseInputDocument(value, source)
}

/**
 * Validates an already-parsed JSON value as an input document (dispatching on its `format`).
 * @throws InputError listing every problem with its JSON path.
 * @example parseInputDocument({ format: 'sheaf.parametrised-input', … }, 'request body')
 */
export function parseInputDocument(value: unknown, source = 'input'): InputDocument {
  const format = typeof value === 'object' && value !== null ? (value as { format?: unknown }).format : undefined
  if (format === 'sheaf.parametrised-input') {
    const r = ParametrisedInputSchema.safeParse(value)
    if (!r.success) throw new InputError(source, zodIssues(r.error))
    const issues = checkParametrised(r.data)
    if (issues.length > 0) throw new InputError(source, issues)
    return { kind: 'parametrised', doc: r.data }
  }
  if (format === 'sheaf.nuclear-modification') {
    const r = NuclearModificationSchema.safeParse(value)
    if (!r.success) throw new InputError(source, zodIssues(r.error))
    const issues = checkParameterBlock(r.data.parameters, r.data.covariance, r.data.members !== undefined)
    issues.push(...checkReferences(r.data.parameters.map(p => p.name), r.data.modifications.map((m, i) => ({ path: `modifications[${i}]`, terms: m.terms })), true))
    // The Q² grid against the thresholds needs the baseline's scheme: compileInput checks it.
    issues.push(...xGridIssues(r.data.grid), ...q2GridIssues(r.data.grid), ...membersSpecIssues(r.data.members))
    const ids = new Set<string>()
    r.data.modifications.forEach((m, i) => {
      if (ids.has(m.id)) issues.push({ path: `modifications[${i}].id`, message: `duplicate modification id "${m.id}"` })
      ids.add(m.id)
    })
    const targetProblem = nucleusProblem(r.data.target)
    if (targetProblem) issues.push({ path: 'target', message: targetProblem, kind: 'physics' })
    if (issues.length > 0) throw new InputError(source, issues)
    return { kind: 'nuclear', doc: r.data }
  }
  throw new InputError(source, [{
    path: 'format',
    message: `expected "sheaf.parametrised-input" or "sheaf.nuclear-modification"; got ${JSON.stringify(format)}`
  }])
}

/** Parameter names unique; covariance n×n, symmetric, positive definite; members need it. */
function checkParameterBlock(
  parameters: { name: string, value: number }[],
  covariance: number[][] | undefined,
  wantsMembers: boolean
): InputIssue[] {
  const issues: InputIssue[] = []
  const seen = new Map<string, number>()
  parameters.forEach((p, i) => {
    if (seen.has(p.name)) issues.push({ path: `parameters[${i}].name`, message: `duplicate parameter "${p.name}" (also parameters[${seen.get(p.name)}])` })
    seen.set(p.name, i)
  })
  if (covariance !== undefined) {
    const n = parameters.length
    if (covariance.length !== n) {
      issues.push({ path: 'covariance', message: `has ${covariance.length} rows; ${n} parameters need a ${n}×${n} matrix` })
    } else {
      const bad = covariance.findIndex(r => r.length !== n)
      if (bad >= 0) {
        issues.push({ path: `covariance[${bad}]`, message: `row has ${covariance[bad]!.length} entries, expected ${n}` })
      } else {
        try {
          checkedCovariance(covariance, n)
        } catch (e) {
          issues.push({ path: 'covariance', message: (e as Error).message.replace(/C\[(\d+)\]\[(\d+)\]/g, (_, i, j) => `C[${i}][${j}] (${parameters[Number(i)]?.name} × ${parameters[Number(j)]?.name})`), kind: 'physics' })
        }
      }
    }
  } else if (wantsMembers) {
    issues.push({ path: 'covariance', message: 'a members block (Hessian or replicas) needs the parameter covariance' })
  }
  return issues
}

/** Every named coefficient refers to a declared parameter; optionally every parameter is used. */
function checkReferences(
  names: string[],
  groups: { path: string, terms: Array<TermDoc | ModificationTermDoc> }[],
  requireAllUsed: boolean
): InputIssue[] {
  const issues: InputIssue[] = []
  const known = new Set(names)
  const used = new Set<string>()
  const check = (v: ModificationCoefficientDoc, path: string) => {
    if (isMassNumberCoefficient(v)) {
      v.ofA.forEach((t, j) => {
        const at = `${path}.ofA[${j}]`
        check(t.k, `${at}.k`)
        check(t.power, `${at}.power`)
        t.c.forEach((c, m) => check(c, `${at}.c[${m}]`))
        t.excess.forEach((e, m) => check(e, `${at}.excess[${m}]`))
      })
      return
    }
    if (typeof v !== 'string') return
    if (known.has(v)) used.add(v)
    else {
      issues.push({ path, message: `unknown parameter "${v}"${names.length > 0 ? ` (declared: ${names.slice(0, 12).join(', ')}${names.length > 12 ? ', …' : ''})` : ' (no parameters are declared)'}` })
    }
  }
  for (const g of groups) {
    g.terms.forEach((t, k) => {
      const base = `${g.path}.terms[${k}]`
      check(t.A, `${base}.A`)
      check(t.a, `${base}.a`)
      check(t.b, `${base}.b`)
      t.c.forEach((c, m) => check(c, `${base}.c[${m}]`))
    })
  }
  if (requireAllUsed) {
    names.forEach((n, i) => {
      if (!used.has(n)) issues.push({ path: `parameters[${i}]`, message: `parameter "${n}" is declared but no term uses it` })
    })
  }
  return issues
}

function checkParametrised(doc: ParametrisedInputDoc): InputIssue[] {
  const issues = checkParameterBlock(doc.parameters, doc.covariance, doc.members !== undefined)
  issues.push(...checkReferences(doc.parameters.map(p => p.name), doc.pieces.map((p, i) => ({ path: `pieces[${i}]`, terms: p.terms })), true))
  let schemeOk = true
  try {
    checkScheme(doc.scheme)
  } catch (e) {
    schemeOk = false
    issues.push({ path: 'scheme.massesGeV', message: (e as Error).message, kind: 'physics' })
  }
  const nfStart = schemeOk ? activeFlavours(doc.startScaleGeV2, doc.scheme) : 6
  const ids = new Map<string, number>()
  doc.pieces.forEach((p, i) => {
    if (ids.has(p.id)) issues.push({ path: `pieces[${i}].id`, message: `duplicate piece id "${p.id}" (also pieces[${ids.get(p.id)}])` })
    ids.set(p.id, i)
    const keys = Object.keys(p.flavours)
    if (keys.length === 0) issues.push({ path: `pieces[${i}].flavours`, message: 'a piece must add to at least one flavour' })
    for (const k of keys) {
      const w = p.flavours[k]!
      if (w === 0) issues.push({ path: `pieces[${i}].flavours.${k}`, message: 'weight 0 adds nothing; remove the flavour' })
      const q = Math.abs(Number(k))
      if (q >= 1 && q <= 6 && q > nfStart) {
        issues.push({
          path: `pieces[${i}].flavours.${k}`,
          message: `flavour ${k} is not active at μ₀² = ${doc.startScaleGeV2} GeV² in this ${doc.scheme.type}-flavour scheme (n_f = ${nfStart} there); a heavy quark starts at zero at its threshold`,
          kind: 'physics'
        })
      }
    }
  })
  const rules = doc.sumRules ?? {}
  const named = new Map<string, string>()
  for (const [rule, id] of Object.entries(rules)) {
    if (id === undefined) continue
    if (!ids.has(id)) issues.push({ path: `sumRules.${rule}`, message: `no piece has id "${id}" (pieces: ${[...ids.keys()].join(', ')})` })
    if (named.has(id)) issues.push({ path: `sumRules.${rule}`, message: `piece "${id}" is already normalised by the ${named.get(id)} rule; each rule needs its own piece` })
    named.set(id, rule)
  }
  if (doc.grid?.x && !(doc.grid.x.min < doc.grid.x.max)) {
    issues.push({ path: 'grid.x', message: `min = ${doc.grid.x.min} must be below max = ${doc.grid.x.max}`, kind: 'physics' })
  }
  if (doc.grid?.q2 && !(doc.grid.q2.maxGeV2 > doc.startScaleGeV2)) {
    issues.push({ path: 'grid.q2.maxGeV2', message: `must exceed the starting scale μ₀² = ${doc.startScaleGeV2} GeV²`, kind: 'physics' })
  }
  if (doc.density?.type === 'fragmentation') {
    if (doc.sumRules !== undefined) {
      issues.push({ path: 'sumRules', message: 'the parton-density sum rules (valence numbers, momentum ∫ x Σ f dx = 1) do not apply to fragmentation functions; remove sumRules (each species is checked for z·D ≥ 0 and ∫ z·D dz ≤ 1 per parton instead)' })
    }
    if (doc.target.type !== 'proton') {
      issues.push({ path: 'target', message: 'fragmentation functions describe a parton turning into hadrons, not a target: give { "type": "proton" } (the field is not used for them)' })
    }
  }
  if (doc.target.type === 'nucleus' && doc.target.z > doc.target.a) {
    issues.push({ path: 'target', message: `Z = ${doc.target.z} exceeds A = ${doc.target.a}`, kind: 'physics' })
  }
  if (schemeOk) issues.push(...startScaleIssues(doc.startScaleGeV2, alphasReference(doc.alphas), doc.scheme))
  issues.push(...xGridIssues(doc.grid), ...q2GridIssues(doc.grid, doc.startScaleGeV2, schemeOk ? doc.scheme : undefined), ...membersSpecIssues(doc.members))
  if (doc.members && doc.parameters.length === 0) {
    issues.push({ path: 'members', message: 'members need at least one fit parameter' })
  }
  return issues
}
