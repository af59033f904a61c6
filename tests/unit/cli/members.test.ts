import { readFileSync, writeFileSync } from 'node:fs'
import { afterAll, describe, expect, it } from 'vitest'
import { hessianClPercent } from '../../../scripts/cli/verbs/members'
import { parseSetFile } from '../../../shared/physics/sets'
import { oneLine, scratch, sheaf } from './run'

const tmp = scratch()
afterAll(() => tmp.done())

// INVENTED demo input with four parameters (samples/fits/minimal-input.json).
const input = 'samples/fits/minimal-input.json'
const parameters = JSON.parse(readFileSync(input, 'utf8')).parameters.length

describe('sheaf members', () => {
  it('writes Hessian pairs the set parser accepts: 1 + 2n members for n parameters', async () => {
    const out = tmp.file('hessian.sheafset')
    const run = await sheaf(['members', input, '--hessian', '1', '--out', out])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const set = parseSetFile(readFileSync(out))
    expect(set.header).toMatchObject({ kind: 'hessian-pairs', memberCount: 1 + 2 * parameters, confidenceLevelPercent: 68 })
    expect(JSON.parse(run.stdout).written).toMatchObject({ out, kind: 'hessian-pairs', members: 1 + 2 * parameters })
  })

  it('builds a nuclear family for the nucleus asked for (symbol or Z:A) and refuses a nucleus that is none', async () => {
    const out = tmp.file('iron.sheafset')
    const family = 'samples/fits/ostrand-25.json'
    const coarse = tmp.file('coarse-family.json')
    const doc = JSON.parse(readFileSync(family, 'utf8'))
    doc.grid = { x: { count: 20, min: 1e-3, max: 0.9 }, q2: { count: 6, maxGeV2: 1e3 } }
    writeFileSync(coarse, JSON.stringify(doc))
    const run = await sheaf(['members', coarse, '--baseline', 'samples/fits/quillon-22.json', '--nucleus', 'Fe', '--out', out])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const set = parseSetFile(readFileSync(out))
    expect(set.header).toMatchObject({ name: 'Ostrand-25-Fe56', target: { type: 'nucleus', z: 26, a: 56 }, memberCount: 23 })
    expect(set.header.provenance).toMatch(/nucleus Z = 26, A = 56 from family Ostrand/)
    const other = tmp.file('argon.sheafset')
    expect((await sheaf(['members', coarse, '--baseline', 'samples/fits/quillon-22.json', '--nucleus', '18:40', '--out', other])).code).toBe(0)
    expect(parseSetFile(readFileSync(other)).header.target).toEqual({ type: 'nucleus', z: 18, a: 40 })
    for (const [bad, message] of [['Qq', /neither Z:A/], ['30:20', /Z = 30 exceeds A = 20/]] as const) {
      const refused = await sheaf(['members', coarse, '--baseline', 'samples/fits/quillon-22.json', '--nucleus', bad, '--out', tmp.file('bad.sheafset')])
      expect(refused.code).toBe(2)
      expect(oneLine(refused)).toMatch(message)
    }
  })

  it('writes the same replicas for the same seed and others for another seed', async () => {
    const a = tmp.file('a.sheafset')
    const b = tmp.file('b.sheafset')
    const c = tmp.file('c.sheafset')
    for (const [file, seed] of [[a, '3'], [b, '3'], [c, '4']] as const) {
      expect((await sheaf(['members', input, '--replicas', '4', '--seed', seed, '--out', file])).code).toBe(0)
    }
    const set = parseSetFile(readFileSync(a))
    expect(set.header).toMatchObject({ kind: 'replicas', memberCount: 5 })
    expect(readFileSync(a).equals(readFileSync(b))).toBe(true)
    expect(readFileSync(a).equals(readFileSync(c))).toBe(false)
  })

  it.each([
    ['no --out', ['--hessian', '1'], 2, /^sheaf: members needs --out <set-file>/],
    ['both kinds', ['--hessian', '1', '--replicas', '5', '--out', 'x.sheafset'], 2, /give --hessian or --replicas, not both/],
    ['a negative tolerance', ['--hessian=-1', '--out', 'x.sheafset'], 2, /--hessian must be a tolerance T > 0/],
    ['a value that looks like an option', ['--hessian', '-1', '--out', 'x.sheafset'], 2, /^sheaf: members: Option '--hessian' argument is ambiguous \(a value starting with a dash is written --hessian=<value>\); see 'sheaf members --help'\.$/],
    ['a fractional replica count', ['--replicas', '2.5', '--out', 'x.sheafset'], 2, /--replicas must be a whole number of replicas ≥ 2, got '2\.5'/]
  ])('refuses %s', async (_, argv, code, message) => {
    const run = await sheaf(['members', input, ...argv])
    expect(run.code).toBe(code)
    expect(oneLine(run)).toMatch(message)
  })

  it('refuses a fit without a covariance, naming the file, and writes nothing', async () => {
    const out = tmp.file('never.sheafset')
    const run = await sheaf(['members', 'samples/fits/benchmark-toy-input.json', '--hessian', '1', '--out', out])
    expect(run.code).toBe(1)
    expect(oneLine(run)).toMatch(/benchmark-toy-input\.json: .*members need the parameter covariance/)
    expect(() => readFileSync(out)).toThrow()
  })

  it('builds a fragmentation input (INVENTED Verrel-FF-26-K+, coarse grid) into a set whose header names the hadron', async () => {
    const coarse = tmp.file('coarse-kaon.json')
    const doc = JSON.parse(readFileSync('samples/fits/verrel-ff-26-K+.json', 'utf8'))
    doc.grid = { x: { count: 24, min: 0.01, max: 0.95 }, q2: { count: 6, maxGeV2: 1e3 } }
    writeFileSync(coarse, JSON.stringify(doc))
    const out = tmp.file('kaon.sheafset')
    const run = await sheaf(['members', coarse, '--out', out])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const set = parseSetFile(readFileSync(out))
    expect(set.header).toMatchObject({ name: 'Verrel-FF-26-K+', family: 'Verrel-FF-26', kind: 'hessian-pairs', memberCount: 1 + 2 * doc.parameters.length, density: { type: 'fragmentation', hadron: 'K+' } })
    expect(set.header.provenance).toMatch(/timelike/)
    expect(JSON.parse(run.stdout).written.density).toEqual({ type: 'fragmentation', hadron: 'K+' })
  })

  it('refuses a fragmentation input whose members give one parton more than its whole momentum, naming the file, member and parton', async () => {
    const bad = tmp.file('greedy-kaon.json')
    const doc = JSON.parse(readFileSync('samples/fits/verrel-ff-26-K+.json', 'utf8'))
    doc.grid = { x: { count: 24, min: 0.01, max: 0.95 }, q2: { count: 6, maxGeV2: 1e3 } }
    // N_s = 5 × the sample's value: ∫ z·D_s̄ dz = 5 × 0.22 = 1.1 > 1.
    doc.parameters.find((p: { name: string }) => p.name === 'N_s').value *= 5
    writeFileSync(bad, JSON.stringify(doc))
    const out = tmp.file('greedy.sheafset')
    const run = await sheaf(['members', bad, '--out', out])
    expect(run.code).toBe(1)
    expect(oneLine(run)).toMatch(/greedy-kaon\.json: .*member 0: ∫ z·D dz of parton s̄ is 1\.1\d* > 1/)
    expect(() => readFileSync(out)).toThrow()
  })

  // Two-sided Gaussian coverage P(|Z| ≤ T): 68.27% at T = 1 (written 68, common practice) and
  // 90% at T = 1.644854 (the 95th percentile of the normal, any statistics table).
  it.each([[1, 68], [1.6448536269514722, 90]])('gives Hessian members at T = %d a CL of %d%%', (t, cl) => {
    expect(hessianClPercent(t)).toBeCloseTo(cl, 9)
  })
})
