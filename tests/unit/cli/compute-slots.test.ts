import { afterAll, describe, expect, it } from 'vitest'
import { oneLine, scratch, sheaf } from './run'

const tmp = scratch()
afterAll(() => tmp.done())

// The TOY sample set holds parton densities (its header names no density). Fragmentation set files
// come with the set file format that says the density; until then only the refusals are checked here.
const hessianFile = 'samples/sets/toy-hessian.sheafset'

describe('sheaf compute: which density each set file must hold', () => {
  it('refuses a parton-density set for the e⁺e⁻ kernel, naming the file and what it expects', async () => {
    const run = await sheaf(['compute', 'samples/studies/electron-positron-hadrons.json', hessianFile])
    expect(run.code).toBe(1)
    expect(oneLine(run)).toContain(`${hessianFile}: toy-hessian`)
    expect(run.stderr).toContain('holds parton densities, but the kernel epem-hadron reads fragmentation functions in its main sets')
  })

  it('refuses a multiplicity study without --second, and a parton set given as --second', async () => {
    const without = await sheaf(['compute', 'samples/studies/semi-inclusive-pions.json', hessianFile])
    expect(without.code).toBe(1)
    expect(without.stderr).toContain('--second: the kernel sidis-multiplicity needs a second set holding fragmentation functions')
    const wrong = await sheaf(['compute', 'samples/studies/semi-inclusive-pions.json', hessianFile, '--second', hessianFile])
    expect(wrong.code).toBe(1)
    expect(wrong.stderr).toContain(`--second ${hessianFile}: toy-hessian`)
    expect(wrong.stderr).toContain('reads fragmentation functions in its second set')
  })

  it('still runs parton kernels on parton sets', async () => {
    const study = tmp.file('f2.json', JSON.stringify({ kernel: 'dis-nc-f2', bins: [{ x: 0.1, q2: 10 }] }))
    expect((await sheaf(['compute', study, hessianFile])).code).toBe(0)
  })
})
