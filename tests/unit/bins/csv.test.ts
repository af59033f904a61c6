import { describe, expect, it } from 'vitest'
import { csvField, detectDelimiter, readCsv, writeCsv } from '#shared/bins'

// Expected values follow RFC 4180 (section 2, rules 1–7).
describe('readCsv', () => {
  it('reads quoted fields with delimiters, doubled quotes and line breaks, with CRLF', () => {
    const { records, problems } = readCsv('a,"b,c","say ""hi"""\r\n"two\r\nlines",,x\r\n')
    expect(problems).toEqual([])
    expect(records).toEqual([
      { fields: ['a', 'b,c', 'say "hi"'], line: 1 },
      { fields: ['two\r\nlines', '', 'x'], line: 2 }
    ])
  })

  it('accepts LF, lone CR, a BOM, a last line without a line end, and skips blank and comment lines', () => {
    const { records } = readCsv('\uFEFF# made by hand\nh1,h2\r\r\n1,2\r3,4', { comment: '#' })
    expect(records).toEqual([
      { fields: ['h1', 'h2'], line: 2 },
      { fields: ['1', '2'], line: 4 },
      { fields: ['3', '4'], line: 5 }
    ])
  })

  it('keeps an empty trailing field', () => {
    expect(readCsv('a,b,\n').records[0]!.fields).toEqual(['a', 'b', ''])
  })

  it('names line and character of a stray quote, text after a closing quote, and an unclosed quote', () => {
    const { records, problems } = readCsv('h1,h2\n1,ab"c\n"x"y,2\n3,4\n5,"never closed\n6,7\n')
    expect(problems).toEqual([
      { line: 2, column: 5, message: 'quote inside an unquoted field; quote the whole field and double the quote' },
      { line: 3, column: 4, message: "unexpected 'y' after a closing quote; a quoted field must end at a ',' or a line end" },
      { line: 5, column: 3, message: 'quoted field is never closed' }
    ])
    expect(records.map(r => r.line)).toEqual([1, 4])
  })

  it('counts lines inside quoted fields when locating later records', () => {
    const { records, problems } = readCsv('a\n"1\n2\n3"\nb"\n')
    expect(records.map(r => r.line)).toEqual([1, 2])
    expect(problems).toEqual([{ line: 5, column: 2, message: 'quote inside an unquoted field; quote the whole field and double the quote' }])
  })

  it('keeps each line end as written inside a quoted field when a file mixes CRLF, LF and CR', () => {
    const { records, problems } = readCsv('a,"x\r\ny\nz"\r\nb,c\rd,e\n')
    expect(problems).toEqual([])
    expect(records).toEqual([
      { fields: ['a', 'x\r\ny\nz'], line: 1 },
      { fields: ['b', 'c'], line: 4 },
      { fields: ['d', 'e'], line: 5 }
    ])
  })

  it('counts columns in characters, not bytes, and refuses text, spaces included, after a closing quote', () => {
    expect(readCsv('é,"ü"x,3\nok,1\n')).toEqual({
      records: [{ fields: ['ok', '1'], line: 2 }],
      problems: [{ line: 1, column: 6, message: "unexpected 'x' after a closing quote; a quoted field must end at a ',' or a line end" }]
    })
    expect(readCsv('a,b\n"x" ,y\n').problems).toEqual([
      { line: 2, column: 4, message: "unexpected ' ' after a closing quote; a quoted field must end at a ',' or a line end" }
    ])
  })

  it('finds the opening quote of a field never closed even when doubled quotes follow it', () => {
    expect(readCsv('h\n1,"""abc\n2,3\n').problems).toEqual([{ line: 2, column: 3, message: 'quoted field is never closed' }])
    expect(readCsv('h\n1,"ab""\n').problems).toEqual([{ line: 2, column: 3, message: 'quoted field is never closed' }])
  })

  it('takes a comment marker only at the start of a record, and keeps a quoted empty field', () => {
    expect(readCsv('#c\na,b#c\n""\n', { comment: '#' }).records).toEqual([
      { fields: ['a', 'b#c'], line: 2 },
      { fields: [''], line: 3 }
    ])
  })

  it('reads other delimiters and refuses a quote as delimiter', () => {
    expect(readCsv('a;b\n1;2', { delimiter: ';' }).records[1]!.fields).toEqual(['1', '2'])
    expect(() => readCsv('a', { delimiter: '"' })).toThrow(RangeError)
  })

  it('stops after maxProblems', () => {
    expect(readCsv('a"\n'.repeat(100), { maxProblems: 3 }).problems).toHaveLength(3)
  })
})

describe('writeCsv', () => {
  it('quotes only fields that need it and ends every line with CRLF', () => {
    expect(writeCsv([['a', 'b,c', 'say "hi"', ' pad', 1e-7, null, '#x']])).toBe('a,"b,c","say ""hi"""," pad",1e-7,,"#x"\r\n')
  })
  it('writes comment lines first', () => {
    expect(writeCsv([['h']], { comments: ['one', 'two\nthree', ''], eol: '\n' })).toBe('# one\n# two\n# three\n#\nh\n')
  })
  it('round-trips awkward text through readCsv', () => {
    const rows = [['x', 'multi\r\nline', '"quoted"', 'a,b', '', ' lead']]
    expect(readCsv(writeCsv(rows)).records[0]!.fields).toEqual(rows[0])
  })
  it('csvField writes numbers in shortest exact form', () => {
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004')
    expect(Number(csvField(1 / 3))).toBe(1 / 3)
  })
})

describe('detectDelimiter', () => {
  it.each([['a,b,c', ','], ['a;b;c', ';'], ['a\tb', '\t'], ['single', ',']])('%j → %j', (line, d) => {
    expect(detectDelimiter(line)).toBe(d)
  })
})
