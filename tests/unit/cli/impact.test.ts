import { readFileSync } from 'node:fs'
import { afterAll, describe, expect, it } from 'vitest'
import { parseSetFile } from '../../../shared/physics/sets'
import { oneLine, scratch, sheaf } from './run'

const tmp = scratch()
afterAll(() => tmp.done())

const STUDY = 'samples/studies/dis-f2.json'
const HESSIAN = 'samples/sets/toy-hessian.sheafset'
const REPLICAS = 'samples/sets/toy-replicas.sheafset'

/** Central values of a set on the study, from 'sheaf compute'. */
async function central(set: string): Promise<number[]> {
  const run = await sheaf(['compute', STUDY, set])
  expect(run.code).toBe(0)
  return JSON.parse(run.stdout).sets[0].values[0]
}

// Made-up data: 3% above the central prediction in every bin, 1% stat and 2% syst errors.
async function measurementFor(set: string, name: string): Promise<string> {
  const c = await central(set)
  const lines = ['bin,value,stat,syst', ...c.map((v, b) => `${b + 1},${v * 1.03},${v * 0.01},${v * 0.02}`)]
  return tmp.file(name, `${lines.join('\n')}\n`)
}

describe('sheaf reweight', () => {
  it('prints N_eff, χ² before and after, the bins and weights, and warns when few replicas are left', async () => {
    const data = await measurementFor(REPLICAS, 'replica-data.csv')
    const run = await sheaf(['reweight', STUDY, REPLICAS, data])
    expect(run.code).toBe(0)
    const out = JSON.parse(run.stdout)
    expect(out).toMatchObject({ set: 'toy-replicas', weights: 'chi2-pdf', points: 7, replicas: 8 })
    expect(out.replicaWeights.reduce((s: number, w: number) => s + w, 0)).toBeCloseTo(8, 12)
    expect(out.effectiveReplicas).toBeGreaterThan(1)
    expect(out.effectiveReplicas).toBeLessThanOrEqual(8)
    // Fewer than 10 effective replicas always warn (the engine's threshold).
    expect(out.warning).toMatch(/replicas are effectively left after reweighting/)
    expect(out.bins).toHaveLength(7)
    expect(out.chi2Profile.alpha).toHaveLength(191)
    expect(out.caution).toMatch(/Leading-order predictions are rough/)
  })

  it('reads the same values from a compute output as from the study, and writes the unweighted set', async () => {
    const data = await measurementFor(REPLICAS, 'replica-data-2.csv')
    const computed = await sheaf(['compute', STUDY, REPLICAS])
    const values = tmp.file('values.json', computed.stdout)
    const fromStudy = JSON.parse((await sheaf(['reweight', STUDY, REPLICAS, data])).stdout)
    const out = tmp.file('rw.sheafset')
    const run = await sheaf(['reweight', values, REPLICAS, data, '--weights', 'likelihood', '--out', out, '--replicas', '20', '--seed', '5', '--name', 'toy-rw'])
    expect(run.code).toBe(0)
    const fromValues = JSON.parse(run.stdout)
    expect(fromValues.weights).toBe('likelihood')
    const again = JSON.parse((await sheaf(['reweight', values, REPLICAS, data])).stdout)
    expect(again.replicaChi2).toEqual(fromStudy.replicaChi2)
    expect(fromValues.written).toMatchObject({ file: out, name: 'toy-rw', replicas: 20, seed: 5 })
    const set = parseSetFile(readFileSync(out))
    expect(set.header).toMatchObject({ name: 'toy-rw', kind: 'replicas', memberCount: 21 })
    expect(set.header.provenance).toMatch(/^Reweighted \(likelihood weights\) by the measurement .*replica-data-2\.csv \(7 points\).*N_eff = \d+\.\d of 8.*seed 5.*Parent set: toy-replicas/)
  })

  it.each([
    ['a Hessian set', [STUDY, HESSIAN, 'DATA'], 1, /toy-hessian\.sheafset: 'toy-hessian' is a Hessian set \(hessian-pairs\); reweighting needs replicas/],
    ['--seed without --out', [STUDY, REPLICAS, 'DATA', '--seed', '3'], 2, /--replicas, --seed and --name describe the unweighted set: give --out <file> too/],
    ['an unknown weight form', [STUDY, REPLICAS, 'DATA', '--weights', 'flat'], 2, /--weights must be chi2-pdf or likelihood, got 'flat'/]
  ])('refuses %s', async (_what, argv, code, message) => {
    const data = await measurementFor(REPLICAS, 'replica-data-3.csv')
    const run = await sheaf(['reweight', ...argv.map(a => (a === 'DATA' ? data : a))])
    expect(run.code).toBe(code)
    expect(oneLine(run)).toMatch(message)
  })

  it('names the file, line and column of a bad measurement, and a point count that does not fit', async () => {
    const bad = tmp.file('bad.csv', 'bin,value,stat\n1,0.8,0.01\n2,zero,0.01\n')
    expect(oneLine(await sheaf(['reweight', STUDY, REPLICAS, bad]))).toMatch(/bad\.csv: line 3, column 2: value: "zero" is not a number/)
    const short = tmp.file('short.csv', 'value,stat\n0.8,0.01\n0.7,0.01\n')
    expect(oneLine(await sheaf(['reweight', STUDY, REPLICAS, short]))).toMatch(/short\.csv: the measurement has 2 points but the study has 7 bins/)
  })
})

describe('sheaf profile', () => {
  it('prints the shifts and χ² before/after, and writes a profiled set that reproduces the profiled prediction', async () => {
    const data = await measurementFor(HESSIAN, 'hessian-data.csv')
    const out = tmp.file('profiled.sheafset')
    const run = await sheaf(['profile', STUDY, HESSIAN, data, '--out', out])
    expect(run.code).toBe(0)
    const result = JSON.parse(run.stdout)
    expect(result).toMatchObject({ set: 'toy-hessian', eigenvectors: 4, points: 7, asymmetric: false, iterations: 0 })
    expect(result.shifts).toHaveLength(4)
    expect(result.chi2After.total).toBeLessThan(result.chi2Before)
    const set = parseSetFile(readFileSync(out))
    expect(set.header).toMatchObject({ name: 'toy-hessian-profiled', kind: 'hessian-pairs', memberCount: 9 })
    expect(set.header.provenance).toMatch(/^Profiled \(arXiv:1402\.6623; tolerance T = .*hessian-data\.csv \(7 points\).*shifts z1 = /)
    // F2 is linear in the densities and the profiled grids are linear in the parent's members,
    // so evaluating the study with the written set gives the profiled prediction and band (to rounding).
    const again = JSON.parse((await sheaf(['compute', STUDY, out])).stdout).sets[0]
    result.bins.forEach((row: { after: number, afterError: number }, b: number) => {
      expect(again.values[0][b]).toBeCloseTo(row.after, 9)
      expect(again.bands.rows[b].plus).toBeCloseTo(row.afterError, 9)
    })
  })

  it('keeps quadratic terms with --asymmetric and writes CSV', async () => {
    const data = await measurementFor(HESSIAN, 'hessian-data-2.csv')
    const run = await sheaf(['profile', STUDY, HESSIAN, data, '--asymmetric', '--tolerance', '1.5', '--format', 'csv'])
    expect(run.code).toBe(0)
    const lines = run.stdout.trimEnd().split('\r\n')
    expect(lines[0]).toBe('bin,data,before,beforeError,after,afterError,shrinkage')
    expect(lines).toHaveLength(8)
  })

  it.each([
    ['a replica set', [STUDY, REPLICAS, 'DATA'], 1, /'toy-replicas' is a replica set; profiling needs a Hessian set/],
    ['a tolerance of 0', [STUDY, HESSIAN, 'DATA', '--tolerance', '0'], 2, /--tolerance must be a number > 0, got '0'/]
  ])('refuses %s', async (_what, argv, code, message) => {
    const data = await measurementFor(HESSIAN, 'hessian-data-3.csv')
    const run = await sheaf(['profile', ...argv.map(a => (a === 'DATA' ? data : a))])
    expect(run.code).toBe(code)
    expect(oneLine(run)).toMatch(message)
  })
})

describe('sheaf sensitivity', () => {
  it('prints cos φ per flavour, bin and x, and the sensitivity with a measurement', async () => {
    const data = await measurementFor(HESSIAN, 'sens-data.csv')
    const run = await sheaf(['sensitivity', STUDY, HESSIAN, data, '--flavours', '2,21', '--q2', '10', '--x', '0.01,0.1,0.3'])
    expect(run.code).toBe(0)
    const out = JSON.parse(run.stdout)
    expect(out.x).toEqual([0.01, 0.1, 0.3])
    expect(out.flavours.map((f: { flavour: number }) => f.flavour)).toEqual([2, 21])
    for (const f of out.flavours) {
      expect(f.cosPhi).toHaveLength(7)
      for (const row of f.cosPhi) for (const c of row) expect(Math.abs(c)).toBeLessThanOrEqual(1)
      expect(f.sensitivity).toHaveLength(7)
    }
    const csv = await sheaf(['sensitivity', STUDY, REPLICAS, '--flavours', '1', '--x', '0.1', '--format', 'csv'])
    const lines = csv.stdout.trimEnd().split('\r\n')
    expect(lines[0]).toBe('flavour,bin,x,cosPhi,sensitivity')
    expect(lines).toHaveLength(1 + 7)
  })

  it.each([
    [['--flavours', '7'], 2, /--flavours: 7 is not a parton code/],
    [['--x', '1.5'], 2, /--x: 1\.5 is not in \(0, 1\)/],
    [['--q2', '1e12', '--x', '0.1'], 1, /toy-hessian\.sheafset: at Q² = 1000000000000 GeV²: /]
  ])('refuses %j', async (options, code, message) => {
    const run = await sheaf(['sensitivity', STUDY, HESSIAN, ...options])
    expect(run.code).toBe(code)
    expect(oneLine(run)).toMatch(message)
  })
})

describe('sheaf kfactor', () => {
  it('K = 1 gives compute\'s band; a K-factor error is reported apart and added on request', async () => {
    const plain = JSON.parse((await sheaf(['compute', STUDY, HESSIAN])).stdout).sets[0].bands.rows
    const ones = tmp.file('ones.csv', `k\n${'1\n'.repeat(7)}`)
    const same = JSON.parse((await sheaf(['kfactor', STUDY, HESSIAN, '--k-factors', ones])).stdout)
    same.bins.forEach((row: { central: number, plus: number, kError: number }, b: number) => {
      expect(row.central).toBe(plain[b].central)
      expect(row.plus).toBe(plain[b].plus)
      expect(row.kError).toBe(0)
    })
    const k = tmp.file('k.csv', `# made-up K-factors\nbin,k,k_error\n${Array.from({ length: 7 }, (_, b) => `${b + 1},1.25,0.05`).join('\n')}\n`)
    const run = await sheaf(['kfactor', STUDY, HESSIAN, '--k-factors', k, '--k-source', 'invented NLO/LO ratio', '--add-k-error'])
    expect(run.code).toBe(0)
    const out = JSON.parse(run.stdout)
    expect(out.kFactors.source).toBe('invented NLO/LO ratio')
    expect(out.kFactors.caution).toMatch(/user's responsibility/)
    out.bins.forEach((row: { central: number, plus: number, kError: number, totalPlus: number }, b: number) => {
      // By hand: central × 1.25, band × 1.25, δX = |X'| δK/K = 1.25 X₀ × 0.05/1.25.
      expect(row.central).toBeCloseTo(plain[b].central * 1.25, 12)
      expect(row.plus).toBeCloseTo(plain[b].plus * 1.25, 12)
      expect(row.kError).toBeCloseTo(plain[b].central * 0.05, 12)
      expect(row.totalPlus).toBeCloseTo(Math.hypot(row.plus, row.kError), 12)
    })
  })

  it('reads the K-factors a study carries, as the web app runs them; compute refuses such a study', async () => {
    const study = JSON.parse(readFileSync(STUDY, 'utf8'))
    const values = Array.from({ length: 7 }, (_, b) => 1 + 0.1 * b)
    const withK = tmp.file('study-k.json', JSON.stringify({ ...study, kFactors: { values, errors: values.map(() => 0.02), source: 'invented ratios', addErrorInQuadrature: true } }))
    const file = tmp.file('k-same.csv', `k,k_error\n${values.map(v => `${v},0.02`).join('\n')}\n`)
    const fromStudy = JSON.parse((await sheaf(['kfactor', withK, HESSIAN])).stdout)
    const fromFile = JSON.parse((await sheaf(['kfactor', STUDY, HESSIAN, '--k-factors', file, '--k-source', 'invented ratios', '--add-k-error'])).stdout)
    expect(fromStudy.bins).toEqual(fromFile.bins)
    expect(fromStudy.kErrorAddedInQuadrature).toBe(true)
    const both = await sheaf(['kfactor', withK, HESSIAN, '--k-factors', file])
    expect(both.code).toBe(2)
    expect(oneLine(both)).toMatch(/carries its own K-factors/)
    const compute = await sheaf(['compute', withK, HESSIAN])
    expect(compute.code).toBe(1)
    expect(oneLine(compute)).toMatch(/carries K-factors.*sheaf kfactor/)
  })

  it.each([
    ['no K-factor file', [], 2, /kfactor needs --k-factors <file>/],
    ['a bad cell', ['--k-factors', 'BAD'], 1, /bad-k\.csv: line 3, column 1: k must be a number > 0; found "-1"/]
  ])('refuses %s', async (_what, options, code, message) => {
    const bad = tmp.file('bad-k.csv', `k\n1\n-1\n${'1\n'.repeat(5)}`)
    const run = await sheaf(['kfactor', STUDY, HESSIAN, ...options.map(o => (o === 'BAD' ? bad : o))])
    expect(run.code).toBe(code)
    expect(oneLine(run)).toMatch(message)
  })
})
