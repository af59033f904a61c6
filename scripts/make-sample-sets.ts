/**
 * Writes the sample error-set files in samples/sets/: two TOY sets to try uploads and studies,
 * and deliberately malformed files for the upload error paths (each described in
 * samples/sets/README.md with the error it must produce). The TOY sets come from made-up
 * analytic functions (shared/physics/sets/toy.ts): they are not fits and not evolutions. The
 * replica files (toy-replicas, bad-replica-mean) draw from the engine's random streams
 * (shared/physics/random.ts): run this again whenever those change.
 *
 *   npx tsx scripts/make-sample-sets.ts
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { SET_FILE_PREAMBLE_BYTES, assembleSetFile, readSetHeader, toyErrorSet, toyQ2Nodes, toyXNodes, writeSetFile } from '../shared/physics/sets'
import type { ErrorSet, FlavourScheme } from '../shared/physics/types'

const dir = fileURLToPath(new URL('../samples/sets/', import.meta.url))
mkdirSync(dir, { recursive: true })
const write = (name: string, bytes: Uint8Array) => {
  writeFileSync(`${dir}${name}`, bytes)
  console.log(`${name}: ${bytes.length} bytes`)
}

// --- TOY sets to use -------------------------------------------------------------------
const variable: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const x = toyXNodes(20, 1e-5, 0.95)
const q2 = toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e5, count: 24, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] })
write('toy-hessian.sheafset', writeSetFile(toyErrorSet({ kind: 'hessian-pairs', errorMembers: 4, x, q2, scheme: variable, name: 'toy-hessian' }), { encoding: 'float32-le' }))
write('toy-replicas.sheafset', writeSetFile(toyErrorSet({ kind: 'replicas', errorMembers: 8, x, q2, scheme: variable, seed: 7, name: 'toy-replicas' }), { encoding: 'float32-le' }))

// --- Malformed files, all derived from one tiny valid TOY set ------------------------------
const fixed: FlavourScheme = { type: 'fixed', nf: 3, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const tiny: ErrorSet = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 1, x: toyXNodes(6, 1e-4, 0.9), q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 4 }), scheme: fixed, name: 'toy-tiny' })
const good = writeSetFile(tiny)
const { bodyOffset } = readSetHeader(good)
const header = () => JSON.parse(new TextDecoder().decode(good.subarray(SET_FILE_PREAMBLE_BYTES, bodyOffset))) as Record<string, any>
const body = good.subarray(bodyOffset)
const nx = tiny.x.length
const nq = tiny.q2.length
const nf = tiny.flavours.length
const perMember = nx * nq * nf

write('bad-magic.sheafset', new TextEncoder().encode('x,q2,pdg,xf\n0.1,10,21,1.5\n'))

{
  const bytes = good.slice()
  const at = bytes.indexOf(0x3a) // the first ':' of the header JSON
  bytes[at] = 0x3d // '='
  write('bad-header-json.sheafset', bytes)
}
{
  const h = header()
  h.set.colour = 'blue'
  write('bad-unknown-key.sheafset', assembleSetFile(h, body))
}
{
  const h = header()
  h.grid.x[5] = 1.2
  write('bad-x-outside.sheafset', assembleSetFile(h, body))
}
{
  const h = header()
  ;[h.grid.q2GeV2[1], h.grid.q2GeV2[2]] = [h.grid.q2GeV2[2], h.grid.q2GeV2[1]]
  write('bad-q2-order.sheafset', assembleSetFile(h, body))
}
{
  const h = header()
  h.grid.q2GeV2[2] = h.grid.q2GeV2[1]
  write('bad-q2-repeat.sheafset', assembleSetFile(h, body))
}
{
  const h = header()
  h.set.memberCount = 4
  h.body.valueCount = 4 * perMember
  const four = new Uint8Array(4 * perMember * 8)
  four.set(body)
  four.set(body.subarray(0, perMember * 8), 3 * perMember * 8)
  write('bad-member-count.sheafset', assembleSetFile(h, four))
}
{
  const h = header()
  h.set.memberCount = 0
  h.body.valueCount = 0
  write('bad-missing-central.sheafset', assembleSetFile(h, new Uint8Array(0)))
}
write('bad-body-length.sheafset', good.subarray(0, good.length - 100))
{
  const bytes = good.slice()
  const index = ((2 * nq + 1) * nx + 3) * nf + tiny.flavours.indexOf(21) // member 2, Q² node 1, x node 3, gluon
  new DataView(bytes.buffer).setFloat64(bodyOffset + index * 8, Number.NaN, true)
  write('bad-nan.sheafset', bytes)
}
{
  const replicas = toyErrorSet({ kind: 'replicas', errorMembers: 4, x: tiny.x, q2: tiny.q2, scheme: fixed, seed: 3, name: 'toy-tiny-replicas' })
  const bytes = writeSetFile(replicas)
  const start = readSetHeader(bytes).bodyOffset
  const view = new DataView(bytes.buffer)
  view.setFloat64(start, view.getFloat64(start, true) * 1.5, true) // member 0, first value: no longer the mean
  write('bad-replica-mean.sheafset', bytes)
}
{
  const h = header()
  h.set.alphasMembers = [2, 1] // the α_s members must be the last two, down then up: [1, 2]
  write('bad-alphas-members.sheafset', assembleSetFile(h, body))
}
