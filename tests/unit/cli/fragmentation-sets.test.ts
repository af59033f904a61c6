import { afterAll, describe, expect, it } from 'vitest'
import { scratch, sheaf } from './run'

// The verbs that read set files take fragmentation sets (format version 2) as well as parton sets
// (version 1 samples) and say what each holds. The studies are only vehicles for reading the sets
// (an e⁺e⁻ spectrum reads fragmentation functions, F₂ parton densities), so no number is checked.
const tmp = scratch()
afterAll(() => tmp.done())
const studyFile = tmp.file('study.json', JSON.stringify({ kernel: 'dis-nc-f2', options: {}, bins: [{ x: 0.1, q2: 10 }, { x: 0.3, q2: 100 }] }))
const spectrumFile = tmp.file('spectrum.json', JSON.stringify({ kernel: 'epem-hadron', options: {}, bins: [{ sqrtS: 10, z: 0.2 }, { sqrtS: 10, z: 0.5 }] }))

describe('sheaf with fragmentation sets', () => {
  it('compute reads a fragmentation set and a parton set and says what each holds', async () => {
    const spectrum = await sheaf(['compute', spectrumFile, 'samples/sets/toy-ff-piplus.sheafset'])
    expect(spectrum.stderr).toBe('')
    expect(spectrum.code).toBe(0)
    const out = JSON.parse(spectrum.stdout)
    expect(out.sets.map((s: { set: string, holds: string }) => [s.set, s.holds])).toEqual([['toy-ff-pi+', 'fragmentation into π⁺']])
    expect(out.sets[0].members).toBe(9)
    const f2 = await sheaf(['compute', studyFile, 'samples/sets/toy-hessian.sheafset'])
    expect(f2.code, f2.stderr).toBe(0)
    expect(JSON.parse(f2.stdout).sets.map((s: { holds: string }) => s.holds)).toEqual(['parton densities in the proton'])
  })

  it('a fragmentation header with a target is one located line on stderr and exit code 1', async () => {
    const run = await sheaf(['compute', studyFile, 'samples/sets/bad-ff-target.sheafset'])
    expect(run.code).toBe(1)
    expect(run.stdout).toBe('')
    expect(run.stderr).toMatch(/^sheaf: samples\/sets\/bad-ff-target\.sheafset: header set\.target: a fragmentation set \(into pi\+\) has no target/)
  })
})
