import { readFileSync } from 'node:fs'
import { afterAll, describe, expect, it } from 'vitest'
import { evolveMellin } from '../../../shared/physics/evolution'
import { bindParameters, compileInput, EVOLVED_FLAVOURS, parseInputText } from '../../../shared/physics/input'
import { interpolateFlavours } from '../../../shared/physics/interpolation'
import { parseSetFile } from '../../../shared/physics/sets'
import { oneLine, scratch, sheaf } from './run'

const tmp = scratch()
afterAll(() => tmp.done())

// The published toy input of the LO evolution benchmark (hep-ph/0204316), as a sample.
const toyInput = 'samples/fits/benchmark-toy-input.json'
const model = compileInput(parseInputText(readFileSync(toyInput, 'utf8'), toyInput))
const xs = [1e-3, 0.1, 0.5]
const q2s = [1e4, 20.25]

describe('sheaf evolve --x --q2', () => {
  it('prints x·f of every flavour at every combination, agreeing with the Mellin-space solution', async () => {
    const run = await sheaf(['evolve', toyInput, '--x', xs.join(','), '--q2', q2s.join(',')])
    expect(run.stderr).toBe('')
    expect(run.code).toBe(0)
    const { points, ...rest } = JSON.parse(run.stdout)
    expect(rest).toEqual({})
    expect(points.map((p: { x: number, q2: number }) => [p.x, p.q2])).toEqual(q2s.flatMap(q2 => xs.map(x => [x, q2])))
    // The engine's independent method (shared/physics/README.md §8.4 Mellin-space method: exact LO
    // per moment, numerical inversion). The x-space result must agree within 1e-4 relative for
    // x ≤ 0.7 (the agreement measured is quoted in §8.3 x-space method).
    const mellin = evolveMellin(bindParameters(model), model, points.map((p: { x: number, q2: number }) => ({ x: p.x, q2GeV2: p.q2 })))
    points.forEach((p: { xf: Record<string, number> }, i: number) => {
      expect(Object.keys(p.xf).map(Number).sort((a, b) => a - b)).toEqual([...EVOLVED_FLAVOURS].sort((a, b) => a - b))
      EVOLVED_FLAVOURS.forEach((pdg, slot) => {
        const expected = mellin[i * EVOLVED_FLAVOURS.length + slot]!
        if (expected === 0) expect(p.xf[String(pdg)]).toBe(0)
        else expect(Math.abs(p.xf[String(pdg)]! / expected - 1)).toBeLessThan(1e-4)
      })
    })
    // m_b = 4.5 GeV in this input: the b quark starts at zero at Q² = m_b² = 20.25 GeV².
    expect(points[3].xf['5']).toBe(0)
    expect(points[0].xf['5']).toBeGreaterThan(0)
  })

  it('writes CSV with one column per flavour, and the one-member set agrees with the points', async () => {
    const csv = await sheaf(['evolve', toyInput, '--x', '0.01,0.3', '--q2', '100', '--format', 'csv', '--out', tmp.file('central.sheafset')])
    expect(csv.code).toBe(0)
    const [header, ...rows] = csv.stdout.trimEnd().split('\r\n')
    expect(header).toBe('x,q2,-6,-5,-4,-3,-2,-1,1,2,3,4,5,6,21')
    expect(rows).toHaveLength(2)
    const set = parseSetFile(readFileSync(tmp.file('central.sheafset')))
    expect(set.members).toHaveLength(1)
    expect(set.header).toMatchObject({ name: 'LH-toy-2002', kind: 'hessian-pairs', memberCount: 1 })
    // The input's grid block: 100 x nodes, 40 Q² values (+ doubled thresholds).
    expect(set.x.length).toBe(100)
    // Cubic (ln x, ln Q²) interpolation of the written grid reproduces the points to ~1e-3.
    const grid = { x: set.x, q2: set.q2, flavours: set.flavours, values: set.members[0]! }
    rows.forEach((row) => {
      const cells = row.split(',').map(Number)
      const values = interpolateFlavours(grid, cells[0]!, cells[1]!)
      const gluon = values[set.flavours.indexOf(21)]!
      expect(Math.abs(cells[14]! / gluon - 1)).toBeLessThan(1e-3)
    })
  })

  it.each([
    ['Q² below μ₀²', ['--x', '0.1', '--q2', '1'], 1, /^sheaf: evolve: --q2 value 1 GeV² lies below the starting scale μ₀² = 2 GeV² of samples\/fits\/benchmark-toy-input\.json/],
    ['x below the grid', ['--x', '1e-8', '--q2', '10'], 1, /x = 1e-8 lies outside the grid/],
    ['x outside (0, 1)', ['--x', '1.5', '--q2', '10'], 2, /^sheaf: evolve: --x value 1\.5 is not in \(0, 1\)\.$/],
    ['a list item that is not a number', ['--x', '0.1,,0.2', '--q2', '10'], 2, /--x item 2 \(''\) is not a number/],
    ['--x without --q2', ['--x', '0.1'], 2, /--x and --q2 go together/],
    ['nothing to do', [], 2, /evolve needs --x and --q2 \(points to print\), or --out/]
  ])('refuses %s', async (_, argv, code, message) => {
    const run = await sheaf(['evolve', toyInput, ...argv])
    expect(run.code).toBe(code)
    expect(run.stdout).toBe('')
    expect(oneLine(run)).toMatch(message)
  })

  it.each([
    ['a missing input', () => 'no-such-input.json', /^sheaf: no-such-input\.json: no such file$/],
    ['an input that is not JSON', () => tmp.file('bad.json', '{\n  "format": "sheaf.parametrised-input",\n  "name": \'x\'\n}'), /bad\.json: not valid JSON at line 3, column 11: unexpected "'" where a value was expected$/],
    ['an input the schema refuses', () => tmp.file('schema.json', JSON.stringify({ ...JSON.parse(readFileSync(toyInput, 'utf8')), startScaleGeV2: -2 })), /schema\.json: startScaleGeV2: /]
  ])('refuses %s with exit 1', async (_, file, message) => {
    const run = await sheaf(['evolve', file(), '--x', '0.1', '--q2', '10'])
    expect(run.code).toBe(1)
    expect(oneLine(run)).toMatch(message)
  })
})
