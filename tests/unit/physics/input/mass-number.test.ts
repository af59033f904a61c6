import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { bindParameters } from '~/shared/physics/input/bind'
import { InputError } from '~/shared/physics/input/errors'
import { massNumberValue } from '~/shared/physics/input/mass-number'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputDocument, parseInputText } from '~/shared/physics/input/parse'
import { expectClose } from '../close'

const text = (f: string) => readFileSync(`samples/fits/${f}`, 'utf8')
const quillon = parseInputText(text('quillon-22.json'), 'quillon-22.json')
const family = () => JSON.parse(text('ostrand-25.json')) as Record<string, any> // eslint-disable-line @typescript-eslint/no-explicit-any

function issuesOf(doc: unknown): Array<{ path: string, message: string }> {
  try {
    parseInputDocument(doc, 'family.json')
  } catch (e) {
    if (e instanceof InputError) return e.issues
    throw e
  }
  return []
}

describe('A-dependent coefficients of a nuclear modification: k·A^p·(1 + Σ c_m A^(−m/3))·(1 + Σ e_n δⁿ)', () => {
  // Hand-worked values: 8^(1/3) = 2, 27^(−1/3) = 1/3; δ = (A − 2Z)/A = (56 − 52)/56 = 1/14 for ⁵⁶Fe.
  it('evaluates a power of A, a polynomial in A^(−1/3) and the neutron excess by hand-worked numbers', () => {
    const p = [0.5, 1 / 3]
    expectClose(massNumberValue({ ofA: [{ k: { param: 0 }, power: { param: 1 }, c: [], excess: [] }], nucleus: { z: 4, a: 8 } }, p), 1, 1e-15)
    expectClose(massNumberValue({ ofA: [{ k: 9, power: 0, c: [3, 9], excess: [] }], nucleus: { z: 13, a: 27 } }, p), 9 * (1 + 1 + 1), 1e-15)
    expectClose(massNumberValue({ ofA: [{ k: 1, power: 0, c: [], excess: [14, 196] }], nucleus: { z: 26, a: 56 } }, p), 1 + 1 + 1, 1e-15)
    // Two terms add.
    expectClose(massNumberValue({ ofA: [{ k: 2, power: 0, c: [], excess: [] }, { k: 1, power: 1, c: [], excess: [] }], nucleus: { z: 1, a: 2 } }, p), 4, 1e-15)
  })

  it('a coefficient with k only is k exactly (bit for bit), whatever the nucleus', () => {
    for (const a of [2, 12, 56, 208]) {
      expect(massNumberValue({ ofA: [{ k: { param: 0 }, power: 0, c: [], excess: [] }], nucleus: { z: 1, a } }, [-0.123456789012345])).toBe(-0.123456789012345)
    }
  })

  it('the family document compiles for any nucleus; the valence and momentum rules hold for each bound proton at μ₀² from exact moments', () => {
    const doc = parseInputText(text('ostrand-25.json'), 'ostrand-25.json')
    for (const nucleus of [{ z: 1, a: 2 }, { z: 6, a: 12 }, { z: 18, a: 40 }, { z: 26, a: 56 }, { z: 82, a: 208 }]) {
      const model = compileInput(doc, quillon, 'ostrand-25.json', { nucleus })
      expect(model.target).toEqual({ type: 'nucleus', ...nucleus })
      expect(model.massNumberDependence).toHaveLength(9)
      const bound = bindParameters(model)
      expect(bound.pieces.every(p => p.norm > 0)).toBe(true)
    }
  })

  it('refuses an unknown parameter inside ofA, naming the path, and a nucleus with Z > A', () => {
    const doc = family()
    doc.modifications[0].terms[1].A = { ofA: [{ k: 'shadow_v', power: 'gamma_B' }] }
    const issues = issuesOf(doc)
    expect(issues.map(i => i.path)).toContain('modifications[0].terms[1].A.ofA[0].power')
    expect(issues.find(i => i.path.endsWith('.power'))!.message).toMatch(/unknown parameter "gamma_B"/)
    const ok = parseInputText(text('ostrand-25.json'), 'ostrand-25.json')
    expect(() => compileInput(ok, quillon, 'family', { nucleus: { z: 30, a: 20 } })).toThrow(/nucleus: Z = 30 exceeds A = 20/)
    expect(() => compileInput(quillon, undefined, 'quillon', { nucleus: { z: 6, a: 12 } })).toThrow(/only a nuclear modification/)
  })

  it('refuses a malformed ofA term with the place', () => {
    const doc = family()
    doc.modifications[1].terms[2].A = { ofA: [{ k: 'anti_s', cc: [-1] }] }
    const issues = issuesOf(doc)
    expect(issues.length).toBeGreaterThan(0)
    expect(issues[0]!.path).toMatch(/^modifications\[1\]\.terms\[2\]\.A/)
  })

  it('reports a coefficient that an A-dependence makes infinite as a physics problem at the term', () => {
    const doc = family()
    doc.parameters.find((p: { name: string }) => p.name === 'gamma_A').value = 400
    const parsed = parseInputDocument(doc, 'family.json')
    expect(() => compileInput(parsed, quillon, 'family.json', { nucleus: { z: 82, a: 208 } })).toThrow(/modifications\[0\]\.terms\[1\].*not a finite number/)
  })
})
