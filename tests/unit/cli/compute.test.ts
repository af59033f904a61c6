import { readFileSync } from 'node:fs'
import { afterAll, describe, expect, it } from 'vitest'
import { parseSetFile } from '../../../shared/physics/sets'
import { buildPlan, evaluatePlan, parseStudySpec, scaleVariation } from '../../../shared/physics/study'
import { setAlphas } from '../../../scripts/cli/set-file'
import { computeBands, memberValuesFromRows } from '../../../shared/physics/uncertainty'
import { oneLine, scratch, sheaf } from './run'

const tmp = scratch()
afterAll(() => tmp.done())

// The TOY sample sets (samples/sets/README.md: analytic shapes, not fits).
const hessianFile = 'samples/sets/toy-hessian.sheafset'
const replicaFile = 'samples/sets/toy-replicas.sheafset'
const studyDoc = {
  kernel: 'drell-yan',
  options: { sqrtSGeV: 13000 },
  bins: [{ m: 20, yMin: 0, yMax: 0.5 }, { m: 60, yMin: 0.5, yMax: 1, label: 'second' }, { m: 200, yMin: -1, yMax: 1 }]
}
const studyFile = tmp.file('study.json', JSON.stringify(studyDoc))

describe('sheaf compute', () => {
  it('prints the plan\'s values for every member and the default band of each set', async () => {
    const run = await sheaf(['compute', studyFile, hessianFile, replicaFile])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const out = JSON.parse(run.stdout)
    expect(out.study).toMatchObject({ kernel: 'drell-yan', unit: 'pb/GeV', quadratureOrder: 8 })
    expect(out.study.bins[1]).toEqual({ bin: 2, label: 'second', m: 60, yMin: 0.5, yMax: 1 })
    const set = parseSetFile(readFileSync(hessianFile))
    const engine = evaluatePlan(buildPlan(parseStudySpec(studyDoc), set), set.members)
    const first = out.sets[0]
    expect(first).toMatchObject({ set: 'toy-hessian', kind: 'hessian-pairs', clPercent: set.header.confidenceLevelPercent, members: 9, bins: 3 })
    expect(first.values.flat()).toEqual(Array.from(engine))
    const band = computeBands({ members: 9, bins: 3, values: engine }, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: set.header.confidenceLevelPercent })
    expect(first.bands).toMatchObject({ prescription: 'hessian-symmetric', clPercent: 68 })
    expect(first.bands.rows.map((r: { plus: number }) => r.plus)).toEqual(Array.from(band.plus))
    expect(out.sets[1]).toMatchObject({ set: 'toy-replicas', kind: 'replicas', members: 9 })
    expect(out.sets[1].bands.prescription).toBe('replica-sd')
  })

  it('round-trips through bands: compute\'s output is a values document', async () => {
    const computed = tmp.file('computed.json', (await sheaf(['compute', 'samples/studies/drell-yan-mass.json', hessianFile])).stdout)
    const run = await sheaf(['bands', computed, '--prescription', 'hessian-asymmetric'])
    expect(run.code).toBe(0)
    const written = JSON.parse(readFileSync(computed, 'utf8')).sets[0]
    const engine = computeBands(memberValuesFromRows(written.values), { kind: 'hessian-pairs', prescription: 'hessian-asymmetric', clFrom: written.clPercent })
    const out = JSON.parse(run.stdout).sets[0]
    expect(out.set).toBe('toy-hessian')
    expect(out.bands.rows.map((r: { minus: number }) => r.minus)).toEqual(Array.from(engine.minus))
    expect(out.bands.rows.map((r: { central: number }) => r.central)).toEqual(written.values[0])
  })

  it('round-trips a replica set through bands with the 68% interval', async () => {
    const computed = tmp.file('replicas.json', (await sheaf(['compute', 'samples/studies/drell-yan-mass.json', replicaFile])).stdout)
    const run = await sheaf(['bands', computed, '--prescription', 'replica-68-interval'])
    const written = JSON.parse(readFileSync(computed, 'utf8')).sets[0]
    const engine = computeBands(memberValuesFromRows(written.values), { kind: 'replicas', prescription: 'replica-68-interval', clFrom: written.clPercent })
    expect(JSON.parse(run.stdout).sets[0].bands.rows.map((r: { plus: number }) => r.plus)).toEqual(Array.from(engine.plus))
  })

  it('writes the values as CSV, one line per set, member and bin', async () => {
    const run = await sheaf(['compute', studyFile, hessianFile, '--format', 'csv', '--table', 'values'])
    const lines = run.stdout.trimEnd().split('\r\n')
    expect(lines[0]).toBe('set,member,bin,value')
    expect(lines).toHaveLength(1 + 9 * 3)
    expect(lines[1]!.startsWith('toy-hessian,0,1,')).toBe(true)
  })

  it('freezes out-of-reach bins at the grid edge only when asked, and lists them', async () => {
    const far = tmp.file('far.json', JSON.stringify({ ...studyDoc, bins: [...studyDoc.bins, { m: 5, y: 4 }] }))
    const refused = await sheaf(['compute', far, hessianFile])
    expect(refused.code).toBe(1)
    expect(oneLine(refused)).toMatch(/toy-hessian\.sheafset: bin 4: x₂ = .* is below the set's smallest x.* \(--outside freeze evaluates such bins at the grid edge\)$/)
    const frozen = await sheaf(['compute', far, hessianFile, '--outside', 'freeze'])
    expect(frozen.code).toBe(0)
    expect(JSON.parse(frozen.stdout).sets[0].outsideBins.map((b: { bin: number }) => b.bin)).toEqual([4])
  })

  it.each([
    ['a study that is not JSON', () => [tmp.file('broken.json', '{\n  "kernel": "drell-yan",\n  "bins": [ { "m": 20 } ]]\n}'), hessianFile], 1,
      /broken\.json: not valid JSON at line 3, column 26: unexpected "]" where .,. or .}. was expected$/],
    ['a bin outside the kernel\'s domain', () => [tmp.file('neg.json', JSON.stringify({ ...studyDoc, bins: [{ m: -1, y: 0 }] })), hessianFile], 1,
      /neg\.json: bin 1, column m: the mass M must be a positive number of GeV$/],
    ['a set with the wrong member count', () => [studyFile, 'samples/sets/bad-member-count.sheafset'], 1,
      /^sheaf: samples\/sets\/bad-member-count\.sheafset: a Hessian set of eigenvector pairs has 1 \+ 2N members; memberCount 4 gives an odd number/],
    ['a truncated set file', () => [studyFile, 'samples/sets/bad-body-length.sheafset'], 1, /bad-body-length\.sheafset: the body must be .* bytes .* short/],
    ['a NaN in a set', () => [studyFile, 'samples/sets/bad-nan.sheafset'], 1, /bad-nan\.sheafset: member 2, Q² node 1, x node 3, flavour 21: value is NaN/],
    ['a missing set file', () => [studyFile, 'nowhere.sheafset'], 1, /^sheaf: nowhere\.sheafset: no such file$/],
    ['no set file at all', () => [studyFile], 2, /compute takes at least 2 files/]
  ])('refuses %s with one line', async (_, files, code, message) => {
    const run = await sheaf(['compute', ...files()])
    expect(run.code).toBe(code)
    expect(run.stdout).toBe('')
    expect(oneLine(run)).toMatch(message)
  })

  it('prints the scale variation apart from the PDF band: 7-point μ_F, μ_R for gg → H', async () => {
    const run = await sheaf(['compute', 'samples/studies/higgs-total.json', hessianFile])
    expect(run.code).toBe(0)
    const out = JSON.parse(run.stdout).sets[0]
    expect(out.scaleVariation).toMatchObject({ variation: '7-point μ_F, μ_R' })
    expect(out.scaleVariation.points).toHaveLength(7)
    const set = parseSetFile(readFileSync(hessianFile))
    const spec = parseStudySpec(JSON.parse(readFileSync('samples/studies/higgs-total.json', 'utf8')))
    const engine = scaleVariation(spec, set, set.members[0]!, { alphas: setAlphas(set.header) })
    expect(out.scaleVariation.rows[0]).toMatchObject({ bin: 1, nominal: engine.nominal[0], up: engine.up[0], down: engine.down[0] })
    // μ_R = M_H/2 raises α_s, so the upward variation is at least tens of per cent at LO (common practice)
    expect(out.scaleVariation.rows[0].up / out.scaleVariation.rows[0].nominal).toBeGreaterThan(0.1)
    expect(out.bands.scaleVariation).toBe('7-point μ_F, μ_R')
    expect(out.bands.rows[0].scaleUp).toBe(engine.up[0])
    expect(out.quadrature).toMatchObject({ order: 8, checkOrder: 16 })
    expect(out.bands.rows[0].quadratureError).toBe(out.quadrature.error[0])
  })

  it('a kernel without α_s gets the 3-point μ_F variation and a quadrature error per bin', async () => {
    const run = await sheaf(['compute', tmp.file('dy-scale.json', JSON.stringify({ ...studyDoc, bins: [{ m: 30, y: 0 }, { m: 60, yMin: 0.5, yMax: 1 }, { mMin: 80, mMax: 100, yMin: 0, yMax: 1 }] })), hessianFile])
    const out = JSON.parse(run.stdout).sets[0]
    expect(out.scaleVariationError).toBeUndefined()
    expect(out.scaleVariation.variation).toBe('3-point μ_F')
    expect(out.scaleVariation.rows).toHaveLength(3)
    expect(out.quadrature.error).toHaveLength(3)
    for (const e of out.quadrature.error) expect(e).toBeGreaterThanOrEqual(0)
  })
})
