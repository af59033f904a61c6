import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { SetFormatError, parseSetFile, readSetHeader } from '../../../../shared/physics/sets'

// The sample files are produced by scripts/make-sample-sets.ts; samples/sets/README.md lists
// what is wrong with each malformed one. The expected locations below follow from how that
// script builds each file (tiny toy set: 6 x × 4 Q² × 7 flavours, 3 members, Float64).

const dir = fileURLToPath(new URL('../../../../samples/sets/', import.meta.url))
const read = (name: string) => new Uint8Array(readFileSync(`${dir}${name}`))

describe('sample set files', () => {
  it.each([
    ['toy-hessian.sheafset', 'hessian-pairs', 9],
    ['toy-replicas.sheafset', 'replicas', 9]
  ])('%s is a valid %s set with %i members, marked as a toy', (name, kind, members) => {
    const set = parseSetFile(read(name))
    expect(set.header.kind).toBe(kind)
    expect(set.members).toHaveLength(members)
    expect(set.header.provenance).toMatch(/^TOY/)
  })

  const nanOffset = (() => {
    const bytes = read('bad-nan.sheafset')
    const bodyOffset = 20 + new DataView(bytes.buffer, bytes.byteOffset).getUint32(16, true)
    return bodyOffset + (((2 * 4 + 1) * 6 + 3) * 7 + 6) * 8 // member 2, Q² node 1, x node 3, slot 6 = gluon
  })()

  it.each([
    ['bad-magic.sheafset', { byteOffset: 0 }, 'not a Sheaf error-set file'],
    ['bad-header-json.sheafset', {}, 'not valid JSON'],
    ['bad-unknown-key.sheafset', { path: 'set' }, 'unknown key colour'],
    ['bad-x-outside.sheafset', { xIndex: 5, path: 'grid.x[5]' }, 'x node 5 is 1.2'],
    ['bad-q2-order.sheafset', { q2Index: 2 }, 'Q² node 2'],
    ['bad-q2-repeat.sheafset', { q2Index: 2 }, 'only at a heavy-quark threshold'],
    ['bad-member-count.sheafset', { path: 'set.memberCount' }, '1 + 2N'],
    ['bad-missing-central.sheafset', { path: 'set.memberCount' }, 'central member'],
    ['bad-body-length.sheafset', { member: 2 }, 'bytes short'],
    ['bad-nan.sheafset', { member: 2, q2Index: 1, xIndex: 3, flavour: 21, byteOffset: nanOffset }, 'value is NaN'],
    ['bad-replica-mean.sheafset', { member: 0, q2Index: 0, xIndex: 0, flavour: -3 }, 'replica mean'],
    ['bad-alphas-members.sheafset', { path: 'set.alphasMembers' }, 'last two']
  ])('%s is refused with its location', (name, location, text) => {
    let error: unknown
    try {
      parseSetFile(read(name))
    } catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(SetFormatError)
    expect((error as SetFormatError).toJSON()).toEqual(expect.objectContaining(location))
    expect((error as SetFormatError).message).toContain(text)
  })

  it('readSetHeader summarises a good file without decoding the body', () => {
    const s = readSetHeader(read('toy-hessian.sheafset'))
    expect(s.encoding).toBe('float32-le')
    expect(s.range.xMin).toBe(1e-5)
    expect(s.range.q2MaxGeV2).toBe(1e5)
  })
})
