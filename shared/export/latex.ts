import { columnHeader } from '../bins/grid'
import { resultCautionShort, varyingDensities, type VaryingDensities } from './caution'
import { checkResult } from './bands'
import { roundMeasurement } from './numbers'
import type { RoundingOptions } from './numbers'
import { approvalText, confidenceText, provenanceLines, secondSetText, setText } from './provenance'
import type { ResultForExport } from './types'

const SPECIALS: Record<string, string> = {
  '\\': '\\textbackslash{}', '{': '\\{', '}': '\\}', '$': '\\$', '&': '\\&', '#': '\\#',
  '^': '\\textasciicircum{}', '_': '\\_', '%': '\\%', '~': '\\textasciitilde{}'
}
// Symbols that appear in kinematic labels and units; written as math so any LaTeX setup prints them.
const SYMBOLS: Record<string, string> = {
  '√': '\\sqrt{}', 'σ': '\\sigma', 'μ': '\\mu', 'ν': '\\nu', 'τ': '\\tau', 'α': '\\alpha', 'Δ': '\\Delta',
  'η': '\\eta', '±': '\\pm', '−': '-', '·': '\\cdot', '×': '\\times', '→': '\\to',
  // LaTeX's default (OT1) text font has no <, > or |: in text mode they print as ¡, ¿ and —
  // (common practice: write them in math mode).
  '<': '<', '>': '>', '|': '|', '≤': '\\leq', '≥': '\\geq'
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
      // A subscript right after a symbol belongs to it: μ_F → $\mu_{F}$, not $\mu$\_F.
      if (chars[i + 1] === '_' && /[a-z0-9]/i.test(chars[i + 2] ?? '')) {
        let sub = ''
        i++
        while (i + 1 < chars.length && /[a-z0-9]/i.test(chars[i + 1]!)) sub += chars[++i]
        math += `_{${sub}}`
      }
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
  /** Tables with more bins than this are written as a `longtable` that breaks across pages; default 30. */
  longAfter?: number
}

/** Short heads of the kinematic columns, as math, with the unit apart. */
const SHORT_HEADS: Record<string, { head: string, unit?: string }> = {
  x: { head: '$x$' }, xMin: { head: '$x_{\\min}$' }, xMax: { head: '$x_{\\max}$' },
  q2: { head: '$Q^{2}$', unit: 'GeV$^{2}$' }, q2Min: { head: '$Q^{2}_{\\min}$', unit: 'GeV$^{2}$' }, q2Max: { head: '$Q^{2}_{\\max}$', unit: 'GeV$^{2}$' },
  y: { head: '$y$' }, yMin: { head: '$y_{\\min}$' }, yMax: { head: '$y_{\\max}$' },
  m: { head: '$M$', unit: 'GeV' }, mMin: { head: '$M_{\\min}$', unit: 'GeV' }, mMax: { head: '$M_{\\max}$', unit: 'GeV' },
  z: { head: '$z$' }, zMin: { head: '$z_{\\min}$' }, zMax: { head: '$z_{\\max}$' },
  sqrtS: { head: '$\\sqrt{s}$', unit: 'GeV' }, sqrtSMin: { head: '$\\sqrt{s}_{\\min}$', unit: 'GeV' }, sqrtSMax: { head: '$\\sqrt{s}_{\\max}$', unit: 'GeV' },
  label: { head: 'bin' }, kFactor: { head: '$K$' }, kFactorError: { head: '$\\delta K$' }
}

/** A kinematic column's head: short, with its unit in brackets on the same line. */
function columnHead(c: ResultForExport['binColumns'][number]): string {
  const short = SHORT_HEADS[c.key]
  if (short) return short.unit ? `${short.head} [${short.unit}]` : short.head
  return latexText(columnHeader(c))
}

/** The letter of the i-th band column in the head and its key: (a), (b) … */
const keyLetter = (i: number) => `(${String.fromCharCode(97 + (i % 26))}${i >= 26 ? Math.floor(i / 26) : ''})`

/** One table of bands, whatever their source (one result, or a study's sets side by side). */
export interface LatexTableInput {
  /** `%` comment lines above the table (provenance and caution). */
  comments: string[]
  observable: ResultForExport['observable']
  binColumns: ResultForExport['binColumns']
  bins: ResultForExport['bins']
  /** Each band column with the key text that explains it (plain text, escaped here). */
  columns: Array<{ key: string, band: ResultForExport['bands'][number]['band'] }>
  /** Caption sentences (LaTeX) after the key; the caution is appended. */
  caption: string[]
  /** Whether K-factors scaled the values (the caution then says they are the user's responsibility). */
  kFactors?: boolean
  /** Whose uncertainty the bands are (the caution names it); parton densities when absent. */
  varies?: VaryingDensities
}

/**
 * A booktabs table (needs \usepackage{booktabs}; a long one also \usepackage{longtable}): one line
 * per bin, the kinematic columns with short heads and their units, then the observable with its
 * asymmetric errors per band. The head names the observable and its unit once, over the band
 * columns; each band column has a short letter explained in the caption's key. Values are rounded
 * by the Particle Data Group's rule ({@link roundMeasurement}).
 */
export function latexTable(input: LatexTableInput, options: Pick<LatexTableOptions, 'label' | 'rounding' | 'longAfter'> = {}): string {
  const obs = input.observable.latex ? `$${input.observable.latex}$` : latexText(input.observable.name)
  const unit = input.observable.unit ? ` [${latexText(input.observable.unit)}]` : ''
  const perBin = input.observable.perBin
  const kinematic = [...input.binColumns.map(columnHead), ...(perBin ? ['quantity'] : [])]
  const bandHeads = input.columns.length === 1 ? [''] : input.columns.map((_, i) => keyLetter(i))
  const width = kinematic.length + input.columns.length
  const first = kinematic.length + 1
  const headLines = input.columns.length === 1
    ? [`${[...kinematic, `${obs}${unit}`].join(' & ')} \\\\`]
    : [
        `${kinematic.map(() => '').join(' & ')} & \\multicolumn{${input.columns.length}}{c}{${obs}${unit}} \\\\`,
        `\\cmidrule(lr){${first}-${width}}`,
        `${[...kinematic, ...bandHeads].join(' & ')} \\\\`
      ]
  const body = input.bins.map((bin, i) => [
    ...input.binColumns.map(c => latexNumber(bin[c.key])),
    ...(perBin ? [latexText(perBin[i] ?? '')] : []),
    ...input.columns.map(({ band }) => latexMeasurement(band.central[i]!, band.plus[i]!, band.minus[i]!, options.rounding))
  ].join(' & ') + ' \\\\')
  const key = input.columns.length === 1
    ? [`${obs}: ${latexText(input.columns[0]!.key)}.`]
    : [`Columns ${input.columns.map((c, i) => `${keyLetter(i)} ${latexText(c.key)}`).join('; ')}.`]
  const rounding = 'Values rounded by the Particle Data Group\'s rule (Review of Particle Physics, Introduction).'
  const caption = [...key, ...input.caption, rounding, latexText(resultCautionShort(Boolean(input.kFactors), input.varies))].join(' ')
  const spec = `${'c'.repeat(kinematic.length)}${'r'.repeat(input.columns.length)}`
  const long = input.bins.length > (options.longAfter ?? 30)
  const label = options.label ? `\\label{${options.label}}` : ''
  if (long) {
    return [
      ...input.comments.map(l => `% ${l}`),
      '% needs \\usepackage{booktabs} and \\usepackage{longtable}',
      `\\begin{longtable}{${spec}}`,
      `  \\caption{${caption}}${label} \\\\`,
      '  \\toprule',
      ...headLines.map(l => `  ${l}`),
      '  \\midrule',
      '  \\endfirsthead',
      `  \\multicolumn{${width}}{l}{\\emph{(continued)}} \\\\`,
      '  \\toprule',
      ...headLines.map(l => `  ${l}`),
      '  \\midrule',
      '  \\endhead',
      '  \\midrule',
      `  \\multicolumn{${width}}{r}{\\emph{continued on the next page}} \\\\`,
      '  \\endfoot',
      '  \\bottomrule',
      '  \\endlastfoot',
      ...body.map(l => `  ${l}`),
      '\\end{longtable}',
      ''
    ].join('\n')
  }
  return [
    ...input.comments.map(l => `% ${l}`),
    '% needs \\usepackage{booktabs}',
    '\\begin{table}[htbp]',
    '  \\centering',
    `  \\begin{tabular}{${spec}}`,
    '    \\toprule',
    ...headLines.map(l => `    ${l}`),
    '    \\midrule',
    ...body.map(l => `    ${l}`),
    '    \\bottomrule',
    '  \\end{tabular}',
    `  \\caption{${caption}}`,
    ...(label ? [`  ${label}`] : []),
    '\\end{table}',
    ''
  ].join('\n')
}

/**
 * One result's bands as a LaTeX table ({@link latexTable}): the provenance is a `%` comment block
 * above the table; the caption names the set, prescription, CL and review state and ends with
 * the caution.
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
  return latexTable({
    comments: provenanceLines(p, result.observable, 'LaTeX table of bands'),
    observable: result.observable,
    binColumns: result.binColumns,
    bins: result.bins,
    columns: bands.map(b => ({ key: b.label, band: b.band })),
    kFactors: Boolean(p.kFactors),
    varies: varyingDensities(p.kernel.id, p.secondSet?.variation),
    caption: [
      ...(options.caption ? [options.caption] : []),
      `Set ${latexText(setText(p))}; ${latexText(confidenceText(p))}.`,
      ...(p.secondSet ? [`Second set ${latexText(secondSetText(p.secondSet))}.`] : []),
      `Result version ${p.resultVersion}, ${latexText(approvalText(p))}.`
    ]
  }, options)
}
