import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { parseCorrelationMatrix, parseMeasurementPoints } from '#shared/measurements/csv'

const sample = (name: string) => readFileSync(fileURLToPath(new URL(`../../../samples/measurements/${name}`, import.meta.url)), 'utf8')

/** The issues as [line, column, message] triples, the shape every check below compares. */
const located = (issues: Array<{ line?: number, column?: number, message: string }>) => issues.map(i => [i.line, i.column, i.message])

describe('parseMeasurementPoints: good files', () => {
  it('reads value, stat, syst and named shift columns, in any order and any case, skipping comments', () => {
    const { data, issues } = parseMeasurementPoints('# two bins\nbin,Value,stat,syst,shift: Lumi\n1,10.5,0.5,1,-0.2\n2,4,0.25,0.5,0.1\n')
    expect(issues).toEqual([])
    expect(data).toEqual({ values: [10.5, 4], stat: [0.5, 0.25], syst: [1, 0.5], sources: [{ name: 'Lumi', shifts: [-0.2, 0.1] }] })
  })

  it('leaves absent error columns null', () => {
    const { data, issues } = parseMeasurementPoints('value,stat\n1,0.1\n')
    expect(issues).toEqual([])
    expect(data).toEqual({ values: [1], stat: [0.1], syst: null, sources: [] })
  })

  it('reads the same data with a byte-order mark, CRLF line ends, and with or without a last line end', () => {
    const expected = parseMeasurementPoints('value,stat\n1,0.1\n2,0.2\n').data
    for (const text of ['\uFEFFvalue,stat\r\n1,0.1\r\n2,0.2\r\n', 'value,stat\r\n1,0.1\r\n2,0.2', 'value,stat\n1,0.1\n2,0.2\n\n']) {
      expect(parseMeasurementPoints(text)).toEqual({ data: expected, issues: [] })
    }
  })

  it('reads the sample pseudo-data: 15 bins, stat and syst, the first line as written in the file', () => {
    const { data, issues } = parseMeasurementPoints(sample('drell-yan-high-mass-pseudodata.csv'))
    expect(issues).toEqual([])
    expect(data.values).toHaveLength(15)
    expect(data.stat).toHaveLength(15)
    expect(data.syst).toHaveLength(15)
    expect([data.values[0], data.stat![0], data.syst![0]]).toEqual([15.49, 0.06639, 0.5395])
  })
})

describe('parseMeasurementPoints: bad input, located by line and column', () => {
  it('names the line of a row with a wrong number of fields, and the first extra field', () => {
    expect(located(parseMeasurementPoints('value,stat\n1\n').issues)).toEqual([[2, undefined, 'Expected 2 fields as in the header (line 1), found 1']])
    expect(located(parseMeasurementPoints('value,stat\n1,0.1,7\n').issues)).toEqual([[2, 3, 'Expected 2 fields as in the header (line 1), found 3']])
  })

  it('names the cell that is not a number, is empty, or is not finite', () => {
    const { data, issues } = parseMeasurementPoints('value,stat,syst\n1,abc,0.1\n2,,0.1\nNaN,0.1,Infinity\n4,-inf,1e999\n')
    expect(data.values).toEqual([])
    expect(located(issues)).toEqual([
      [2, 2, 'stat: "abc" is not a number'],
      [3, 2, 'stat: the cell is empty; expected a number'],
      [4, 1, 'value: "NaN" is not a finite number'],
      [4, 3, 'syst: "Infinity" is not a finite number'],
      [5, 2, 'stat: "-inf" is not a finite number'],
      [5, 3, 'syst: "1e999" is too large for a double-precision number']
    ])
  })

  it('refuses negative stat and syst errors but keeps the sign of a shift', () => {
    expect(located(parseMeasurementPoints('value,stat,syst\n1,-0.1,0.1\n2,0.1,-2e-3\n').issues)).toEqual([
      [2, 2, 'stat: an error is a magnitude and must be ≥ 0 (found -0.1)'],
      [3, 3, 'syst: an error is a magnitude and must be ≥ 0 (found -0.002)']
    ])
    expect(parseMeasurementPoints('value,shift:jes\n1,-0.1\n').issues).toEqual([])
  })

  it('refuses a point whose every error is 0', () => {
    expect(located(parseMeasurementPoints('value,stat,shift:a\n1,0.1,0\n2,0,0\n').issues))
      .toEqual([[3, 2, 'Point 2 has no error: every error column is 0, so χ² cannot weigh it']])
  })

  it('refuses duplicate, unnamed and unknown header columns, naming their column', () => {
    expect(located(parseMeasurementPoints('value,stat,VALUE\n1,2,3\n').issues)).toEqual([[1, 3, 'Column "VALUE" appears twice (columns 1 and 3)']])
    expect(located(parseMeasurementPoints('value,shift:lumi,shift: LUMI\n1,2,3\n').issues)).toEqual([[1, 3, 'Column "shift: LUMI" appears twice (columns 2 and 3)']])
    expect(located(parseMeasurementPoints('value,,stat\n1,2,3\n').issues)).toEqual([[1, 2, 'Column 2 has no name: use value, stat, syst, bin or shift:<name>']])
    expect(located(parseMeasurementPoints('value,stat,shift:\n1,2,3\n').issues)).toEqual([[1, 3, 'Column "shift:" needs a source name after "shift:", e.g. shift:luminosity']])
    expect(located(parseMeasurementPoints('value,sigma\n1,2\n').issues)).toEqual([
      [1, 2, 'Unknown column "sigma": use value, stat, syst, bin or shift:<name>'],
      [1, undefined, 'The header needs at least one error column: stat, syst or shift:<name>']
    ])
  })

  it('asks for a value column, an error column and at least one point', () => {
    expect(located(parseMeasurementPoints('stat\n0.1\n').issues)).toEqual([[1, undefined, 'The header needs a "value" column']])
    expect(located(parseMeasurementPoints('value,stat\n').issues)).toEqual([[1, undefined, 'No points after the header line']])
    expect(located(parseMeasurementPoints('# only a comment\n').issues)).toEqual([[undefined, undefined, 'The file is empty: expected a header line and one line per bin']])
  })

  it('wants bins counted 1, 2, 3 … when a bin column is given', () => {
    expect(located(parseMeasurementPoints('bin,value,stat\n1,5,1\n3,5,1\n').issues)).toEqual([[3, 1, 'bin: expected bin 2 here (points come in bin order), found 3']])
  })

  it('reports a CSV syntax problem with its line and character', () => {
    expect(located(parseMeasurementPoints('value,stat\r\n1,0"1\r\n').issues)).toEqual([
      [2, undefined, 'quote inside an unquoted field; quote the whole field and double the quote (character 4 of the line)']
    ])
    expect(parseMeasurementPoints('value,stat\n1,0"1\n').issues[0]!.file).toBe('points')
  })
})

describe('parseCorrelationMatrix: good input', () => {
  it('reads a CSV matrix without a header, with comments, BOM and CRLF', () => {
    expect(parseCorrelationMatrix('\uFEFF# rho\r\n1,0.5\r\n0.5,1\r\n', 2)).toEqual({ matrix: [[1, 0.5], [0.5, 1]], issues: [] })
  })

  it('reads a JSON array of rows', () => {
    expect(parseCorrelationMatrix('[[1, -0.25], [-0.25, 1]]', 2)).toEqual({ matrix: [[1, -0.25], [-0.25, 1]], issues: [] })
  })

  it('reads the sample 15 × 15 correlation of the sample pseudo-data', () => {
    const { matrix, issues } = parseCorrelationMatrix(sample('drell-yan-high-mass-correlation.csv'), 15)
    expect(issues).toEqual([])
    expect(matrix).toHaveLength(15)
    expect(matrix[0]!.slice(0, 3)).toEqual([1, 0.8299, 0.7081])
  })
})

describe('parseCorrelationMatrix: bad input, located by line and column', () => {
  const ok3 = ['1,0.2,0.1', '0.2,1,0.2', '0.1,0.2,1']

  it('counts rows and entries against the number of points', () => {
    expect(located(parseCorrelationMatrix([...ok3, '0,0,1'].join('\n'), 3).issues)).toEqual([[4, undefined, 'The correlation matrix has 4 rows but the measurement has 3 points']])
    expect(located(parseCorrelationMatrix('1,0.2\n0.2,1\n', 3).issues)[0]).toEqual([undefined, undefined, 'The correlation matrix has 2 rows but the measurement has 3 points'])
    expect(located(parseCorrelationMatrix('1,0.2,0.1\n0.2,1\n0.1,0.2,1,0\n', 3).issues)).toEqual([
      [2, undefined, 'Expected 3 entries in this row, found 2'],
      [3, 4, 'Expected 3 entries in this row, found 4']
    ])
  })

  it('names entries that are not numbers, not finite, or outside [−1, 1]', () => {
    expect(located(parseCorrelationMatrix('1,x\nNaN,1.5\n', 2).issues)).toEqual([
      [1, 2, '"x" is not a number'],
      [2, 1, '"NaN" is not a finite number'],
      [2, 2, 'A correlation lies in [−1, 1]; found 1.5']
    ])
    expect(located(parseCorrelationMatrix('[[1, null], [0, 1]]', 2).issues)).toEqual([[1, 2, 'null is not a number']])
  })

  it('wants a unit diagonal and a symmetric matrix', () => {
    expect(located(parseCorrelationMatrix('1,0.2\n0.2,0.9\n', 2).issues)).toEqual([[2, 2, 'The diagonal must be 1; found 0.9']])
    expect(located(parseCorrelationMatrix('# rho\n1,0.2,0.1\n0.3,1,0.2\n0.1,0.2,1\n', 3).issues))
      .toEqual([[3, 1, 'The matrix must be symmetric: entry (2, 1) is 0.3 but (1, 2) is 0.2']])
  })

  // Sylvester's criterion: a symmetric matrix is positive definite if and only if all its leading
  // principal minors are positive (Horn & Johnson, Matrix Analysis, 2nd ed., Theorem 7.2.5; from memory).
  it('refuses a matrix that is not positive definite, naming the first row that breaks it', () => {
    // Leading minors: 1, 1 − 0.81 = 0.19, and det = 0.19 − 0.9·0.81 + 0.1·0.71 = −0.468 < 0.
    const indefinite = '1,0.9,0.1\n0.9,1,0.9\n0.1,0.9,1\n'
    expect(located(parseCorrelationMatrix(indefinite, 3).issues)).toEqual([[3, 3,
      'The correlation matrix is not positive definite: row 3 cannot hold together with rows 1 to 2 (no set of errors has these correlations; for a fully correlated source use a shift:<name> column)']])
    // ρ = 1 between two points: the 2 × 2 minor is 0, singular.
    expect(located(parseCorrelationMatrix('[[1, 1], [1, 1]]', 2).issues)[0]!.slice(0, 2)).toEqual([2, 2])
  })

  it('says a first line of names is a header the matrix must not have', () => {
    expect(located(parseCorrelationMatrix('bin1,bin2\n1,0\n0,1\n', 2).issues))
      .toEqual([[1, 1, 'This line looks like a header: the correlation matrix is N × N numbers without a header line']])
  })

  it('refuses JSON that is not an array of rows, and invalid JSON', () => {
    expect(located(parseCorrelationMatrix('[1, 2]', 2).issues)).toEqual([[undefined, undefined, 'The JSON correlation matrix must be an array of rows (arrays of numbers)']])
    const bad = parseCorrelationMatrix('[[1, 0],\n [0, 1]', 2).issues
    expect(bad).toHaveLength(1)
    expect(bad[0]!.message).toMatch(/^The correlation matrix is not valid JSON/)
    expect(bad[0]!.file).toBe('correlation')
    // Node's JSON.parse names the offset here (the end of the text): line 2, column 8.
    expect([bad[0]!.line, bad[0]!.column]).toEqual([2, 8])
  })

  it('reports a CSV syntax problem with its line and character', () => {
    expect(located(parseCorrelationMatrix('1,0\n0,"1\n', 2).issues)).toEqual([[2, undefined, 'quoted field is never closed (character 3 of the line)']])
  })
})
