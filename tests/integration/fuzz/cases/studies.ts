// Bad inputs of studies: the body of create, patch and validate (fields and the spec with its
// bins), and user-kernel expressions.
import { readFileSync } from 'node:fs'
import fc from 'fast-check'
import { f2Spec } from '../../workflow/helpers'
import { badText, overlong, unstorableMutation, withUnstorable, words } from '../bad-values'
import { BINS, INF, sendJson, type Attempt, type Target } from '../harness'

type Body = Record<string, unknown>

/** One broken field of a study body and the field the answer must name. */
function brokenFields(t: Target): fc.Arbitrary<{ what: string, change: (b: Body) => Body, where: string }> {
  const set = (field: string, value: unknown) => (b: Body) => ({ ...b, [field]: value })
  const spec = f2Spec(BINS)
  const binsWith = (i: number, bin: unknown) => ({ ...spec, bins: spec.bins.map((b, j) => (j === i ? bin : b)) })
  return fc.oneof(
    badText(200).map(v => ({ what: `name ${JSON.stringify(v).slice(0, 40)}`, change: set('name', v), where: 'name' })),
    fc.oneof(overlong(5000), withUnstorable(words)).map(v => ({ what: `description of ${v.length} characters`, change: set('description', v), where: 'description' })),
    unstorableMutation(spec).map(m => ({ what: `spec with ${m.kind} at ${m.path.join('.')}`, change: set('spec', m.doc), where: ['spec', ...m.path].join('.') })),
    fc.constantFrom('nope', 'constructor', '__proto__', 'toString', 'hasOwnProperty', '')
      .map(k => ({ what: `kernel ${JSON.stringify(k)}`, change: set('spec', { ...spec, kernel: k }), where: 'kernel' })),
    fc.constantFrom<unknown>([], 'bins', null, {}).map(bins => ({ what: `bins ${JSON.stringify(bins)}`, change: set('spec', { ...spec, bins }), where: 'bins' })),
    fc.tuple(fc.nat({ max: BINS - 1 }), fc.constantFrom<unknown>(-1, 0, 2, 'abc', null, true))
      .map(([i, x]) => ({ what: `bin ${i + 1} x = ${JSON.stringify(x)}`, change: set('spec', binsWith(i, { ...spec.bins[i], x })), where: 'bin' })),
    fc.nat({ max: BINS - 1 }).map(i => ({ what: `bin ${i + 1} beyond the grid`, change: set('spec', binsWith(i, { x: 0.01, q2: 1e9 })), where: 'bin' })),
    fc.constantFrom<unknown>(['nope'], [t.setId, t.setId], 'all', Array.from({ length: 21 }, (_, i) => `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`))
      .map(ids => ({ what: `setIds ${JSON.stringify(ids).slice(0, 60)}`, change: set('setIds', ids), where: 'setIds' })),
    fc.uuid().map(id => ({ what: `a set ${id} of no workspace`, change: set('setIds', [id]), where: 'setIds' })),
    fc.constantFrom<unknown>('x', 42).map(id => ({ what: `secondSetId ${JSON.stringify(id)}`, change: set('secondSetId', id), where: 'secondSetId' })),
    fc.uuid().map(id => ({ what: `secondSetId ${id} of no workspace`, change: set('secondSetId', id), where: 'secondSetId' })),
    fc.constantFrom<unknown>(0, 100, -1, 'abc', INF, null).map(v => ({ what: `clPercent ${JSON.stringify(v)}`, change: set('clPercent', v), where: 'clPercent' })),
    fc.constantFrom<unknown>('bogus', 'constructor', '__proto__', 7).map(v => ({ what: `prescription ${JSON.stringify(v)}`, change: set('prescription', v), where: 'prescription' })),
    words.map(key => ({ what: `unknown field ${key}`, change: set(key, 1), where: key }))
  )
}

export function studyCreates(t: Target): fc.Arbitrary<Attempt> {
  const valid: Body = { name: 'Fuzz created', spec: f2Spec(BINS), setIds: [t.setId] }
  return fc.oneof(
    brokenFields(t),
    fc.constant({ what: 'no spec', change: (b: Body) => ({ ...b, spec: undefined }), where: 'spec' })
  ).map(({ what, change, where }) => ({
    describe: `create a study with ${what}`, where, send: () => sendJson(t.ws.analyst.client, 'POST', `${t.base}/studies`, change(valid))
  }))
}

export function studyPatches(t: Target): fc.Arbitrary<Attempt> {
  return fc.oneof(
    brokenFields(t),
    fc.constantFrom<unknown>(0, -1, 1.5, 'x').map(v => ({ what: `revision ${JSON.stringify(v)}`, change: (b: Body) => ({ ...b, revision: v }), where: 'revision' }))
  ).map(({ what, change, where }) => ({
    describe: `patch the study with ${what}`, where, send: () => sendJson(t.ws.analyst.client, 'PATCH', `${t.base}/studies/${t.studyId}`, change({}))
  }))
}

export function studyValidations(t: Target): fc.Arbitrary<Attempt> {
  // The draft schema is strict: name, description, clPercent and prescription are unknown fields here.
  return brokenFields(t).map(({ what, change, where }) => ({
      describe: `validate a draft with ${what}`, where,
      send: () => sendJson(t.ws.viewer.client, 'POST', `${t.base}/studies/validate`, change({ spec: f2Spec(BINS), setIds: [t.setId] }))
    }))
}

const userSpec = JSON.parse(readFileSync(new URL('../../../../samples/studies/user-kernel.json', import.meta.url), 'utf8')) as { options: Record<string, unknown> }

/** Expressions the hadronic user kernel accepts (variables m, y, x1, x2, tau, s). */
const validExpression = fc.constantFrom('1', 'hbarc2 / m^2', 'x1 * x2', 'sqrt(tau) + 1', 'exp(-y^2)', 'log(m) * 2', 'max(x1, x2)')

/** Names every JavaScript object inherits. */
const INHERITED = ['constructor', 'toString', '__proto__', 'valueOf', 'hasOwnProperty', 'isPrototypeOf', 'propertyIsEnumerable', 'toLocaleString', '__defineGetter__', '__lookupGetter__']

/** Calls with an argument count the function does not take. */
const wrongCounts: Array<[string, number[]]> = [
  ['sqrt', [0, 2, 3]], ['sin', [0, 2]], ['exp', [0, 2]], ['abs', [0, 2]], ['cbrt', [0, 2]], ['log10', [0, 2]],
  ['atan2', [0, 1, 3]], ['pow', [0, 1, 3]], ['log', [0, 3]], ['min', [0]], ['max', [0]]
]

/** An expression that must be refused (never a 500), whatever the valid part around it. */
export const badExpression = fc.oneof(
  fc.tuple(validExpression, fc.constantFrom(...INHERITED), fc.constantFrom('*', '+', '/'))
    .chain(([v, name, op]) => fc.constantFrom(`${v} ${op} ${name}`, name, `${name}(x1)`, `${name} + ${v}`)),
  fc.tuple(fc.constantFrom(...wrongCounts), fc.nat(), validExpression).map(([[fn, counts], k, v]) => {
    const n = counts[k % counts.length]!
    return `${v} + ${fn}(${Array.from({ length: n }, (_, i) => ['x1', 'm', '2', 'tau'][i % 4]).join(', ')})`
  }),
  fc.tuple(validExpression, fc.constantFrom(...'="\'[]{};?:!@#$%&|~`<>\\'.split('')), fc.nat())
    .map(([v, c, at]) => v.slice(0, at % (v.length + 1)) + c + v.slice(at % (v.length + 1))),
  fc.tuple(validExpression, fc.stringMatching(/^[a-z_][a-z0-9_]{0,8}$/)).map(([v, id]) => `${v} + zz${id}`),
  validExpression.chain(v => fc.constantFrom(`(${v}`, `${v} +`, `* ${v}`, `${v})`, `${v} ${v}(`)),
  withUnstorable(validExpression),
  fc.constantFrom('', '   ', `${'x1 + '.repeat(450)}1`)
)

export function userKernels(t: Target): fc.Arbitrary<Attempt> {
  return fc.tuple(badExpression, fc.boolean()).map(([expression, create]) => {
    const spec = { ...userSpec, options: { ...userSpec.options, expression } }
    const describe = `${create ? 'create' : 'validate'} a user kernel ${JSON.stringify(expression).slice(0, 80)}`
    return create
      ? { describe, where: 'options.expression', send: () => sendJson(t.ws.analyst.client, 'POST', `${t.base}/studies`, { name: 'User kernel', spec, setIds: [t.setId] }) }
      : { describe, where: 'options.expression', send: () => sendJson(t.ws.viewer.client, 'POST', `${t.base}/studies/validate`, { spec, setIds: [] }) }
  })
}
