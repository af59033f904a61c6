import { describe, expect, it } from 'vitest'
import { toyErrorSet } from '../../../../shared/physics/sets'
import { checkReach, parseStudySpec } from '../../../../shared/physics/study'

// A toy grid: x in [1e-5, 0.9], Q² in [2, 1e4] GeV² (made-up densities; only the reach matters).
const set = toyErrorSet({
  kind: 'hessian-pairs', errorMembers: 2, x: Float64Array.from([1e-5, 1e-4, 1e-3, 1e-2, 0.1, 0.5, 0.9]), q2: Float64Array.from([2, 10, 100, 1000, 1e4]),
  scheme: { type: 'fixed', nf: 3, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
})

describe('reach messages quote the bin as entered and the limit to narrow to', () => {
  it('a Q² range reaching above the grid: the user\'s range, never a quadrature node, and the largest Q² in reach', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2Min: 1000, q2Max: 50_000 }] })
    const [issue] = checkReach(spec, { main: set })
    expect(issue!.message).toContain('μ_F² (bin as entered: x = 0.01, Q² 1000 to 50000 GeV²) reaches above')
    expect(issue!.message).toContain("above the set's largest Q² node 10000 GeV²")
    // μ_F = Q at κ = 1: the boundary is the grid's last node, rounded inside it
    expect(issue!.message).toMatch(/; narrow Q² to at most 10000 GeV²$/)
    expect(issue!.message).not.toMatch(/\d\.\d{6,}/)
  })

  it('with κ = 2 the limit moves to Q²_max / κ² (μ_F² = κ² Q²)', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2Min: 100, q2Max: 5000 }], scaleFactor: 2 })
    expect(checkReach(spec, { main: set })[0]!.message).toMatch(/; narrow Q² to at most 2500 GeV²$/)
  })

  it('an x range reaching below the grid names the smallest x in reach', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ xMin: 1e-7, xMax: 1e-4, q2: 10 }] })
    expect(checkReach(spec, { main: set })[0]!.message).toMatch(/; narrow x to at least 0.00001$/)
  })
})
