import { afterAll, describe, expect, it } from 'vitest'
import { computeBands, memberValuesFromRows } from '../../../shared/physics/uncertainty'
import { oneLine, scratch, sheaf } from './run'

const tmp = scratch()
afterAll(() => tmp.done())

const hessian = { kind: 'hessian-pairs', clPercent: 90, values: [[10, 20], [11, 21], [9, 18.5], [10.5, 20], [10, 19]] }
const hessianFile = tmp.file('hessian.json', JSON.stringify(hessian))

describe('sheaf bands', () => {
  it('prints the engine\'s band for a plain values document, rescaled from the set\'s CL', async () => {
    const run = await sheaf(['bands', hessianFile, '--prescription', 'hessian-asymmetric'])
    expect(run.code).toBe(0)
    expect(run.stderr).toBe('')
    const out = JSON.parse(run.stdout)
    const engine = computeBands(memberValuesFromRows(hessian.values), { kind: 'hessian-pairs', prescription: 'hessian-asymmetric', clFrom: 90, clTo: 68 })
    expect(out.sets).toHaveLength(1)
    expect(out.sets[0]).toMatchObject({ set: 'hessian', kind: 'hessian-pairs', members: 5, bins: 2 })
    expect(out.sets[0].bands.prescription).toBe('hessian-asymmetric')
    expect(out.sets[0].bands.clPercent).toBe(68)
    expect(out.sets[0].bands.rows.map((r: { plus: number }) => r.plus)).toEqual(Array.from(engine.plus))
    expect(out.sets[0].bands.rows.map((r: { minus: number }) => r.minus)).toEqual(Array.from(engine.minus))
  })

  it('uses the kind\'s default prescription and keeps the set\'s CL when --cl matches it', async () => {
    const run = await sheaf(['bands', hessianFile, '--cl', '90'])
    const rows = JSON.parse(run.stdout).sets[0].bands.rows
    // Symmetric Hessian ½√Σ(X_k⁺ − X_k⁻)² (J. Pumplin et al., hep-ph/0101032; shared/physics/README.md
    // §13.1 Hessian sets), worked by hand: bin 0: ½√(2² + 0.5²) = ½√4.25; bin 1: ½√(2.5² + 1²) = ½√7.25.
    expect(rows[0].plus).toBeCloseTo(0.5 * Math.sqrt(4.25), 14)
    expect(rows[1].minus).toBeCloseTo(0.5 * Math.sqrt(7.25), 14)
    expect(JSON.parse(run.stdout).sets[0].bands.prescription).toBe('hessian-symmetric')
  })

  it('writes one CSV line per set and bin', async () => {
    const run = await sheaf(['bands', hessianFile, '--format', 'csv'])
    const lines = run.stdout.trimEnd().split('\r\n')
    expect(lines[0]).toBe('set,bin,central,plus,minus,relPlus,relMinus,pdfPlus,pdfMinus,alphas,prescription,clPercent,interval,quadratureError,scaleUp,scaleDown,scaleVariation')
    expect(lines).toHaveLength(3)
    expect(lines[1]!.startsWith('hessian,1,10,')).toBe(true)
    expect(lines[1]!.endsWith(',hessian-symmetric,68,"Hessian, rescaled from 90 % to 68 % CL (Gaussian)",,,,')).toBe(true)
  })

  it('adds the α_s members in quadrature and reports both parts', async () => {
    const doc = { kind: 'replicas', values: [[5], [4], [6], [5], [5.5], [7]], alphasMembers: [4, 5] }
    const run = await sheaf(['bands', tmp.file('alphas.json', JSON.stringify(doc))])
    const row = JSON.parse(run.stdout).sets[0].bands.rows[0]
    // α_s part ½|X(α_s⁺) − X(α_s⁻)| = ½|7 − 5.5| = 0.75 (PDF4LHC, arXiv:1510.03865; shared/physics/
    // README.md §13.4 α_s members); the replicas 4, 6, 5 have sample standard deviation 1 (by
    // hand), so the total is √(1 + 0.75²) = 1.25.
    expect(row.alphas).toBeCloseTo(0.75, 14)
    expect(row.pdfPlus).toBeCloseTo(1, 14)
    expect(row.plus).toBeCloseTo(1.25, 14)
  })

  it.each([
    ['unknown prescription', 2, [hessianFile, '--prescription', 'widest'], /^sheaf: bands: unknown prescription 'widest'; use one of: hessian-symmetric, /],
    ['prescription of another kind', 1, [hessianFile, '--prescription', 'replica-sd'], /hessian\.json: set 'hessian': Prescription 'replica-sd' does not apply to a set of kind 'hessian-pairs'/],
    ['missing file', 1, ['no-such-values.json'], /^sheaf: no-such-values\.json: no such file$/],
    ['CL out of range', 2, [hessianFile, '--cl', '100'], /--cl must be a percentage strictly between 0 and 100/],
    ['unknown option', 2, [hessianFile, '--colour'], /^sheaf: bands: Unknown option '--colour'; see 'sheaf bands --help'\.$/],
    ['no file', 2, [], /bands takes 1 values file, got 0/]
  ])('refuses %s with one line and exit %i', async (_, code, argv, message) => {
    const run = await sheaf(['bands', ...argv])
    expect(run.code).toBe(code)
    expect(run.stdout).toBe('')
    expect(oneLine(run)).toMatch(message)
  })

  it.each([
    ['bad JSON', '{"kind": "replicas",\n "values": [[1], [2],]\n}', /^sheaf: .*bad\.json: not valid JSON at line 2, column 22: /],
    ['wrong member count for Hessian pairs', JSON.stringify({ kind: 'hessian-pairs', values: [[1], [2]] }), /needs the central member plus an even number/],
    ['ragged matrix', JSON.stringify({ kind: 'replicas', values: [[1, 2], [3]] }), /bad\.json: values: Member 1 has 1 bins but member 0 has 2/],
    ['unknown kind', JSON.stringify({ kind: 'bootstrap', values: [[1]] }), /bad\.json: kind: must be hessian-pairs, hessian-one-sided or replicas/],
    ['a string among the values', JSON.stringify({ kind: 'replicas', values: [[1], ['2']] }), /bad\.json: values\[1\]\[0\]: must be a number/]
  ])('refuses %s with exit 1', async (_, text, message) => {
    const run = await sheaf(['bands', tmp.file('bad.json', text)])
    expect(run.code).toBe(1)
    expect(oneLine(run)).toMatch(message)
  })

  it('prints its help', async () => {
    const run = await sheaf(['bands', '--help'])
    expect(run.code).toBe(0)
    expect(run.stdout).toMatch(/^Usage: sheaf bands <values\.json>/)
  })
})
