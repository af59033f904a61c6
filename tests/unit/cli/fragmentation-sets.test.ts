import { afterAll, describe, expect, it } from 'vitest'
import { scratch, sheaf } from './run'

// The verbs that read set files take fragmentation sets (format version 2) beside parton sets
// (version 1 samples) and say what each holds. The study is only a vehicle for reading the sets:
// which kernel may take a fragmentation set is decided with the kernels, so no number is checked.
const tmp = scratch()
afterAll(() => tmp.done())
const studyFile = tmp.file('study.json', JSON.stringify({ kernel: 'dis-nc-f2', options: {}, bins: [{ x: 0.1, q2: 10 }, { x: 0.3, q2: 100 }] }))

describe('sheaf with fragmentation sets', () => {
  it('compute reads a fragmentation set and a parton set and says what each holds', async () => {
    const run = await sheaf(['compute', studyFile, 'samples/sets/toy-ff-piplus.sheafset', 'samples/sets/toy-hessian.sheafset'])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const out = JSON.parse(run.stdout)
    expect(out.sets.map((s: { set: string, holds: string }) => [s.set, s.holds])).toEqual([
      ['toy-ff-pi+', 'fragmentation into π⁺'],
      ['toy-hessian', 'parton densities in the proton']
    ])
    expect(out.sets[0].members).toBe(9)
  })

  it('a fragmentation header with a target is one located line on stderr and exit code 1', async () => {
    const run = await sheaf(['compute', studyFile, 'samples/sets/bad-ff-target.sheafset'])
    expect(run.code).toBe(1)
    expect(run.stdout).toBe('')
    expect(run.stderr).toMatch(/^sheaf: samples\/sets\/bad-ff-target\.sheafset: header set\.target: a fragmentation set \(into pi\+\) has no target/)
  })
})
