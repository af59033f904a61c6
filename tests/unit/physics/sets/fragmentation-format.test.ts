import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { densityOf, HADRON_SPECIES } from '../../../../shared/physics/fragmentation/species'
import {
  SET_FILE_PREAMBLE_BYTES, SetFormatError, assembleSetFile, parseSetFile, readSetHeader, toyErrorSet,
  toyQ2Nodes, toyXNodes, toyZD, writeSetFile
} from '../../../../shared/physics/sets'
import type { ErrorSet, FlavourScheme } from '../../../../shared/physics/types'

// Expected values follow from the format definition (shared/physics/sets/format.ts, version 2)
// and from how each case is built here; no published numbers are involved.

const variable: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const z = toyXNodes(10, 0.01, 0.95)
const q2 = toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e4, count: 8, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] })
const piPlus = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, x: z, q2, scheme: variable, name: 'toy-ff-pi+', density: { type: 'fragmentation', hadron: 'pi+' } })
const proton = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 1, x: toyXNodes(6, 1e-4, 0.9), q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 4 }), scheme: { ...variable, type: 'fixed', nf: 3 } })

function headerOf(bytes: Uint8Array): { doc: any, body: Uint8Array } {
  const length = new DataView(bytes.buffer, bytes.byteOffset).getUint32(16, true)
  const bodyOffset = SET_FILE_PREAMBLE_BYTES + length
  return { doc: JSON.parse(new TextDecoder().decode(bytes.subarray(SET_FILE_PREAMBLE_BYTES, bodyOffset))), body: bytes.slice(bodyOffset) }
}

function failure(action: () => unknown): SetFormatError {
  try {
    action()
  } catch (error) {
    expect(error).toBeInstanceOf(SetFormatError)
    return error as SetFormatError
  }
  throw new Error('a malformed set was accepted')
}

const sameBits = (a: Float64Array, b: Float64Array) =>
  Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength))

describe('set files, version 2: fragmentation sets', () => {
  it('round-trip bit for bit: header, z nodes, Q² nodes and every value; writing again gives the same bytes', () => {
    const bytes = writeSetFile(piPlus)
    const back = parseSetFile(bytes)
    expect(back.header).toEqual(piPlus.header)
    expect(back.header.density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
    expect(sameBits(back.x, piPlus.x)).toBe(true)
    expect(sameBits(back.q2, piPlus.q2)).toBe(true)
    expect(back.flavours).toEqual(piPlus.flavours)
    back.members.forEach((m, k) => expect(sameBits(m, piPlus.members[k]!)).toBe(true))
    expect(Buffer.from(writeSetFile(back)).equals(Buffer.from(bytes))).toBe(true)
  })

  it('the header says version 2, the density and hadron, names the axis z and has no target', () => {
    const { doc } = headerOf(writeSetFile(piPlus))
    expect(doc.formatVersion).toBe(2)
    expect(doc.set.density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
    expect(doc.set).not.toHaveProperty('target')
    expect(doc.grid).not.toHaveProperty('x')
    expect(doc.grid.z).toEqual(Array.from(z))
  })

  it('a parton set is written with density parton, target and grid.x, and read back without the density key (absent = parton)', () => {
    const bytes = writeSetFile(proton)
    const { doc } = headerOf(bytes)
    expect(doc.formatVersion).toBe(2)
    expect(doc.set.density).toEqual({ type: 'parton' })
    expect(doc.set.target).toEqual({ type: 'proton' })
    expect(doc.grid).toHaveProperty('x')
    expect(doc.grid).not.toHaveProperty('z')
    const back = parseSetFile(bytes)
    expect(back.header).toEqual(proton.header)
    expect(back.header).not.toHaveProperty('density')
  })

  it.each(HADRON_SPECIES.map(h => [h]))('every species round-trips: %s', (hadron) => {
    const set = toyErrorSet({ kind: 'hessian-one-sided', errorMembers: 1, x: z, q2, scheme: variable, density: { type: 'fragmentation', hadron } })
    expect(parseSetFile(writeSetFile(set)).header.density).toEqual({ type: 'fragmentation', hadron })
  })
})

describe('set files, version 1: still read, as parton densities', () => {
  // A version-1 header is the version-2 one of a parton set without set.density (format.ts).
  const v2 = headerOf(writeSetFile(proton))
  const v1doc = structuredClone(v2.doc)
  v1doc.formatVersion = 1
  delete v1doc.set.density
  const v1 = assembleSetFile(v1doc, v2.body)

  it('a hand-made version-1 file parses to the same set, with no density (parton densities)', () => {
    const set = parseSetFile(v1)
    expect(set.header).toEqual(proton.header)
    expect(densityOf(set.header)).toEqual({ type: 'parton' })
    set.members.forEach((m, k) => expect(sameBits(m, proton.members[k]!)).toBe(true))
  })

  it('the sample files written before version 2 are version 1 and read as parton densities', () => {
    const bytes = new Uint8Array(readFileSync(fileURLToPath(new URL('../../../../samples/sets/toy-hessian.sheafset', import.meta.url))))
    expect(headerOf(bytes).doc.formatVersion).toBe(1)
    const summary = readSetHeader(bytes)
    expect(summary.header.density).toBeUndefined()
    expect(summary.header.target).toEqual({ type: 'proton' })
  })

  it('a version-1 header may not carry a density: refused at the set, naming the key', () => {
    const d = structuredClone(v1doc)
    d.set.density = { type: 'fragmentation', hadron: 'pi+' }
    const e = failure(() => parseSetFile(assembleSetFile(d, v2.body)))
    expect(e.path).toBe('set')
    expect(e.byteOffset).toBe(SET_FILE_PREAMBLE_BYTES)
    expect(e.message).toContain('unknown key density')
  })
})

describe('set files, version 2: bad headers are refused with path and byte offset', () => {
  const good = headerOf(writeSetFile(piPlus))
  const edit = (change: (d: any) => void) => {
    const d = structuredClone(good.doc)
    change(d)
    return assembleSetFile(d, good.body)
  }

  it.each([
    ['a wrong hadron key', (d: any) => { d.set.density.hadron = 'pion' }, 'set.density.hadron', 'hadron must be one of pi+, pi-, pi0, K+, K-, p, pbar, h+-'],
    ['a fragmentation header with a target', (d: any) => { d.set.target = { type: 'proton' } }, 'set.target', 'a fragmentation set (into pi+) has no target'],
    ['a fragmentation header with a nucleus target', (d: any) => { d.set.target = { type: 'nucleus', z: 26, a: 56 } }, 'set.target', 'remove set.target'],
    ['a fragmentation grid named x', (d: any) => { d.grid.x = d.grid.z; delete d.grid.z }, 'grid.x', 'names its momentum-fraction axis z'],
    ['a fragmentation grid with both axes', (d: any) => { d.grid.x = d.grid.z }, 'grid.x', 'write the nodes as grid.z'],
    ['a density of unknown type', (d: any) => { d.set.density = { type: 'photon' } }, 'set.density.type', ''],
    ['no density in a version-2 header', (d: any) => { delete d.set.density }, 'set.density', ''],
    ['a z node at 1', (d: any) => { d.grid.z[9] = 1 }, 'grid.z[9]', 'z node 9 is 1; z nodes must lie in (0, 1)']
  ])('%s', (_name, change, path, text) => {
    const e = failure(() => parseSetFile(edit(change)))
    expect(e.path).toBe(path)
    if (path.startsWith('set')) expect(e.byteOffset).toBe(SET_FILE_PREAMBLE_BYTES)
    expect(e.message).toContain(text)
  })

  it('a parton header without a target is refused at set.target', () => {
    const p = headerOf(writeSetFile(proton))
    delete p.doc.set.target
    const e = failure(() => parseSetFile(assembleSetFile(p.doc, p.body)))
    expect(e.path).toBe('set.target')
    expect(e.byteOffset).toBe(SET_FILE_PREAMBLE_BYTES)
    expect(e.message).toContain('needs set.target')
  })

  it('a parton grid named z is refused at grid.z', () => {
    const p = headerOf(writeSetFile(proton))
    p.doc.grid.z = p.doc.grid.x
    delete p.doc.grid.x
    expect(failure(() => parseSetFile(assembleSetFile(p.doc, p.body))).path).toBe('grid.z')
  })

  it('the writer refuses an in-memory fragmentation set that claims a nucleus', () => {
    const bad: ErrorSet = { ...piPlus, header: { ...piPlus.header, target: { type: 'nucleus', z: 82, a: 208 } } }
    expect(failure(() => writeSetFile(bad)).path).toBe('set.target')
  })
})

describe('TOY fragmentation functions are physically sensible (sample data)', () => {
  // Common practice: z·D_i^h(z) is positive on (0, 1) and falls towards z → 1.
  it.each(HADRON_SPECIES.map(h => [h]))('%s: positive on the grid, falling from z = 0.5 to 0.95, favoured above unfavoured', (hadron) => {
    for (const pdg of [1, -1, 2, -2, 3, -3, 21]) {
      for (const q of [1, 10, 1e4]) {
        for (const zv of z) expect(toyZD(hadron, pdg, zv, q, variable)).toBeGreaterThan(0)
        expect(toyZD(hadron, pdg, 0.95, q, variable)).toBeLessThan(toyZD(hadron, pdg, 0.5, q, variable))
      }
    }
    // π⁺ = u d̄: u → π⁺ exceeds d → π⁺ at large z.
    if (hadron === 'pi+') expect(toyZD(hadron, 2, 0.6, 10, variable)).toBeGreaterThan(toyZD(hadron, 1, 0.6, 10, variable))
  })
})

describe('sample fragmentation set files (scripts/make-sample-fragmentation.ts)', () => {
  const read = (name: string) => new Uint8Array(readFileSync(fileURLToPath(new URL(`../../../../samples/sets/${name}`, import.meta.url))))

  it('toy-ff-piplus.sheafset is a version-2 Hessian set of fragmentation into π⁺, marked as a toy, positive everywhere', () => {
    const bytes = read('toy-ff-piplus.sheafset')
    expect(headerOf(bytes).doc.formatVersion).toBe(2)
    const set = parseSetFile(bytes)
    expect(set.header.density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
    expect(set.header.kind).toBe('hessian-pairs')
    expect(set.members).toHaveLength(9)
    expect(set.header.provenance).toMatch(/^TOY/)
    // Positive where the parton is active (c and b vanish below their thresholds, common practice).
    for (const m of set.members) expect(m.every(v => v >= 0)).toBe(true)
  })

  it.each([
    ['bad-ff-target.sheafset', 'set.target', 'has no target'],
    ['bad-ff-hadron.sheafset', 'set.density.hadron', 'hadron must be one of'],
    ['bad-ff-axis.sheafset', 'grid.x', 'names its momentum-fraction axis z']
  ])('%s is refused at %s', (name, path, text) => {
    const e = failure(() => parseSetFile(read(name)))
    expect(e.path).toBe(path)
    expect(e.byteOffset).toBe(SET_FILE_PREAMBLE_BYTES)
    expect(e.message).toContain(text)
  })
})
