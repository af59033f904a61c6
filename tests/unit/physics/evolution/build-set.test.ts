import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { buildErrorSet, evolveModel, planForModel } from '~/shared/physics/evolution/build-set'
import { slotOf } from '~/shared/physics/input/flavours'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import type { ErrorSet } from '~/shared/physics/types'
import { expectClose } from '../close'

const load = (f: string) => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)
const quillonDoc = load('quillon-22.json')
const quillon = compileInput(quillonDoc)
const brindle = compileInput(load('brindle-mc-1.json'))
const ostrand = compileInput(load('ostrand-pb24.json'), quillonDoc)
const coarse = { x: { count: 40, min: 1e-5, max: 0.95 }, q2: { count: 10, maxGeV2: 1e5 } }
const seaAndGluon = [-3, -2, -1, 1, 2, 3, 21].map(slotOf)

function minSeaAndGluon(set: ErrorSet): number {
  let min = Infinity
  const nx = set.x.length
  for (const m of set.members) {
    for (let iq = 0; iq < set.q2.length; iq++) {
      for (let ix = 0; ix < nx - 1; ix++) for (const s of seaAndGluon) min = Math.min(min, m[(iq * nx + ix) * 13 + s]!)
    }
  }
  return min
}

describe('error sets from a fit (Hessian pairs and replicas), one shared evolution plan', () => {
  it('builds the 90% CL Hessian demo set Quillon-22: 1 + 2·21 members, header filled, progress reported', async () => {
    const progress: [number, number][] = []
    const set = await buildErrorSet(quillon, undefined, { ...coarse, onProgress: (d, t) => { progress.push([d, t]) } })
    expect(set.header).toMatchObject({ name: 'Quillon-22', family: 'Quillon', version: '22.1', kind: 'hessian-pairs', confidenceLevelPercent: 90, order: 'LO', memberCount: 43, target: { type: 'proton' } })
    expect(set.header.provenance).toMatch(/21 Hessian eigenvector pairs at tolerance T = 1\.6448536/)
    expect(set.header.provenance).toMatch(/engine: Sheaf LO x-space DGLAP/)
    expect(set.members).toHaveLength(43)
    expect(progress).toHaveLength(43)
    expect(progress[42]).toEqual([43, 43])
    expect(set.flavours).toEqual([-6, -5, -4, -3, -2, -1, 1, 2, 3, 4, 5, 6, 21])
    expect(set.members[0]!.length).toBe(set.x.length * set.q2.length * 13)
    // Member 0 is the central fit.
    expect(Array.from(set.members[0]!)).toEqual(Array.from(evolveModel(quillon, planForModel(quillon, coarse)).values))
    // α_s(M_Z) of the central member is the input's reference value (given at M_Z).
    expectClose(set.header.alphasMzCentral, 0.13, 1e-12)
    expect(minSeaAndGluon(set)).toBeGreaterThan(0)
  })

  it('builds the 100-replica demo set Brindle-MC-1 with member 0 the replica mean', async () => {
    const set = await buildErrorSet(brindle, undefined, coarse)
    expect(set.header).toMatchObject({ kind: 'replicas', memberCount: 101, confidenceLevelPercent: 68 })
    const k = 1234
    let mean = 0
    for (let r = 1; r <= 100; r++) mean += set.members[r]![k]! / 100
    expectClose(set.members[0]![k]!, mean, 1e-12)
    expect(minSeaAndGluon(set)).toBeGreaterThan(0)
  })

  it('builds the nuclear demo set Ostrand-Pb24 for lead, naming its baseline', async () => {
    const set = await buildErrorSet(ostrand, undefined, coarse)
    expect(set.header).toMatchObject({ kind: 'hessian-pairs', memberCount: 21, target: { type: 'nucleus', z: 82, a: 208 } })
    expect(set.header.provenance).toMatch(/nuclear modification of Quillon-22 22\.1 at its central values/)
    expect(minSeaAndGluon(set)).toBeGreaterThan(0)
  })

  it('accepts an explicit member request and refuses a fit without a way to build members', async () => {
    const set = await buildErrorSet(quillon, { type: 'replicas', count: 3, seed: 5 }, coarse)
    expect(set.members).toHaveLength(4)
    const bare = { ...quillon, members: undefined }
    await expect(buildErrorSet(bare)).rejects.toThrow(/no members block/)
    await expect(buildErrorSet({ ...quillon, covariance: undefined }, { type: 'hessian', tolerance: 1, confidenceLevelPercent: 68 })).rejects.toThrow(/covariance/)
  })

  it('builds a one-member set from a single parameter vector (the central member alone)', async () => {
    const set = await buildErrorSet(quillon, { type: 'parameters', kind: 'hessian-pairs', confidenceLevelPercent: 68, vectors: [quillon.central], description: 'central only' }, coarse)
    expect(set.header).toMatchObject({ kind: 'hessian-pairs', memberCount: 1 })
    expect(set.members).toHaveLength(1)
    expect(Array.from(set.members[0]!)).toEqual(Array.from(evolveModel(quillon, planForModel(quillon, coarse)).values))
  })

  it.each([
    ['no vector at all', 'hessian-pairs', 0, /at least one parameter vector: the central member/],
    ['an even member count for eigenvector pairs', 'hessian-pairs', 2, /1 \+ 2N members; memberCount 2 gives an odd number \(1\)/],
    ['a replica set whose mean would have no replica', 'replicas', 1, /needs at least one replica; memberCount is 1/]
  ] as const)('refuses explicit vectors with %s before evolving anything', async (_label, kind, count, message) => {
    let evolved = 0
    const request = { type: 'parameters' as const, kind, confidenceLevelPercent: 68, vectors: Array.from({ length: count }, () => quillon.central), description: 'test' }
    await expect(buildErrorSet(quillon, request, { ...coarse, onProgress: () => { evolved++ } })).rejects.toThrow(message)
    expect(evolved).toBe(0)
  })
})
