// The up-front checks of a fit (shared/physics/input/feasibility.ts): what the evolution would
// refuse is refused when the document is read or compiled, as a 'physics' issue at its JSON path.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { expectClose } from '../close'
import { InputError, onlyPhysics, type InputIssue } from '~/shared/physics/input/errors'
import { BUILD_LIMITS, buildSize, landauPoleGeV2, memberIssues } from '~/shared/physics/input/feasibility'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputDocument } from '~/shared/physics/input/parse'

const text = (f: string) => readFileSync(`samples/fits/${f}`, 'utf8')
const minimal = JSON.parse(text('minimal-input.json'))
const edit = (f: (d: any) => void, base: unknown = minimal) => {
  const d = structuredClone(base) as any
  f(d)
  return d
}

/** The issues reading and compiling `doc` raises ([] when it compiles). */
function refusal(doc: unknown): InputIssue[] {
  try {
    compileInput(parseInputDocument(doc, 'fit.json'))
  } catch (e) {
    expect(e).toBeInstanceOf(InputError)
    return (e as InputError).issues
  }
  return []
}

const fixed4 = { type: 'fixed', nf: 4, massesGeV: { charm: 1.5, bottom: 4.75, top: 172.5 } } as const

describe('integrability at the central values', () => {
  // A term x·f = A x^a (1−x)^b integrates to A·B(a + 1, b + 1) for ∫x·f dx and A·B(a, b + 1) for
  // ∫f dx; Euler's B(p, q) is finite only for p, q > 0 (DLMF §5.12.1). So b > −1 and a > −1
  // everywhere, a > 0 where a valence rule counts the piece.
  it.each([
    ['b ≤ −1 (divergent at x → 1)', (d: any) => { d.pieces[2].terms[0].b = -1 }, 'pieces[2].terms[0].b', /b = -1 at the central values: .*needs b > −1/],
    ['a ≤ −1 on a sea term', (d: any) => { d.pieces[3].terms[0].a = -1.2 }, 'pieces[3].terms[0].a', /a = -1\.2 at the central values: .*momentum integral .*needs a > −1/],
    ['a ≤ −1 through a parameter', (d: any) => { d.parameters[2].value = -1.05 }, 'pieces[2].terms[0].a', /a \(parameter a_g\) = -1\.05 at the central values/],
    ['a ≤ 0 on a piece the u-valence rule counts', (d: any) => { d.parameters[0].value = 0 }, 'pieces[0].terms[0].a', /u-valence rule .* counts piece "uv", .*unless a > 0/]
  ])('refuses %s at its path', (_label, change, path, message) => {
    const issues = refusal(edit(change))
    const issue = issues.find(i => i.path === path)
    expect(issue?.message).toMatch(message)
    expect(onlyPhysics(issues)).toBe(true)
  })

  it('accepts exponents just inside the bounds', () => {
    expect(refusal(edit((d) => { d.pieces[2].terms[0].b = -0.999; d.pieces[3].terms[0].a = -0.999 }))).toEqual([])
    // Without the sum rules no number integral is taken, so a valence piece may have a ≤ 0.
    expect(refusal(edit((d) => { delete d.sumRules; d.parameters[0].value = -0.5 }))).toEqual([])
  })

  it('names the modification term and the baseline term of a divergent bound-proton term', () => {
    const quillon = parseInputDocument(JSON.parse(text('quillon-22.json')), 'quillon-22.json')
    // R_sea's first term x^−1.5 times the baseline sea x^a_sea (a_sea > −0.5 in Quillon-22) gives a < −1.
    const doc = parseInputDocument(edit((d) => { d.modifications[1].terms[0].a = -1.5 }, JSON.parse(text('ostrand-pb24.json'))), 'o.json')
    try {
      compileInput(doc, quillon, 'o.json')
      expect.unreachable('compiled a divergent bound-proton term')
    } catch (e) {
      const issue = (e as InputError).issues[0]!
      expect(issue).toMatchObject({ path: 'modifications[1].terms[0].a', kind: 'physics' })
      expect(issue.message).toMatch(/bound-proton term: this modification term times baseline pieces\[3\]\.terms\[0\]/)
    }
  })
})

describe('grid, start scale and tolerance', () => {
  it.each([
    ['two Q² nodes', (d: any) => { d.grid.q2.count = 2 }, 'grid.q2.count', /2 Q² nodes are too few: .*at least 4/],
    ['three Q² nodes', (d: any) => { d.scheme = fixed4; d.grid.q2.count = 3 }, 'grid.q2.count', /at least 4/],
    // n_f up to 6 below 1e5 GeV²: m_c², m_b² and m_t² = 29 756 GeV² all lie inside.
    ['fewer Q² nodes than both ends and three thresholds', (d: any) => { d.scheme.nf = 6; d.grid.q2.count = 4 }, 'grid.q2.count', /count in 5\.\.2000/],
    ['x_min = 1e-300', (d: any) => { d.grid.x.min = 1e-300 }, 'grid.x.min', /x_min = 1e-300 is below 1e-9/],
    ['x_min just below 1e-9', (d: any) => { d.grid.x.min = 9.99e-10 }, 'grid.x.min', /below 1e-9/],
    ['a start scale below the Landau pole', (d: any) => { d.startScaleGeV2 = 0.001 }, 'startScaleGeV2', /μ₀² = 0\.001 GeV² lies below the Landau pole Λ² ≈ .* GeV²/],
    // α_s(μ²) = 1.5 with α_s(2 GeV²) = 0.35, n_f = 4 at μ² = 2 exp((1/1.5 − 1/0.35)·4π/β₀) = 0.0735 GeV²,
    // the pole at 0.0269 GeV² (formulas of the Landau-pole test below): 0.05 GeV² lies between.
    ['a start scale where α_s exceeds 1.5', (d: any) => { d.scheme = fixed4; d.alphas = { value: 0.35, scaleGeV2: 2 }; d.startScaleGeV2 = 0.05 }, 'startScaleGeV2', /α_s\(μ₀²\) = .* the evolution starts only where α_s ≤ 1\.5/],
    ['an absurd tolerance', (d: any) => { d.members.tolerance = 1e300 }, 'members.tolerance', /T = 1e\+300 is outside 0\.1…20/],
    ['a vanishing tolerance', (d: any) => { d.members.tolerance = 1e-300 }, 'members.tolerance', /outside 0\.1…20/]
  ])('refuses %s at its path', (_label, change, path, message) => {
    const issues = refusal(edit(change))
    expect(issues.find(i => i.path === path)?.message).toMatch(message)
    expect(onlyPhysics(issues)).toBe(true)
  })

  it('accepts the edges of each range', () => {
    expect(refusal(edit((d) => { d.scheme = fixed4; d.grid.q2.count = 4; d.grid.x.min = 1e-9 }))).toEqual([])
    expect(refusal(edit((d) => { d.members.tolerance = BUILD_LIMITS.minTolerance }))).toEqual([])
    expect(refusal(edit((d) => { d.members.tolerance = BUILD_LIMITS.maxTolerance }))).toEqual([])
  })

  it('finds the one-loop Landau pole of a fixed-flavour scheme', () => {
    // 1/α_s(μ²) = 1/α_s(μ₀²) + (β₀/4π) ln(μ²/μ₀²) vanishes at Λ² = μ₀² exp(−4π/(β₀ α_s(μ₀²)))
    // (ESW, "QCD and Collider Physics", ch. 2); β₀(4) = 11 − 8/3 = 25/3.
    expectClose(landauPoleGeV2({ value: 0.35, scaleGeV2: 2 }, fixed4), 2 * Math.exp(-4 * Math.PI / ((25 / 3) * 0.35)), 1e-10)
  })
})

describe('every member', () => {
  // Diagonal covariance: the eigenvalues are the variances, largest first, and Hessian pair k
  // moves one parameter by ±T√λ_k (hep-ph/0101032). Here λ₁ = 1 belongs to a_g = −0.1, so
  // member 2 (pair 1, down) has a_g = −0.1 − 1·√1 = −1.1.
  const wide = (d: any, variances: number[]) => { d.covariance = variances.map((v, i) => variances.map((_, j) => (i === j ? v : 0))) }

  it('finds a Hessian member whose term diverges, at the term and naming the member', () => {
    const model = compileInput(parseInputDocument(edit(d => wide(d, [1e-4, 1e-4, 1, 1e-4])), 'fit.json'))
    const issues = memberIssues(model)
    expect(issues).toHaveLength(1)
    expect(issues[0]).toMatchObject({ path: 'pieces[2].terms[0].a', kind: 'physics' })
    expect(issues[0]!.message).toMatch(/a \(parameter a_g\) = -1\.1 at member 2 \(eigenvector 1, down\): .*lower the tolerance/)
  })

  it('finds a Hessian member whose sum rules cannot be met, at members.tolerance', () => {
    // Member 1 raises A_sea from 0.2 to 1.2: six sea flavours carry 6 · 1.2 · B(0.85, 8) = 1.38 of
    // the momentum (B(0.85, 8) = 0.1915, DLMF §5.12.1 via Γ), more than the whole, so the gluon
    // would need a negative normalisation.
    const model = compileInput(parseInputDocument(edit(d => wide(d, [1e-4, 1e-4, 1e-4, 1])), 'fit.json'))
    const issues = memberIssues(model)
    expect(issues[0]).toMatchObject({ path: 'members.tolerance', kind: 'physics' })
    expect(issues[0]!.message).toMatch(/member 1 \(eigenvector 1, up\): the momentum sum rule .* ≤ 0 for piece "g"/)
  })

  it('finds divergent replicas at the term and names one', () => {
    // σ(a_g) = 1 around −0.1: a replica has a_g < −1 when its normal deviate is below −0.9
    // (probability 0.18), so some of 50 replicas do.
    const model = compileInput(parseInputDocument(edit((d) => { wide(d, [1e-4, 1e-4, 1, 1e-4]); d.members = { type: 'replicas', count: 50, seed: 3 } }), 'fit.json'))
    const issue = memberIssues(model).find(i => i.path === 'pieces[2].terms[0].a')
    expect(issue?.message).toMatch(/at replica \d+ .*the replicas the covariance draws reach it/)
  })

  it.each(['minimal-input.json', 'quillon-22.json', 'brindle-mc-1.json'])('finds nothing to refuse in %s', (f) => {
    expect(memberIssues(compileInput(parseInputDocument(JSON.parse(text(f)), f)))).toEqual([])
  })
})

describe('build size', () => {
  it('counts members × x nodes × Q² nodes × 13 flavours', () => {
    // 4 parameters: 1 + 2·4 = 9 Hessian members; a fixed scheme has no doubled thresholds, so
    // 10 Q² nodes; 9 · 60 · 10 · 13 = 70 200 values.
    const fixed = compileInput(parseInputDocument(edit((d) => { d.scheme = fixed4; d.grid.q2.count = 10 }), 'fit.json'))
    expect(buildSize(fixed)).toEqual({ members: 9, xNodes: 60, q2Nodes: 10, flavours: 13, values: 70_200 })
    // Variable n_f = 5 from μ₀² = 2 to 1e5 GeV²: m_c² = 2.25 and m_b² = 22.56 lie inside and are
    // doubled (20 + 2 nodes); 1000 replicas and their mean are 1001 members.
    const replicas = compileInput(parseInputDocument(edit((d) => { d.members = { type: 'replicas', count: 1000, seed: 1 } }), 'fit.json'))
    expect(buildSize(replicas)).toEqual({ members: 1001, xNodes: 60, q2Nodes: 22, flavours: 13, values: 1001 * 60 * 22 * 13 })
  })
})
