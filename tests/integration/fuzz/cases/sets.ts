// Bad inputs of the set library: the multipart upload (file bytes, names, file names), the
// rename, and the build from a fit (JSON documents).
import { readFileSync } from 'node:fs'
import fc from 'fast-check'
import { writeSetFile } from '../../../../shared/physics/sets/write'
import { toySetBytes } from '../../workflow/helpers'
import { badText, overlong, unstorableMutation, withNul, withUnstorable, words } from '../bad-values'
import { rawRequest, sendForm, sendJson, type Attempt, type Part, type Target } from '../harness'

const toy = toySetBytes({ name: 'fuzz-upload', nx: 12, nq: 6 })

/** A valid set file whose header field `field` is `value`. */
function withHeader(field: 'name' | 'family' | 'provenance', value: string) {
  return writeSetFile({ ...toy.set, header: { ...toy.set.header, [field]: value } })
}

export function setUploads(t: Target): fc.Arbitrary<Attempt> {
  const path = `${t.base}/sets`
  const upload = (describe: string, parts: Part[], where: Attempt['where']): Attempt =>
    ({ describe: `upload ${describe}`, where, send: () => sendForm(t.ws.analyst.client, path, parts) })
  const file = (data: Uint8Array, filename = 'fuzz.sheafset'): Part => ({ name: 'file', filename, data })
  return fc.oneof(
    fc.uint8Array({ maxLength: 3000 }).map(bytes => upload(`${bytes.length} random bytes`, [file(bytes)], '*')),
    fc.nat({ max: toy.bytes.length - 1 }).map(n => upload(`a file cut after ${n} bytes`, [file(toy.bytes.slice(0, n))], '*')),
    fc.tuple(fc.nat({ max: 15 }), fc.integer({ min: 1, max: 255 })).map(([at, xor]) => {
      const bytes = toy.bytes.slice()
      bytes[at] = bytes[at]! ^ xor
      return upload(`a file with byte ${at} of its magic changed`, [file(bytes)], '*')
    }),
    fc.tuple(fc.constantFrom('name', 'family', 'provenance') as fc.Arbitrary<'name' | 'family' | 'provenance'>, withUnstorable(words))
      .map(([field, value]) => upload(`a header ${field} ${JSON.stringify(value)}`, [file(withHeader(field, value))], `set.${field}`)),
    fc.oneof(withNul(words), overlong(200))
      .map(name => upload(`under the name ${JSON.stringify(name.slice(0, 40))} (${name.length} characters)`, [file(toy.bytes), { name: 'name', data: name }], 'name')),
    overlong(255).map(n => upload(`with a file name of ${n.length} characters`, [file(toy.bytes, n)], 'fileName')),
    fc.constant(upload('again under the name of a stored set', [file(t.setBytes), { name: 'name', data: t.setName }], 'name')),
    fc.constant(upload('without a file part', [{ name: 'name', data: 'no file' }], null)),
    fc.constant<Attempt>({ describe: 'upload as JSON', where: null, send: () => rawRequest(t.ws.analyst.client, 'POST', path, '{"file":"abc"}') })
  )
}

export function setRenames(t: Target): fc.Arbitrary<Attempt> {
  const path = `${t.base}/sets/${t.setId}`
  const rename = (describe: string, body: unknown, where: string): Attempt =>
    ({ describe: `rename ${describe}`, where, send: () => sendJson(t.ws.analyst.client, 'PATCH', path, body) })
  return fc.oneof(
    badText(200).map(name => rename(`to ${JSON.stringify(name).slice(0, 60)}`, { name }, 'name')),
    fc.constantFrom('', '   ').map(name => rename(`to ${JSON.stringify(name)}`, { name }, 'name')),
    fc.constant(rename('to the name of another set', { name: t.otherSetName }, 'name')),
    fc.constant(rename('without a name', {}, 'name')),
    words.map(key => rename(`with an unknown field ${key}`, { name: 'fine', [key]: 1 }, key))
  )
}

/** The invented minimal fit on a small grid: valid, so every mutation below is what breaks it. */
const fit = (() => {
  const doc = JSON.parse(readFileSync(new URL('../../../../samples/fits/minimal-input.json', import.meta.url), 'utf8'))
  doc.grid = { x: { count: 20, min: 1e-4, max: 0.9 }, q2: { count: 6, maxGeV2: 1000 } }
  return doc as Record<string, unknown>
})()

/** Changes that the engine's input parser must refuse, and the JSON path it must name. */
const brokenFits: Array<[string, (d: Record<string, any>) => void, string]> = [
  ['format', (d) => { d.format = 'sheaf.something-else' }, 'format'],
  ['formatVersion', (d) => { d.formatVersion = 99 }, 'formatVersion'],
  ['a parameter value', (d) => { d.parameters[0].value = 'abc' }, 'parameters'],
  ['the covariance size', (d) => { d.covariance = [[1]] }, 'covariance'],
  ['no pieces', (d) => { d.pieces = [] }, 'pieces'],
  ['a missing pieces key', (d) => { delete d.pieces }, 'pieces'],
  ['the start scale', (d) => { d.startScaleGeV2 = -2 }, 'startScaleGeV2'],
  ['the flavour number', (d) => { d.scheme.nf = 7 }, 'scheme'],
  ['the grid', (d) => { d.grid.x.count = -5 }, 'grid'],
  ['a piece reference', (d) => { d.sumRules.momentum = 'nowhere' }, 'sumRules'],
  ['an unknown parameter', (d) => { d.pieces[0].terms[0].a = 'not_a_parameter' }, 'pieces'],
  ['a name too long for a set', (d) => { d.name = 'n'.repeat(5000) }, 'input.name']
]

export function setBuilds(t: Target): fc.Arbitrary<Attempt> {
  const path = `${t.base}/sets/builds`
  const build = (describe: string, body: unknown, where: string): Attempt =>
    ({ describe: `build ${describe}`, where, send: () => sendJson(t.ws.analyst.client, 'POST', path, body) })
  const inField = (field: string, p: Array<string | number>) => [field, ...p].join('.')
  return fc.oneof(
    unstorableMutation(fit).map(m => build(`with ${m.kind} at input.${m.path.join('.')}`, { input: m.doc }, inField('input', m.path))),
    unstorableMutation(fit).map(m => build(`with ${m.kind} at baseline.${m.path.join('.')}`, { input: fit, baseline: m.doc }, inField('baseline', m.path))),
    fc.constantFrom(...brokenFits).map(([what, change, where]) => {
      const doc = structuredClone(fit) as Record<string, any>
      change(doc)
      return build(`with a broken ${what}`, { input: doc }, where)
    }),
    badText(200).map(name => build(`named ${JSON.stringify(name).slice(0, 60)}`, { name, input: fit }, 'name')),
    fc.constantFrom<unknown>(42, 'text', [], null).map(input => build(`with the input ${JSON.stringify(input)}`, { input }, 'input')),
    fc.constant(build('without an input', { name: 'no input' }, 'input')),
    fc.constantFrom<[unknown, string]>(
      [{ type: 'replicas', count: 0, seed: 1 }, 'members'], [{ type: 'hessian', tolerance: -1 }, 'members'], ['all', 'members']
    ).map(([members, where]) => build(`with members ${JSON.stringify(members)}`, { input: fit, members }, where)),
    words.map(key => build(`with an unknown field ${key}`, { input: fit, [key]: true }, key))
  )
}
