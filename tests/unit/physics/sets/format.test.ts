import { describe, expect, it } from 'vitest'
import {
  SET_FILE_PREAMBLE_BYTES, SetFormatError, assembleSetFile, parseSetFile, readSetHeader, toyErrorSet,
  toyQ2Nodes, toyXNodes, validateErrorSet, writeSetFile
} from '../../../../shared/physics/sets'
import type { ErrorSet, FlavourScheme } from '../../../../shared/physics/types'

// Expected values in this file follow from the format definition (shared/physics/sets/format.ts)
// and from how each case is constructed here; no published numbers are involved.

const variable: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const fixed: FlavourScheme = { type: 'fixed', nf: 3, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const x = toyXNodes(8, 1e-4, 0.9)
const q2Thresholds = toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e4, count: 12, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] })
const hessian = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, x, q2: q2Thresholds, scheme: variable })
const tiny = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 1, x: toyXNodes(6, 1e-4, 0.9), q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 4 }), scheme: fixed })

function headerOf(bytes: Uint8Array): { doc: any, body: Uint8Array, bodyOffset: number } {
  const length = new DataView(bytes.buffer, bytes.byteOffset).getUint32(16, true)
  const bodyOffset = SET_FILE_PREAMBLE_BYTES + length
  return { doc: JSON.parse(new TextDecoder().decode(bytes.subarray(SET_FILE_PREAMBLE_BYTES, bodyOffset))), body: bytes.slice(bodyOffset), bodyOffset }
}

function failure(bytes: Uint8Array): SetFormatError {
  try {
    parseSetFile(bytes)
  } catch (error) {
    expect(error).toBeInstanceOf(SetFormatError)
    expect(error).toBeInstanceOf(RangeError)
    return error as SetFormatError
  }
  throw new Error('the parser accepted a malformed file')
}

describe('set files: round trip', () => {
  it('Float64 bodies round-trip bit for bit (header, nodes and every value)', () => {
    const bytes = writeSetFile(hessian)
    const back = parseSetFile(bytes)
    expect(back.header).toEqual(hessian.header)
    expect(back.flavours).toEqual(hessian.flavours)
    expect(Buffer.from(back.x.buffer, back.x.byteOffset, back.x.byteLength).equals(Buffer.from(hessian.x.buffer))).toBe(true)
    expect(Buffer.from(back.q2.buffer, back.q2.byteOffset, back.q2.byteLength).equals(Buffer.from(hessian.q2.buffer))).toBe(true)
    back.members.forEach((m, k) => {
      const a = new Uint8Array(m.buffer, m.byteOffset, m.byteLength)
      const b = new Uint8Array(hessian.members[k]!.buffer)
      expect(Buffer.from(a).equals(Buffer.from(b))).toBe(true)
    })
    // Writing what was read gives the identical file.
    expect(Buffer.from(writeSetFile(back)).equals(Buffer.from(bytes))).toBe(true)
  })

  it('Float32 bodies round to single precision once and then round-trip exactly', () => {
    const bytes = writeSetFile(hessian, { encoding: 'float32-le' })
    const back = parseSetFile(bytes)
    expect(back.members[3]![17]).toBe(Math.fround(hessian.members[3]![17]!))
    expect(Buffer.from(writeSetFile(back, { encoding: 'float32-le' })).equals(Buffer.from(bytes))).toBe(true)
  })

  it('starts with the magic line, aligns the body to 8 bytes and has nothing after it', () => {
    const bytes = writeSetFile(tiny)
    expect(new TextDecoder().decode(bytes.subarray(0, 16))).toBe('SHEAF-ERROR-SET\n')
    const summary = readSetHeader(bytes)
    expect(summary.bodyOffset % 8).toBe(0)
    expect(bytes.length - summary.bodyOffset).toBe(3 * 6 * 4 * 7 * 8)
    expect(summary.range).toEqual({ xMin: tiny.x[0], xMax: tiny.x[5], q2MinGeV2: 2, q2MaxGeV2: 1e4 })
  })

  it('keeps repeated threshold nodes and replica sets with their mean', () => {
    expect(q2Thresholds.filter((v, i) => i > 0 && v === q2Thresholds[i - 1]).length).toBe(2)
    const replicas = toyErrorSet({ kind: 'replicas', errorMembers: 5, x, q2: q2Thresholds, scheme: variable, seed: 11 })
    const back = parseSetFile(writeSetFile(replicas))
    expect(back.header.replicaCentral).toBe('mean')
    expect(back.members).toHaveLength(6)
  })
})

describe('set files: the parser refuses bad files and says where', () => {
  const good = writeSetFile(tiny)
  const { doc, body, bodyOffset } = headerOf(good)
  const nx = 6
  const nq = 4
  const nf = 7
  const edit = (change: (d: any) => void, newBody: Uint8Array = body) => {
    const d = structuredClone(doc)
    change(d)
    return assembleSetFile(d, newBody)
  }
  const withValue = (member: number, iq: number, ix: number, slot: number, v: number) => {
    const bytes = good.slice()
    new DataView(bytes.buffer).setFloat64(bodyOffset + (((member * nq + iq) * nx + ix) * nf + slot) * 8, v, true)
    return { bytes, byteOffset: bodyOffset + (((member * nq + iq) * nx + ix) * nf + slot) * 8 }
  }

  it.each([
    ['NaN', Number.NaN, 2, 1, 3, 6],
    ['+∞', Number.POSITIVE_INFINITY, 0, 0, 0, 0],
    ['−∞', Number.NEGATIVE_INFINITY, 1, 3, 5, 2]
  ])('a %s value: names member, Q² node, x node, flavour and byte offset', (_name, v, member, iq, ix, slot) => {
    const { bytes, byteOffset } = withValue(member, iq, ix, slot, v)
    const e = failure(bytes)
    expect(e.toJSON()).toEqual(expect.objectContaining({ member, q2Index: iq, xIndex: ix, flavour: tiny.flavours[slot], byteOffset }))
    expect(e.message).toContain(`member ${member}, Q² node ${iq}, x node ${ix}, flavour ${tiny.flavours[slot]}`)
  })

  it.each([
    ['x node above 1', (d: any) => { d.grid.x[4] = 1.5 }, { xIndex: 4, path: 'grid.x[4]' }, 'must lie in (0, 1)'],
    ['x node at 0', (d: any) => { d.grid.x[0] = 0 }, { xIndex: 0, path: 'grid.x[0]' }, 'must lie in (0, 1)'],
    ['x nodes not increasing', (d: any) => { d.grid.x[3] = d.grid.x[2] }, { xIndex: 3 }, 'must increase strictly'],
    ['Q² nodes decreasing', (d: any) => { d.grid.q2GeV2[3] = 1 }, { q2Index: 3 }, 'must increase'],
    ['Q² node negative', (d: any) => { d.grid.q2GeV2[0] = -2 }, { q2Index: 0 }, 'positive'],
    ['Q² repeated without a threshold', (d: any) => { d.grid.q2GeV2[2] = d.grid.q2GeV2[1] }, { q2Index: 2 }, 'only at a heavy-quark threshold'],
    ['repeated flavour', (d: any) => { d.grid.flavours[1] = d.grid.flavours[0] }, { path: 'grid.flavours[1]' }, 'appears twice'],
    ['flavour not a PDG parton code', (d: any) => { d.grid.flavours[6] = 11 }, { path: 'grid.flavours[6]' }, 'PDG parton code'],
    ['unknown kind', (d: any) => { d.set.kind = 'bootstrap' }, { path: 'set.kind' }, 'header set.kind'],
    ['newer format version', (d: any) => { d.formatVersion = 3 }, { path: 'formatVersion' }, 'formatVersion 3 is not supported'],
    ['unknown header key', (d: any) => { d.grid.xNodes = d.grid.x }, { path: 'grid' }, 'unknown key xNodes'],
    ['wrong valueCount', (d: any) => { d.body.valueCount = 17 }, { path: 'body.valueCount' }, 'memberCount · nQ² · nx · nf'],
    ['α_s members not last', (d: any) => { d.set.alphasMembers = [1, 1] }, { path: 'set.alphasMembers' }, 'last two'],
    ['alphasMz of the wrong length', (d: any) => { d.set.alphasMz = [0.118, 0.117] }, { path: 'set.alphasMz' }, 'one per member']
  ])('%s', (_name, change, location, text) => {
    const e = failure(edit(change))
    expect(e.toJSON()).toEqual(expect.objectContaining(location))
    expect(e.message).toContain(text)
  })

  it.each([
    ['hessian-pairs', 4, 'odd number (3)'],
    ['hessian-pairs', 2, 'odd number (1)']
  ])('member count that does not fit the kind: %s with %i members', (kind, count, text) => {
    const members = new Uint8Array(count * nx * nq * nf * 8)
    for (let k = 0; k < count; k++) members.set(body.subarray(0, nx * nq * nf * 8), k * nx * nq * nf * 8)
    const e = failure(edit((d) => {
      d.set.kind = kind
      d.set.memberCount = count
      d.body.valueCount = count * nx * nq * nf
    }, members))
    expect(e.path).toBe('set.memberCount')
    expect(e.message).toContain(text)
  })

  it('one-sided Hessian and replica sets accept 1 + N members; a missing central member is refused', () => {
    expect(parseSetFile(edit(d => { d.set.kind = 'hessian-one-sided' })).members).toHaveLength(3)
    const e = failure(edit((d) => {
      d.set.memberCount = 0
      d.body.valueCount = 0
    }, new Uint8Array(0)))
    expect(e.message).toContain('member 0, the central member, is required')
  })

  it('a truncated body names the incomplete member and the end of the data', () => {
    const e = failure(good.subarray(0, good.length - 8))
    expect(e.member).toBe(2)
    expect(e.byteOffset).toBe(good.length - 8)
    expect(e.message).toContain('8 bytes short')
  })

  it('extra bytes after the body are refused', () => {
    const longer = new Uint8Array(good.length + 8)
    longer.set(good)
    expect(failure(longer).message).toContain('8 bytes too many')
  })

  it.each([
    ['not a set file', new TextEncoder().encode('hello world, this is text'), 0, 'not a Sheaf error-set file'],
    ['empty input', new Uint8Array(0), 0, 'not a Sheaf error-set file']
  ])('%s: refused at byte %i', (_n, bytes, byteOffset, text) => {
    const e = failure(bytes)
    expect(e.byteOffset).toBe(byteOffset)
    expect(e.message).toContain(text)
  })

  it('a header length beyond the file, or off the 8-byte boundary, is refused at byte 16', () => {
    const bytes = good.slice()
    new DataView(bytes.buffer).setUint32(16, 1e6, true)
    expect(failure(bytes).byteOffset).toBe(16)
    new DataView(bytes.buffer).setUint32(16, 5, true)
    expect(failure(bytes).message).toContain('8-byte boundary')
  })

  it('broken JSON names the byte where parsing failed', () => {
    const bytes = good.slice()
    const at = bytes.indexOf(0x3a)
    bytes[at] = 0x3d
    const e = failure(bytes)
    expect(e.message).toContain('not valid JSON')
    expect(e.byteOffset).toBe(at)
  })
})

describe('set files: the writer refuses what the parser would refuse', () => {
  it.each([
    ['a NaN in member 1', (s: ErrorSet) => { s.members[1]![5] = Number.NaN }, 'member 1'],
    ['a member of the wrong length', (s: ErrorSet) => { s.members[2] = new Float64Array(3) }, 'member 2 has 3 values'],
    ['memberCount disagreeing with the members', (s: ErrorSet) => { s.header = { ...s.header, memberCount: 5 } }, 'memberCount'],
    ['a replica set whose member 0 is not the mean', (s: ErrorSet) => {
      // Members 1 and 2 are central·(1 ± δ), so their mean is member 0 until member 0 is scaled.
      s.header = { ...s.header, kind: 'replicas', replicaCentral: 'mean' }
      s.members[0] = s.members[0]!.map(v => 1.1 * v)
    }, 'replica mean']
  ])('%s', (_n, change, text) => {
    const copy: ErrorSet = { ...tiny, header: { ...tiny.header }, members: tiny.members.map(m => m.slice()) }
    change(copy)
    expect(() => writeSetFile(copy)).toThrow(text)
    expect(() => validateErrorSet(copy)).toThrow(SetFormatError)
  })
})
