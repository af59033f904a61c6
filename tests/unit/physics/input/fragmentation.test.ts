// Fragmentation inputs (a parametrised input with "density": fragmentation into one species):
// what is refused where, and the checks that replace the parton-density sum rules. The demo fits
// used here are INVENTED (samples/fits/verrel-ff-26-*.json).
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { xNodes } from '~/shared/physics/evolution/x-grid'
import { bindParameters } from '~/shared/physics/input/bind'
import { InputError, type InputIssue } from '~/shared/physics/input/errors'
import { memberIssues } from '~/shared/physics/input/feasibility'
import { fragmentationMomenta, fragmentationProblem } from '~/shared/physics/input/fragmentation'
import { EVOLVED_FLAVOURS } from '~/shared/physics/input/flavours'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputDocument } from '~/shared/physics/input/parse'
import { expectClose } from '../close'

/** The fields of an input document these tests change. */
interface FitDoc {
  name: string
  density?: { type: string, hadron?: string }
  target: unknown
  sumRules?: unknown
  baseline?: unknown
  parameters: { name: string, value: number }[]
  covariance: number[][]
}
const fit = (f: string) => JSON.parse(readFileSync(`samples/fits/${f}`, 'utf8')) as FitDoc
const pion = fit('verrel-ff-26-pi+.json')
const edit = (f: (d: FitDoc) => void, base: FitDoc = pion) => {
  const d = structuredClone(base)
  f(d)
  return d
}
const slot = (pdg: number) => EVOLVED_FLAVOURS.indexOf(pdg)

function refusal(doc: unknown, baseline?: unknown): InputIssue[] {
  try {
    compileInput(parseInputDocument(doc, 'ff.json'), baseline ? parseInputDocument(baseline, 'base.json') : undefined)
  } catch (e) {
    expect(e).toBeInstanceOf(InputError)
    return (e as InputError).issues
  }
  return []
}

describe('reading a fragmentation input', () => {
  it('keeps the density in the model; a parton input has none', () => {
    expect(compileInput(parseInputDocument(pion, 'ff.json')).density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
    expect(compileInput(parseInputDocument(fit('minimal-input.json'), 'p.json')).density).toBeUndefined()
    expect(compileInput(parseInputDocument(edit(d => { d.density = { type: 'parton' } }, fit('minimal-input.json')), 'p.json')).density).toBeUndefined()
  })

  it.each([
    ['sum rules', (d: FitDoc) => { d.sumRules = { momentum: 'gluon' } }, 'sumRules', /do not apply to fragmentation functions/],
    ['a nucleus as target', (d: FitDoc) => { d.target = { type: 'nucleus', z: 6, a: 12 } }, 'target', /not a target/],
    ['an unknown species', (d: FitDoc) => { d.density!.hadron = 'rho0' }, 'density.hadron', /hadron must be one of/],
    ['an unknown density type', (d: FitDoc) => { d.density = { type: 'photon' } }, 'density.type', /./]
  ])('refuses %s at its JSON path', (_label, change, path, message) => {
    const issues = refusal(edit(change))
    const issue = issues.find(i => i.path === path)
    expect(issue, JSON.stringify(issues)).toBeDefined()
    expect(issue!.message).toMatch(message)
  })

  it('refuses a nuclear modification of a fragmentation input (its baseline must be parton densities)', () => {
    const modification = edit((d) => { d.baseline = { name: pion.name } }, fit('ostrand-pb24.json'))
    const issues = refusal(modification, pion)
    expect(issues.some(i => i.path === 'baseline' && /fragmentation functions/.test(i.message)), JSON.stringify(issues)).toBe(true)
  })
})

describe('checks in place of the sum rules', () => {
  it('gives each parton’s momentum fraction into the species from the exact moments', () => {
    // N_fav·B(1.3, 2.2) with the file's N_fav = 1.07548 (written for 0.32, rounded to five
    // digits); B(1.3, 2.2) = Γ(1.3)Γ(2.2)/Γ(3.5) = 0.897471·1.101802/3.323351 = 0.297542 (Γ(1.3)
    // from A&S Table 6.1, Γ(2.2) = 1.2·Γ(1.2) = 1.2·0.918169, Γ(3.5) = 15√π/8), so 0.320000.
    const m = fragmentationMomenta(bindParameters(compileInput(parseInputDocument(pion, 'ff.json'))))
    expectClose(m[slot(2)]!, 0.320000, 5e-6)
    expectClose(m[slot(-1)]!, m[slot(2)]!, 1e-15)
    expect(m[slot(5)]).toBe(0)
  })

  it('names the member, parton and value of a momentum fraction above 1, and of a negative z·D', () => {
    const z = xNodes({ count: 20, min: 0.01, max: 0.95 })
    const greedy = bindParameters(compileInput(parseInputDocument(edit(d => { d.parameters[5]!.value *= 8 }), 'ff.json'))) // gluon: 8 × 0.14 = 1.12
    expect(fragmentationProblem(greedy, z, 'member 7')).toMatch(/^member 7: ∫ z·D dz of parton g is 1\.12\d* > 1/)
    const negative = bindParameters(compileInput(parseInputDocument(edit(d => { d.parameters[3]!.value = -0.1 }), 'ff.json')))
    expect(fragmentationProblem(negative, z, 'member 0')).toMatch(/^member 0: z·D of parton s̄ is -.* < 0 at z = 0\.01/)
    expect(fragmentationProblem(bindParameters(compileInput(parseInputDocument(pion, 'ff.json'))), z, 'x')).toBeUndefined()
  })

  it('accepts every member of the demo fits, and reports members pushed negative at the Hessian tolerance', () => {
    for (const f of ['pi+', 'pi-', 'K+', 'K-']) expect(memberIssues(compileInput(parseInputDocument(fit(`verrel-ff-26-${f}.json`), f)))).toEqual([])
    const wide = compileInput(parseInputDocument(edit(d => { d.covariance[3]![3] = 1 }), 'ff.json'))
    const issues = memberIssues(wide)
    expect(issues).toHaveLength(1)
    expect(issues[0]).toMatchObject({ path: 'members.tolerance', kind: 'physics' })
    expect(issues[0]!.message).toMatch(/^member \d+ \(eigenvector \d+, (up|down)\): z·D of parton .* < 0 .*lower the tolerance/)
  })

  it('applies no parton sum rule: a fragmentation input with ∫ z Σ D dz far from 1 is accepted', () => {
    const m = fragmentationMomenta(bindParameters(compileInput(parseInputDocument(pion, 'ff.json'))))
    const total = m.reduce((s, v) => s + v, 0)
    expectClose(total, 1.3, 1e-4) // 2·0.32 (u, d̄) + 4·0.08 (ū, d, s, s̄) + 2·0.10 (c, c̄) + 0.14 (g) = 1.30
    expect(memberIssues(compileInput(parseInputDocument(pion, 'ff.json')))).toEqual([])
  })
})
