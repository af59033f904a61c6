import { parse as csvParse } from 'csv-parse/sync'
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { exportBinsCsv } from '#shared/bins'
import { RESULT_CAUTION, bandsToCsv, csvLine, csvNumber, matrixToCsv, writeCsv } from '#shared/export'
import type { CsvCell } from '#shared/export'
import { bandToJson, makeBands } from '#shared/physics/uncertainty/band'
import { handMadeResult } from './result'

// The rules under test are RFC 4180 (CRLF line ends, quoting of fields holding a comma, quote,
// CR or LF, quotes doubled) and Sheaf's own rules documented in shared/export/csv.ts.

/**
 * Reads CSV text with papaparse, skipping '#' comment lines, as a reader of an export would. The
 * text ends with a line end, which papaparse reads as one more, empty record: that one is dropped.
 */
const papaRecords = (text: string) => {
  const out = Papa.parse<string[]>(text, { delimiter: ',', comments: '#', newline: '\r\n' })
  expect(out.errors).toEqual([])
  expect(out.data.at(-1)).toEqual([''])
  return out.data.slice(0, -1)
}

/** The same with csv-parse, a second independent reader, told to skip blank lines. */
const csvParseRecords = (text: string): string[][] => csvParse(text, { comment: '#', relax_column_count: true, skip_empty_lines: true })

describe('csvLine: quoting (RFC 4180)', () => {
  it.each<[CsvCell, string]>([
    ['plain', 'plain'],
    ['a,b', '"a,b"'],
    ['say "hi"', '"say ""hi"""'],
    ['"', '""""'],
    ['two\nlines', '"two\nlines"'],
    ['two\r\nlines', '"two\r\nlines"'],
    ['carriage\rreturn', '"carriage\rreturn"'],
    [' padded', '" padded"'],
    ['tab\t', '"tab\t"'],
    ['#not a comment', '"#not a comment"'],
    ['a#b', 'a#b'],
    ['', ''],
    [true, 'true']
  ])('%j → %j', (cell, field) => {
    // a second field, so that an empty field is not the record's only one
    expect(csvLine([cell, 'x'])).toBe(`${field},x`)
  })

  it('quotes a record whose only field is empty, so it is not read as a blank line', () => {
    expect(csvLine([''])).toBe('""')
    expect(csvLine([null])).toBe('""')
    expect(csvParseRecords(writeCsv([['h'], [null], ['v']]))).toEqual([['h'], [''], ['v']])
  })
})

describe('writeCsv: line ends and comment lines', () => {
  const text = writeCsv([['a', 'b'], ['x\ny', 1], [2, 3]], { comments: ['provenance: one, two', 'multi\nline', ''] })

  it('ends every line, the last one included, with CRLF', () => {
    expect(text.endsWith('\r\n')).toBe(true)
    // outside the quoted field, every LF follows a CR
    const outsideQuotes = text.replace(/"[^"]*"/g, '')
    expect(outsideQuotes).not.toMatch(/[^\r]\n/)
    expect(outsideQuotes).not.toMatch(/\r[^\n]/)
  })

  it('writes comments first, one "# " line per line, "#" for an empty one', () => {
    expect(text.split('\r\n').slice(0, 4)).toEqual(['# provenance: one, two', '# multi', '# line', '#'])
  })

  it('writes an empty text for no records and no comments', () => {
    expect(writeCsv([])).toBe('')
  })
})

describe('numbers and non-finite values', () => {
  it('writes NaN, ±∞, null and undefined as empty fields, never as "NaN" or "Infinity"', () => {
    const text = writeCsv([[Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, null, undefined, 1]])
    expect(text).toBe(',,,,,1\r\n')
    expect(text).not.toMatch(/NaN|Infinity/)
  })

  it('writes the shortest decimal that reads back as the same double', () => {
    expect(csvNumber(0.1 + 0.2)).toBe('0.30000000000000004')
    expect(csvNumber(0.1)).toBe('0.1')
    expect(csvNumber(-0)).toBe('0')
    expect(csvNumber(1e-7)).toBe('1e-7')
    expect(csvNumber(0.00001234)).toBe('0.00001234')
    for (const x of [1 / 3, -2 / 7, 1e-7, 1.5e300, 5e-324, Number.MAX_VALUE, 123456789.125, -1e21]) {
      expect(Number(csvNumber(x))).toBe(x)
    }
  })
})

describe('round trip through real CSV readers', () => {
  const records: CsvCell[][] = [
    ['label', 'value', 'note'],
    ['a,b', 1 / 3, 'say "hi"'],
    [' lead', -1e-7, 'two\r\nlines'],
    ['#hash', 0, 'lf\nonly'],
    ['', 42, 'cr\ronly']
  ]
  const text = writeCsv(records, { comments: ['kernel: dy; constants: a=1, b=2', 'caution: "leading order"'] })
  const expected = records.map(r => r.map(v => (typeof v === 'number' ? String(v) : String(v ?? ''))))

  it('papaparse reads back every field exactly', () => {
    expect(papaRecords(text)).toEqual(expected)
  })

  it('csv-parse reads back every field exactly', () => {
    expect(csvParseRecords(text)).toEqual(expected)
  })
})

describe('bands export', () => {
  it('keeps provenance and caution as "#" lines a reader skips, and ends lines with CRLF', () => {
    const text = bandsToCsv(handMadeResult())
    const lines = text.split('\r\n')
    expect(lines.at(-1)).toBe('')
    expect(lines[0]).toBe('# Sheaf export: bands')
    expect(lines).toContain(`# caution: ${RESULT_CAUTION}`)
    const data = papaRecords(text)
    expect(data).toHaveLength(4)
    expect(data[0]![0]).toBe('mMin')
    expect(data[1]!.slice(0, 3)).toEqual(['200', '300', 'low, "edge"'])
    expect(csvParseRecords(text)).toEqual(data)
  })

  it('leaves relative errors empty where the central value is zero, in either band form', () => {
    const result = handMadeResult()
    result.bins = [{ mMin: 200, mMax: 300, note: null }, { mMin: 300, mMax: 500, note: null }]
    const engine = makeBands([0, 2], [1, 0.5], [1, 0.25])
    result.bands = [{ id: 'e', label: 'engine form', band: engine }, { id: 'j', label: 'JSON form', band: bandToJson(engine) }]
    const text = bandsToCsv(result)
    expect(text).not.toMatch(/NaN|Infinity|null/)
    const [header, zero, two] = papaRecords(text)
    const cell = (row: string[], name: string) => row[header!.indexOf(name)]
    for (const id of ['e', 'j']) {
      expect([cell(zero!, `rel_plus_pct[${id}]`), cell(zero!, `rel_minus_pct[${id}]`)]).toEqual(['', ''])
      // 100 · 0.5 / |2| and 100 · 0.25 / |2|
      expect([cell(two!, `rel_plus_pct[${id}]`), cell(two!, `rel_minus_pct[${id}]`)]).toEqual(['25', '12.5'])
    }
  })
})

describe('matrix export', () => {
  const { provenance, observable } = handMadeResult()

  it('writes an undefined correlation (a bin with zero variance) as an empty cell and says so', () => {
    const text = matrixToCsv({ provenance, observable, kind: 'correlation', values: [[1, Number.NaN], [Number.NaN, Number.NaN]] })
    expect(text).not.toContain('NaN')
    expect(text).toContain('# an empty cell has no finite value (a bin whose variance is zero has no correlation)\r\n')
    expect(papaRecords(text)).toEqual([['bin', 'bin 1', 'bin 2'], ['bin 1', '1', ''], ['bin 2', '', '']])
  })

  it('adds no such line when every cell is finite', () => {
    expect(matrixToCsv({ provenance, observable, kind: 'correlation', values: [[1, 0.5], [0.5, 1]] })).not.toContain('empty cell')
  })
})

describe('bins export', () => {
  const columns = [
    { key: 'xMin', label: 'x min', kind: 'range-lo' as const },
    { key: 'note', label: 'note', kind: 'text' as const }
  ]

  it('uses the same writer: CRLF, quoting, comments, empty cells', () => {
    const text = exportBinsCsv([{ xMin: 0.1, note: 'a, "b"' }, { xMin: null, note: '#1' }], columns, { comments: ['bins of study A'] })
    expect(text).toBe('# bins of study A\r\nxMin,note\r\n0.1,"a, ""b"""\r\n,"#1"\r\n')
    expect(papaRecords(text)).toEqual([['xMin', 'note'], ['0.1', 'a, "b"'], ['', '#1']])
  })
})
