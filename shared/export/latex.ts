import { columnHeader } from '../bins/grid'
import { RESULT_CAUTION_SHORT } from './caution'
import { checkResult } from './bands'
import { roundMeasurement } from './numbers'
import type { RoundingOptions } from './numbers'
import { approvalText, confidenceText, provenanceLines, setText } from './provenance'
import type { ResultForExport } from './types'

const SPECIALS: Record<string, string> = {
  '\\': '\\textbackslash{}', '{': '\\{', '}': '\\}', '$': '\\$', '&': '\\&', '#': '\\#',
  '^': '\\textasciicircum{}', '_': '\\_', '%': '\\%', '~': '\\textasciitilde{}'
}
// Symbols that appear in kinematic labels and units; written as math so any LaTeX setup prints them.
const SYMBOLS: Record<string, string> = {
  '√': '\\sqrt{}', 'σ': '\\sigma', 'μ': '\\mu', 'ν': '\\nu', 'τ': '\\tau', 'α': '\\alpha', 'Δ': '\\Delta',
  'η': '\\eta', '±': '\\pm', '−': '-', '·': '\\cdot', '×': '\\times', '→': '\\to'
}
const SUPERSCRIPTS: Record<string, string> = {
  '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9', '⁻': '-', '⁺': '+'
}
const DASHES: Record<string, string> = { '—': '---', '–': '--' }

/**
 * Plain text made safe for LaTeX text mode: specials escaped, common physics symbols as math,
 * a run of superscript characters as one exponent (GeV⁻² → GeV$^{-2}$).
 */
export function latexText(text: string): string {
  const chars = Array.from(text)
  let out = ''
  let math = '' // pending math, closed when text resumes
  for (let i = 0; i < chars.length; i++) {
    const ch = chars[i]!
    if (SUPERSCRIPTS[ch]) {
      let exponent = ''
      while (i < chars.length && SUPERSCRIPTS[chars[i]!]) exponent += SUPERSCRIPTS[chars[i++]!]
      i--
      math += `^{${exponent}}`
    }
    else if (ch === '√' && /[a-z]/i.test(chars[i + 1] ?? '')) {
      let radicand = ''
      while (i + 1 < chars.length && /[a-z0-9]/i.test(chars[i + 1]!)) radicand += chars[++i]
      math += `\\sqrt{${radicand}}`
    }
    else if (SYMBOLS[ch]) {
      math += `${math && /[a-z}]$/i.test(math) ? ' ' : ''}${SYMBOLS[ch]}`
    }
    else {
      if (math) { out += `$${math}$`; math = '' }
      out += SPECIALS[ch] ?? DASHES[ch] ?? ch
    }
  }
  return math ? `${out}$${math}$` : out
}

/** A kinematic value in a table cell: plain up to 6 significant digits, else a × 10^n form. */
export function latexNumber(value: unknown): string {
  if (value === null || value === undefined || value === '') return '--'
  if (typeof value !== 'number') return latexText(String(value))
  if (!Number.isFinite(value)) return latexText(String(value))
  const magnitude = Math.abs(value)
  if (value === 0 || (magnitude >= 1e-3 && magnitude < 1e6)) return String(Number(value.toPrecision(6)))
  const [mantissa, exp] = value.toExponential(5).split('e') as [string, string]
  const m = String(Number(mantissa))
  return `$${m === '1' ? '' : `${m}\\times`}10^{${Number(exp)}}$`
}

/**
 * A value with asymmetric errors in math mode: `$1.235^{+0.012}_{-0.016}$`, `$1.235 \pm 0.012$`
 * when the rounded errors agree, `$(1.234^{+0.021}_{-0.019})\times 10^{-5}$` for small or large
 * values. Rounding as in {@link roundMeasurement} (common practice).
 */
export function latexMeasurement(central: number, plus: number, minus: number, options?: RoundingOptions): string {
  const r = roundMeasurement(central, plus, minus, options)
  const noErrors = r.plus === '0' && r.minus === '0'
  const body = noErrors ? r.central : r.symmetric ? `${r.central} \\pm ${r.plus}` : `${r.central}^{+${r.plus}}_{-${r.minus}}`
  if (r.exponent === 0) return `$${body}$`
  return noErrors ? `$${body}\\times 10^{${r.exponent}}$` : `$(${body})\\times 10^{${r.exponent}}$`
}

export interface LatexTableOptions {
  /** Band ids to include, in this order; default all. */
  bands?: string[]
  /** Your caption text; the set, prescription, CL, approval and caution are appended. */
  caption?: string
  /** \label{…} of the table. */
  label?: string
  rounding?: RoundingOptions
}

/**
 * A booktabs table (needs \usepackage{booktabs}): one line per bin, the kinematic columns, then
 * the observable with its asymmetric PDF errors for each band. The provenance is a `%` comment
 * block above the table; the caption names the set, prescription, CL and review state and ends
 * with the caution.
 */
export function bandsToLatex(result: ResultForExport, options: LatexTableOptions = {}): string {
  checkResult(result)
  const bands = options.bands
    ? options.bands.map((id) => {
        const band = result.bands.find(b => b.id === id)
        if (!band) throw new RangeError(`The result has no band '${id}'; it has ${result.bands.map(b => b.id).join(', ')}`)
        return band
      })
    : result.bands
  const p = result.provenance
  const obs = result.observable.latex ? `$${result.observable.latex}$` : latexText(result.observable.name)
  const unit = result.observable.unit ? ` [${latexText(result.observable.unit)}]` : ''
  const head = [
    ...result.binColumns.map(c => latexText(columnHeader(c))),
    ...bands.map(b => (bands.length === 1 ? `${obs}${unit}` : `${obs}${unit}, ${latexText(b.label)}`))
  ]
  const body = result.bins.map((bin, i) => [
    ...result.binColumns.map(c => latexNumber(bin[c.key])),
    ...bands.map(({ band }) => latexMeasurement(band.central[i]!, band.plus[i]!, band.minus[i]!, options.rounding))
  ])
  const prescriptions = bands.length === 1 ? latexText(p.prescription) : bands.map(b => latexText(b.label)).join(', ')
  const caption = [
    options.caption ?? `${obs} with its PDF uncertainty.`,
    `PDF set ${latexText(setText(p))}; ${prescriptions}; ${latexText(confidenceText(p))}.`,
    `Result version ${p.resultVersion}, ${latexText(approvalText(p))}.`,
    latexText(RESULT_CAUTION_SHORT)
  ].join(' ')
  return [
    ...provenanceLines(p, result.observable, 'LaTeX table of bands').map(l => `% ${l}`),
    '% needs \\usepackage{booktabs}',
    '\\begin{table}[htbp]',
    '  \\centering',
    `  \\begin{tabular}{${'c'.repeat(head.length)}}`,
    '    \\toprule',
    `    ${head.join(' & ')} \\\\`,
    '    \\midrule',
    ...body.map(cells => `    ${cells.join(' & ')} \\\\`),
    '    \\bottomrule',
    '  \\end{tabular}',
    `  \\caption{${caption}}`,
    ...(options.label ? [`  \\label{${options.label}}`] : []),
    '\\end{table}',
    ''
  ].join('\n')
}
