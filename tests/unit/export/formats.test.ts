import { describe, expect, it } from 'vitest'
import { readCsv } from '#shared/bins'
import { RESULT_CAUTION, bandsToCsv, bandsToJson, bandsToLatex, latexMeasurement, latexNumber, latexText, matrixToCsv } from '#shared/export'
import { makeBands } from '#shared/physics/uncertainty/band'
import { handMadeResult } from './result'

describe('bandsToCsv', () => {
  const text = bandsToCsv(handMadeResult())
  const comments = text.split('\r\n').filter(l => l.startsWith('#'))
  const { records } = readCsv(text, { comment: '#' })

  it('starts with the provenance and the caution as comment lines', () => {
    expect(comments).toContain('# set: Bramble-H version 1.2 (hessian-pairs, family Bramble)')
    expect(comments).toContain('# prescription: Hessian pairs, asymmetric; 68% CL (set published at 90% CL, rescaled)')
    expect(comments).toContain('# kernel: dy-mass (Drell–Yan dσ/dM); constants: sqrtSGeV=13000, alphaEm=0.0072973525643')
    expect(comments).toContain('# run by: ana@example.org at 2025-03-01T09:30:00.000Z')
    expect(comments).toContain('# result version: 3; approved by owner@example.org at 2025-03-02T10:00:00.000Z')
    expect(comments).toContain(`# caution: ${RESULT_CAUTION}`)
  })

  it('writes one line per bin with kinematics and every band, full precision', () => {
    expect(records[0]!.fields).toEqual(['mMin', 'mMax', 'note',
      'central[hessian-asym]', 'plus[hessian-asym]', 'minus[hessian-asym]', 'rel_plus_pct[hessian-asym]', 'rel_minus_pct[hessian-asym]',
      'central[hessian-sym]', 'plus[hessian-sym]', 'minus[hessian-sym]', 'rel_plus_pct[hessian-sym]', 'rel_minus_pct[hessian-sym]'])
    expect(records).toHaveLength(4)
    const first = records[1]!.fields
    expect(first.slice(0, 6)).toEqual(['200', '300', 'low, "edge"', '1.23456', '0.01234', '0.0156'])
    expect(Number(first[6])).toBeCloseTo((100 * 0.01234) / 1.23456, 12)
    expect(records[3]!.fields[3]).toBe('0.00001234')
  })

  it('refuses bands that do not match the bins', () => {
    const bad = handMadeResult()
    bad.bands[1]!.band.minus = [0.1]
    expect(() => bandsToCsv(bad)).toThrow('Band hessian-sym has 1 minus values for 3 bins')
  })
})

describe('bandsToJson', () => {
  it('carries a provenance object, the caution and per-bin values by band id', () => {
    const json = JSON.parse(JSON.stringify(bandsToJson(handMadeResult())))
    expect(json.provenance).toMatchObject({ resultVersion: 3, ranAt: '2025-03-01T09:30:00.000Z', approval: { state: 'approved', at: '2025-03-02T10:00:00.000Z' }, kernel: { id: 'dy-mass' } })
    expect(json.caution).toBe(RESULT_CAUTION)
    expect(json.bins[1]).toMatchObject({ index: 2, kinematics: { mMin: 300, mMax: 500, note: null }, values: { 'hessian-sym': { central: 0.0996123, plus: 0.0065, minus: 0.0065 } } })
  })
})

describe('LaTeX', () => {
  it.each([
    [1.23456, 0.01234, 0.0156, '$1.235^{+0.012}_{-0.016}$'],
    [0.0996123, 0.00996, 0.0031, '$0.0996^{+0.0100}_{-0.0031}$'], // one decimal place for both errors
    [16.95, 1.04, 0.97, '$17.0 \\pm 1.0$'], // was the uneven 16.95^{+1.0}_{-0.97}
    [1.234e-5, 2.1e-7, 1.9e-7, '$(1.234^{+0.021}_{-0.019})\\times 10^{-5}$'],
    [1.23456, 0.014, 0.014, '$1.235 \\pm 0.014$'],
    [3.14159, 0, 0, '$3.142$']
  ])('latexMeasurement(%d, %d, %d) → %s', (c, p, m, tex) => {
    expect(latexMeasurement(c, p, m)).toBe(tex)
  })

  it('escapes text and writes symbols as math', () => {
    expect(latexText('Q² [GeV²] 5% & a_b #1 $')).toBe('Q$^{2}$ [GeV$^{2}$] 5\\% \\& a\\_b \\#1 \\$')
    expect(latexText('GeV⁻²')).toBe('GeV$^{-2}$')
    // <, > and | have no glyph in the default text font: they go to math mode
    expect(latexText('|y| < 2.5 (x below 0.99)')).toBe('$|$y$|$ $<$ 2.5 (x below 0.99)')
    expect(latexText('Q² ≥ 4')).toBe('Q$^{2}$ $\\geq$ 4')
    expect(latexText('√s = 13 TeV')).toBe('$\\sqrt{s}$ = 13 TeV')
    expect(latexText('dσ/dM, σ² — x·y')).toBe('d$\\sigma$/dM, $\\sigma^{2}$ --- x$\\cdot$y')
    expect(latexNumber(1e4)).toBe('10000')
    expect(latexNumber(1e-7)).toBe('$10^{-7}$')
    expect(latexNumber(2.5e7)).toBe('$2.5\\times10^{7}$')
    expect(latexNumber(null)).toBe('--')
  })

  it('writes a booktabs table with the provenance block and a caption note', () => {
    const tex = bandsToLatex(handMadeResult(), { bands: ['hessian-asym'], label: 'tab:dy' })
    const lines = tex.split('\n')
    expect(lines[0]).toBe('% Sheaf export: LaTeX table of bands')
    expect(lines).toContain('% run by: ana@example.org at 2025-03-01T09:30:00.000Z')
    expect(lines).toContain('  \\begin{tabular}{cccr}')
    expect(lines).toContain('    $M_{\\min}$ [GeV] & $M_{\\max}$ [GeV] & note & $\\mathrm{d}\\sigma/\\mathrm{d}M$ [pb/GeV] \\\\')
    expect(lines).toContain('    200 & 300 & low, "edge" & $1.235^{+0.012}_{-0.016}$ \\\\')
    expect(lines).toContain('    500 & 10000 & -- & $(1.234^{+0.021}_{-0.019})\\times 10^{-5}$ \\\\')
    expect(tex).toContain('\\toprule')
    expect(tex).toContain('\\bottomrule')
    const caption = lines.find(l => l.startsWith('  \\caption{'))!
    expect(caption).toContain('$\\mathrm{d}\\sigma/\\mathrm{d}M$: Hessian, asymmetric.')
    expect(caption).toContain('Set Bramble-H version 1.2 (hessian-pairs, family Bramble); 68\\% CL (set published at 90\\% CL, rescaled).')
    expect(caption).toContain('Result version 3, approved by owner@example.org')
    expect(caption).toContain('PDF uncertainty only, not the full theory uncertainty.')
    expect(lines).toContain('  \\label{tab:dy}')
  })

  it('keeps column heads short: one head over the bands, a letter per band explained in the caption', () => {
    const tex = bandsToLatex(handMadeResult())
    const lines = tex.split('\n')
    expect(lines).toContain('     &  &  & \\multicolumn{2}{c}{$\\mathrm{d}\\sigma/\\mathrm{d}M$ [pb/GeV]} \\\\')
    expect(lines).toContain('    $M_{\\min}$ [GeV] & $M_{\\max}$ [GeV] & note & (a) & (b) \\\\')
    expect(tex).toContain('Columns (a) Hessian, asymmetric; (b) Hessian, symmetric.')
    const head = lines.filter(l => l.includes('\\\\') && !l.includes('$1.') && !l.includes('$0.') && !l.includes('10^{-5}'))
    for (const l of head) expect(l.replace(/\$[^$]*\$/g, 'X').length).toBeLessThan(60)
  })

  it('writes a long table as a longtable that repeats its head on every page', () => {
    const r = handMadeResult()
    const n = 200
    r.bins = Array.from({ length: n }, (_, i) => ({ mMin: 100 + i, mMax: 101 + i, note: null }))
    r.bands = r.bands.map(b => ({ ...b, band: makeBands(Array(n).fill(2), Array(n).fill(0.1), Array(n).fill(0.1)) }))
    const tex = bandsToLatex(r)
    expect(tex).toContain('\\begin{longtable}{cccrr}')
    expect(tex).toContain('\\endhead')
    expect(tex).not.toContain('\\begin{table}')
    expect(tex).toContain('% needs \\usepackage{booktabs} and \\usepackage{longtable}')
    expect(tex).toContain('% caution: ')
    expect(tex.split('\n').filter(l => l.includes('$2.00 \\pm 0.10$'))).toHaveLength(n)
  })

  it('writes μ_F as one math subscript', () => {
    expect(latexText('μ_F/μ = 0.5, 1, 2')).toBe('$\\mu_{F}$/$\\mu$ = 0.5, 1, 2')
    expect(latexText('a_b')).toBe('a\\_b')
  })

  it('marks a draft as not reviewed and refuses an unknown band', () => {
    const draft = handMadeResult()
    draft.provenance.approval = { state: 'draft' }
    expect(bandsToLatex(draft)).toContain('Result version 3, draft, not reviewed.')
    expect(() => bandsToLatex(draft, { bands: ['replicas'] })).toThrow("The result has no band 'replicas'; it has hessian-asym, hessian-sym")
  })
})

describe('matrixToCsv', () => {
  const { provenance, observable } = handMadeResult()
  it('writes a labelled square matrix with provenance and unit', () => {
    const text = matrixToCsv({ provenance, observable, kind: 'covariance', values: [[4e-4, -1e-5], [-1e-5, 9e-6]] })
    expect(text).toContain('# Sheaf export: covariance matrix between bins [(pb/GeV)²]')
    expect(readCsv(text, { comment: '#' }).records.map(r => r.fields)).toEqual([['bin', 'bin 1', 'bin 2'], ['bin 1', '0.0004', '-0.00001'], ['bin 2', '-0.00001', '0.000009']])
  })
  it('refuses a non-square matrix, wrong labels, and correlations beyond ±1', () => {
    expect(() => matrixToCsv({ provenance, observable, kind: 'covariance', values: [[1, 2], [3]] })).toThrow('row 2 has 1 entries for 2 bins')
    expect(() => matrixToCsv({ provenance, observable, kind: 'correlation', values: [[1]], labels: ['a', 'b'] })).toThrow('2 bin labels for a 1 × 1 correlation matrix')
    expect(() => matrixToCsv({ provenance, observable, kind: 'correlation', values: [[1, 1.2], [1.2, 1]] })).toThrow('Correlation between bins 1 and 2 is 1.2')
  })
})
