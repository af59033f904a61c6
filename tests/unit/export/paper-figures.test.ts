import { describe, expect, it } from 'vitest'
import { axisRange, bandFigure, crc32, decadeText, FIGURE_WIDTHS_CM, figureSizePt, logTicks, paperFigure, pngTextChunks, pngWithText, svgWithMetadata, wrapTitle } from '#shared/export/figures'

const band = (central: number[]) => ({ central, plus: central.map(c => c / 10), minus: central.map(c => c / 10), relPlus: central.map(() => 0.1), relMinus: central.map(() => 0.1) })
const provenance = { title: 'Study A: dσ/dM [pb/GeV]', lines: ['set: Bramble-H 1.2 (Hessian pairs)', 'prescription: Hessian, asymmetric; 68 % CL'], caution: 'Leading-order prediction; PDF uncertainty only.' }

describe('log axes name their decades', () => {
  it('labels every decade in full and never a bare mantissa', () => {
    expect(decadeText(-3)).toBe('10⁻³')
    expect(decadeText(0)).toBe('1')
    expect(decadeText(12)).toBe('10¹²')
    const wide = logTicks(1e-4, 0.5)
    expect(wide.ticktext).toEqual(['10⁻⁴', '10⁻³', '10⁻²', '10⁻¹'])
    // under two decades, 2× and 5× ticks carry their decade: "2×10⁻³", not "2"
    const narrow = logTicks(1.5e-3, 3e-2)
    expect(narrow.ticktext).toEqual(['2×10⁻³', '5×10⁻³', '10⁻²', '2×10⁻²'])
    expect(narrow.tickvals).toEqual([0.002, 0.005, 0.01, 0.02])
  })

  it('puts a floor under a log observable axis and honours given limits', () => {
    const r = axisRange({ label: 'σ', log: true }, [1e-9, 1, 10], { floorRatio: 1e-4 })
    // the floor: 1e-4 of the highest value, not the 1e-9 of a band touching zero
    expect((r.range as number[])[0]).toBeGreaterThan(-4.5)
    expect(axisRange({ label: 'σ', range: [0, 5] }, [1, 2])).toMatchObject({ range: [0, 5] })
  })
})

describe('a second bin variable', () => {
  it('draws each group as its own curve in its own colour, bins keeping their own index', () => {
    const fig = bandFigure({
      positions: { lo: [0.01, 0.1, 0.01, 0.1] }, variable: { label: 'x', log: true }, observable: { label: 'F₂' },
      series: [{ id: 'a', label: 'A', band: band([1, 2, 3, 4]) }],
      groups: [{ label: 'Q² = 10 GeV²', indices: [0, 1] }, { label: 'Q² = 100 GeV²', indices: [2, 3] }]
    })
    const areas = fig.data.filter(t => t.fill === 'toself')
    expect(areas.map(t => t.name)).toEqual(['Q² = 10 GeV²', 'Q² = 100 GeV²'])
    expect(new Set(areas.map(t => (t.line as { color: string }).color)).size).toBe(2)
    const lines = fig.data.filter(t => t.customdata)
    expect(lines.map(t => (t.customdata as number[][]).map(c => c[3]))).toEqual([[0, 1], [2, 3]])
    // within a group the line runs left to right: no zig-zag between groups
    for (const t of lines) expect((t.x as number[]).filter(v => v !== null)).toEqual([0.01, 0.1])
  })
})

describe('figures for a paper', () => {
  it('sizes a one-column figure at 8.6 cm in pt with the legend outside and the footer under it', () => {
    const settings = { widthCm: FIGURE_WIDTHS_CM.single, aspect: 4 / 3, fontPt: 8, legend: 'below' as const, footer: true, dpi: 300 }
    expect(figureSizePt(settings)).toEqual({ width: 244, height: 183 })
    const fig = paperFigure(bandFigure({ positions: { lo: [1, 2] }, variable: { label: 'M', unit: 'GeV' }, observable: { label: 'dσ/dM', unit: 'pb/GeV' }, series: [{ id: 'a', label: 'A', band: band([1, 2]) }], note: '68 % CL' }), settings, provenance)
    expect(fig.layout).toMatchObject({ width: 244, height: 183, font: { size: 8 }, legend: { orientation: 'h', yref: 'container' } })
    const footer = fig.layout.title as { text: string, y: number, yref: string, yanchor: string }
    // the footer at the image's bottom edge, the legend on top of it
    expect(footer).toMatchObject({ yref: 'container', yanchor: 'top' })
    expect(footer.y).toBeLessThan(0.25)
    expect((fig.layout.legend as { y: number }).y).toBeGreaterThan(0)
    expect(footer.text.replace(/<br>/g, ' ')).toContain('Leading-order prediction; PDF uncertainty only.')
    for (const line of footer.text.split('<br>')) expect(line.length).toBeLessThanOrEqual(Math.floor(244 / (8 * 0.55)))
  })

  it('wraps a long note above the frame and makes room for its lines, on the page and on paper', () => {
    const note = 'Hessian pairs, symmetric (Hessian at the set\'s 68 % CL) / Replicas, mean ± standard deviation (replica standard deviation at the set\'s 68 % CL), 68 % CL'
    const input = { positions: { lo: [1, 2] }, variable: { label: 'x' }, observable: { label: 'F₂' }, series: [{ id: 'a', label: 'A', band: band([1, 2]) }] }
    const short = bandFigure({ ...input, note: '68 % CL' })
    const long = bandFigure({ ...input, note })
    const text = (f: typeof long) => String((f.layout.annotations as Array<{ text: string }>)[0]!.text)
    expect(text(long).split('<br>').length).toBe(2)
    expect(text(long).replace(/<br>/g, ' ')).toBe(note)
    const top = (f: typeof long) => (f.layout.margin as { t: number }).t
    expect(top(long)).toBeGreaterThan(top(short))
    const settings = { widthCm: FIGURE_WIDTHS_CM.single, aspect: 4 / 3, fontPt: 8, legend: 'below' as const, footer: false, dpi: 300 }
    const paper = paperFigure(long, settings)
    const lines = text(paper).split('<br>')
    // 8.6 cm is 244 pt: at 7 pt about 57 characters a line
    for (const line of lines) expect(line.length).toBeLessThanOrEqual(Math.floor(244 * 0.9 / (7 * 0.55)))
    expect(lines.length).toBeGreaterThan(2)
    expect(top(paper)).toBeGreaterThan(top(paperFigure(short, settings)))
  })

  it('wraps a long title at spaces', () => {
    expect(wrapTitle('W charge asymmetry (W⁺ − W⁻)/(W⁺ + W⁻) of dσ/dy', 20)).toBe('W charge asymmetry<br>(W⁺ − W⁻)/(W⁺ + W⁻)<br>of dσ/dy')
  })

  it('writes the provenance into SVG title, desc and Dublin Core metadata', () => {
    const svg = svgWithMetadata('<svg xmlns="http://www.w3.org/2000/svg" width="10"><g/></svg>', provenance)
    expect(svg).toMatch(/^<svg [^>]*><title>Study A: dσ\/dM \[pb\/GeV\]<\/title><desc>/)
    expect(svg).toContain('caution: Leading-order prediction; PDF uncertainty only.</desc>')
    expect(svg).toContain('<dc:creator>Sheaf</dc:creator>')
  })

  it('adds tEXt and iTXt chunks after IHDR with valid CRCs', () => {
    // CRC-32 check value of "123456789" (ISO 3309 / PNG specification, Annex D): 0xcbf43926
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926)
    const png = Uint8Array.from(atob('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg=='), c => c.charCodeAt(0))
    const tagged = pngWithText(png, { Description: 'set: μ-set, dσ/dM', Disclaimer: provenance.caution })
    const chunks = pngTextChunks(tagged)
    expect(chunks).toEqual([
      { type: 'tEXt', key: 'Description', text: 'set: mu-set, dsigma/dM' },
      { type: 'iTXt', key: 'Description', text: 'set: μ-set, dσ/dM' },
      { type: 'tEXt', key: 'Disclaimer', text: provenance.caution },
      { type: 'iTXt', key: 'Disclaimer', text: provenance.caution }
    ])
    // every chunk's CRC covers its type and data
    const view = new DataView(tagged.buffer)
    for (let at = 8; at < tagged.length;) {
      const length = view.getUint32(at)
      expect(view.getUint32(at + 8 + length)).toBe(crc32(tagged.subarray(at + 4, at + 8 + length)))
      at += 12 + length
    }
  })
})
