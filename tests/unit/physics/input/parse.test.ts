import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { InputError } from '~/shared/physics/input/errors'
import { parseInputDocument, parseInputText } from '~/shared/physics/input/parse'

const minimal = JSON.parse(readFileSync('samples/fits/minimal-input.json', 'utf8'))
const edit = (f: (d: any) => void) => {
  const d = structuredClone(minimal)
  f(d)
  return d
}

function issuesOf(value: unknown): string[] {
  try {
    parseInputDocument(value, 'test.json')
  } catch (e) {
    expect(e).toBeInstanceOf(InputError)
    expect(e).toBeInstanceOf(RangeError)
    return (e as InputError).issues.map(i => `${i.path}: ${i.message}`)
  }
  return []
}

describe('parametrised-input documents', () => {
  it('accepts every sample input', () => {
    for (const f of ['minimal-input.json', 'quillon-22.json', 'brindle-mc-1.json', 'benchmark-toy-input.json', 'ostrand-pb24.json']) {
      expect(() => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)).not.toThrow()
    }
  })

  it.each([
    ['an unknown parameter name', (d: any) => { d.pieces[0].terms[0].a = 'a_uw' }, /pieces\[0\]\.terms\[0\]\.a: unknown parameter "a_uw"/],
    ['a term field of the wrong type', (d: any) => { d.pieces[1].terms[0].b = true }, /pieces\[1\]\.terms\[0\]\.b: expected a number or the name of a fit parameter/],
    ['an unused parameter', (d: any) => { d.parameters.push({ name: 'spare', value: 1 }); d.covariance = d.covariance.map((r: number[]) => [...r, 0]); d.covariance.push([0, 0, 0, 0, 1]) }, /parameters\[4\]: parameter "spare" is declared but no term uses it/],
    ['a covariance row of the wrong length', (d: any) => { d.covariance[2] = [1, 2] }, /covariance\[2\]: row has 2 entries, expected 4/],
    ['a non-symmetric covariance', (d: any) => { d.covariance[0][1] = 0.5 }, /covariance: the covariance is not symmetric: C\[0\]\[1\] \(a_uv × b_uv\)/],
    ['a covariance that is not positive definite', (d: any) => { d.covariance = [[1, 2, 0, 0], [2, 1, 0, 0], [0, 0, 1, 0], [0, 0, 0, 1]] }, /covariance: the covariance is not positive definite/],
    ['members without a covariance', (d: any) => { delete d.covariance }, /covariance: a members block .* needs the parameter covariance/],
    ['a heavy quark that is not active at μ₀²', (d: any) => { d.pieces[3].flavours['4'] = 1 }, /pieces\[3\]\.flavours\.4: flavour 4 is not active at μ₀² = 2 GeV²/],
    ['a photon flavour key', (d: any) => { d.pieces[2].flavours['22'] = 1 }, /pieces\[2\]\.flavours\.22: flavour keys are PDG codes/],
    ['a sum rule naming a missing piece', (d: any) => { d.sumRules.momentum = 'glue' }, /sumRules\.momentum: no piece has id "glue"/],
    ['two rules on one piece', (d: any) => { d.sumRules.dValence = 'uv' }, /sumRules\.dValence: piece "uv" is already normalised/],
    ['duplicate piece ids', (d: any) => { d.pieces[1].id = 'uv' }, /pieces\[1\]\.id: duplicate piece id "uv"/],
    ['an x range upside down', (d: any) => { d.grid.x.min = 0.5; d.grid.x.max = 0.1 }, /grid\.x: min = 0\.5 must be below max = 0\.1/],
    ['a Q² range ending below μ₀²', (d: any) => { d.grid.q2.maxGeV2 = 1 }, /grid\.q2\.maxGeV2: must exceed the starting scale/],
    ['unordered heavy-quark masses', (d: any) => { d.scheme.massesGeV.bottom = 1 }, /scheme\.massesGeV: heavy-quark masses must be ordered/],
    ['an unknown top-level key', (d: any) => { d.colour = 'red' }, /Unrecognized key: "colour"/],
    ['a future format version', (d: any) => { d.formatVersion = 2 }, /formatVersion: this engine reads formatVersion 1/]
  ])('refuses %s, naming the place', (_label, change, message) => {
    const issues = issuesOf(edit(change))
    expect(issues.join('\n')).toMatch(message)
  })

  it('reports a JSON syntax error with its line and column', () => {
    const text = '{\n  "format": "sheaf.parametrised-input",\n  "name": "x",,\n}'
    expect(() => parseInputText(text, 'broken.json')).toThrow(/broken\.json: not valid JSON at line 3, column 15/)
  })

  it('refuses a document of unknown format', () => {
    expect(issuesOf({ format: 'something-else' }).join()).toMatch(/format: expected "sheaf.parametrised-input" or "sheaf.nuclear-modification"/)
  })

  it('lists every problem at once, not only the first', () => {
    const issues = issuesOf(edit(d => { d.pieces[0].terms[0].a = 'nope'; d.grid.x.min = 0.99 }))
    expect(issues.length).toBeGreaterThanOrEqual(2)
  })
})
