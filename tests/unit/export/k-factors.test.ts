// K-factors in the exports: the provenance says they were used and where they came from, the
// caution adds that they are the user's responsibility, the per-bin K and δK are columns, and
// the K-factor uncertainty is a band of its own (with the PDF band in quadrature only on request).
import { describe, expect, it } from 'vitest'
import { bandsToCsv, bandsToJson, bandsToLatex, K_FACTOR_CAUTION, K_FACTOR_CAUTION_SHORT, provenanceLines, RESULT_CAUTION } from '#shared/export'
import { bandToJson, makeBands } from '#shared/physics/uncertainty/band'
import { parseStudySpec } from '#shared/physics/study/spec'
import { exportBins, exportColumns, resultForExport } from '../../../server/domain/results/export'
import { exportKFactors, kFactorView } from '../../../server/domain/results/k-factors'
import type { StoredBands } from '../../../server/database/schema'
import { expectClose } from '../physics/close'
import { handMadeResult } from './result'

const bins = [{ x: 0.01, q2: 10 }, { x: 0.02, q2: 10 }]
const spec = (kFactors?: unknown) => parseStudySpec({ kernel: 'dis-nc-f2', bins, ...(kFactors ? { kFactors } : {}) })
// Invented band numbers (no physics claim): the PDF band of K-scaled members at 90% CL.
const stored = (cl: number): StoredBands => {
  const band = bandToJson(makeBands([10, 4], [1, 0.5], [2, 0.5]))
  return { ...band, prescription: 'hessian-symmetric', clPercent: cl, pdf: band, alphas: null }
}

describe('the K-factor view of a result', () => {
  it('is null without K-factors, and carries the values without an uncertainty when none was given', () => {
    expect(kFactorView(spec(), stored(68), 68)).toBeNull()
    expect(kFactorView(spec({ values: [1.25, 2] }), stored(68), 68)).toEqual({ values: [1.25, 2], errors: null, source: null, addedInQuadrature: false, error: null, combined: null })
  })

  it('reports δX = |X| δK/K at the band\'s CL apart, and in quadrature only when asked', () => {
    const k = { values: [1.25, 2], errors: [0.1, 0], source: ' our ratio table ' }
    const apart = kFactorView(spec(k), stored(68), 68)!
    // By hand: bin 1, 10 × 0.1 / 1.25 = 0.8; bin 2, δK = 0.
    expectClose(apart.error!, [0.8, 0], 1e-15)
    expect(apart).toMatchObject({ source: 'our ratio table', addedInQuadrature: false, combined: null })
    const both = kFactorView(spec({ ...k, addErrorInQuadrature: true }), stored(90), 90)!
    // At 90% CL the Gaussian multiple is 1.6448536… (two-sided quantile, PDG "Statistics" table).
    const e = 0.8 * 1.6448536269514724
    expectClose(both.error![0]!, e, 1e-9)
    expectClose(both.combined!.plus, [Math.hypot(1, e), 0.5], 1e-9)
    expectClose(both.combined!.minus, [Math.hypot(2, e), 0.5], 1e-9)
  })
})

describe('exports of a result with K-factors', () => {
  const k = { values: [1.25, 2], errors: [0.1, 0], source: 'ratio table v2', addErrorInQuadrature: true }
  const data = () => {
    const r = handMadeResult()
    const s = spec(k)
    const provenance = { ...r.provenance, kFactors: exportKFactors(s) }
    return resultForExport(provenance, s, 'hessian-symmetric', stored(68), null)
  }

  it('puts K and δK beside the kinematics, and nothing more without K-factors', () => {
    expect(exportColumns(spec(k)).map(c => c.key)).toEqual(['x', 'q2', 'kFactor', 'kFactorError'])
    expect(exportBins(spec(k))).toEqual([{ x: 0.01, q2: 10, kFactor: 1.25, kFactorError: 0.1 }, { x: 0.02, q2: 10, kFactor: 2, kFactorError: 0 }])
    expect(exportColumns(spec()).map(c => c.key)).toEqual(['x', 'q2'])
    expect(exportBins(spec())).toEqual(bins)
  })

  it('adds the K-factor band apart and the quadrature band when asked', () => {
    const d = data()
    expect(d.bands.map(b => b.id)).toEqual(['hessian-symmetric', 'k-factor', 'pdf+k-factor'])
    expectClose(Array.from(d.bands[1]!.band.plus), [0.8, 0], 1e-15)
    expectClose(Array.from(d.bands[2]!.band.plus), [Math.hypot(1, 0.8), 0.5], 1e-15)
    const apart = resultForExport(data().provenance, spec({ ...k, addErrorInQuadrature: false }), 'hessian-symmetric', stored(68), null)
    expect(apart.bands.map(b => b.id)).toEqual(['hessian-symmetric', 'k-factor'])
  })

  it('says in CSV, JSON and LaTeX that K-factors were used, their source, and whose responsibility they are', () => {
    const d = data()
    const line = provenanceLines(d.provenance, d.observable, 'bands').find(l => l.startsWith('K-factors: '))
    expect(line).toMatch(/per-bin K-factors multiply every member before the bands.*source: ratio table v2.*added in quadrature/)
    const csv = bandsToCsv(d)
    expect(csv).toContain(`# ${line}`)
    expect(csv).toContain(`# caution: ${RESULT_CAUTION} ${K_FACTOR_CAUTION}`)
    expect(csv.split('\r\n').find(l => l.startsWith('x,'))).toMatch(/^x,q2,kFactor,kFactorError,central\[hessian-symmetric\].*central\[k-factor\].*central\[pdf\+k-factor\]/)
    const json = bandsToJson(d)
    expect(json.caution).toBe(`${RESULT_CAUTION} ${K_FACTOR_CAUTION}`)
    expect(json.provenance.kFactors).toEqual({ source: 'ratio table v2', withErrors: true, addedInQuadrature: true })
    const tex = bandsToLatex(d)
    expect(tex).toContain('$\\delta K$')
    expect(tex).toContain(K_FACTOR_CAUTION_SHORT)
  })

  it('keeps the caution as it was without K-factors', () => {
    const r = handMadeResult()
    expect(bandsToJson(r).caution).toBe(RESULT_CAUTION)
    expect(bandsToCsv(r)).not.toContain('K-factor')
    expect(bandsToLatex(r)).not.toContain('K-factor')
  })
})
