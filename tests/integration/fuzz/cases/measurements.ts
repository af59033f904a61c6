// Bad measurement uploads, as JSON and as multipart: broken cells, header lines and point counts
// of the points CSV, correlation matrices, names and the correlationOf choice.
import fc from 'fast-check'
import { badText, overlong, withUnstorable, words } from '../bad-values'
import { POINTS_CSV, sendForm, sendJson, type Attempt, type Part, type Target } from '../harness'

const lines = POINTS_CSV.trimEnd().split('\n')

/** The points CSV with the cell at (1-based) line and column replaced. */
const withCell = (line: number, column: number, text: string) =>
  lines.map((l, i) => (i + 1 === line ? l.split(',').map((c, j) => (j + 1 === column ? text : c)).join(',') : l)).join('\n')

/** What a cell may not hold: not a number, not finite, or empty. */
const BAD_CELLS = ['abc', 'nan', 'inf', '-Infinity', '1e999', '', '0x1F', '1.2.3', '--1', '1 2']

interface Upload { name?: unknown, csv?: unknown, correlation?: unknown, correlationOf?: unknown }
interface Broken { what: string, upload: Upload, where: string }

const good: Upload = { name: 'Fuzz measurement', csv: POINTS_CSV }

/** One broken part of a valid upload and the place the answer must name. */
const broken: fc.Arbitrary<Broken> = fc.oneof(
  fc.tuple(fc.integer({ min: 2, max: lines.length }), fc.integer({ min: 1, max: 3 }), fc.constantFrom(...BAD_CELLS))
    .map(([line, column, cell]) => ({ what: `cell ${JSON.stringify(cell)} at line ${line}, column ${column}`, upload: { ...good, csv: withCell(line, column, cell) }, where: `line ${line}` })),
  fc.tuple(fc.integer({ min: 1, max: 3 }), fc.constantFrom('colour', '', 'value', 'shift:'))
    .filter(([column, name]) => !(column === 1 && name === 'value'))
    .map(([column, name]) => ({ what: `header column ${column} named ${JSON.stringify(name)}`, upload: { ...good, csv: withCell(1, column, name) }, where: 'line 1' })),
  withUnstorable(fc.constant(POINTS_CSV)).map(csv => ({ what: 'a NUL or lone surrogate in the CSV', upload: { ...good, csv }, where: 'csv' })),
  fc.integer({ min: 1, max: lines.length - 2 }).map(drop => ({ what: `${drop} point(s) too few`, upload: { ...good, csv: lines.slice(0, lines.length - drop).join('\n') }, where: 'points' })),
  fc.integer({ min: 1, max: 4 }).map(extra => ({ what: `${extra} point(s) too many`, upload: { ...good, csv: [...lines, ...Array(extra).fill('0.6,0.01,0.02')].join('\n') }, where: 'points' })),
  fc.constantFrom<unknown>('', 42, null).map(csv => ({ what: `csv ${JSON.stringify(csv)}`, upload: { ...good, csv }, where: 'csv' })),
  badText(200).map(name => ({ what: `name ${JSON.stringify(name).slice(0, 40)}`, upload: { ...good, name }, where: 'name' })),
  fc.constantFrom<unknown>(
    [[1]], [[1, 0.5, 0], [0.2, 1, 0], [0, 0, 1]], [[1, 2, 0], [2, 1, 0], [0, 0, 1]], 'abc', '1,0\n0,1', '[[1,0,0],[0,1,0]]'
  ).map(correlation => ({ what: `correlation ${JSON.stringify(correlation)}`, upload: { ...good, correlation }, where: 'correlation' })),
  withUnstorable(fc.constant('1,0,0\n0,1,0\n0,0,1')).map(correlation => ({ what: 'a NUL or lone surrogate in the correlation', upload: { ...good, correlation }, where: 'correlation' })),
  fc.constantFrom<unknown>('both', 'SYST', 1).map(correlationOf => ({ what: `correlationOf ${JSON.stringify(correlationOf)}`, upload: { ...good, correlationOf }, where: 'correlationOf' }))
)

export function measurementJson(t: Target): fc.Arbitrary<Attempt> {
  const path = `${t.base}/studies/${t.studyId}/measurements`
  return fc.oneof(
    broken,
    words.map(key => ({ what: `unknown field ${key}`, upload: { ...good, [key]: 1 } as Upload, where: key })),
    fc.constant<Broken>({ what: 'a correlation with a text cell', upload: { ...good, correlation: [[1, 0, 0], [0, 1, 'a'], [0, 0, 1]] }, where: 'correlation' })
  ).map(b => ({ describe: `measurement (JSON) with ${b.what}`, where: b.where, send: () => sendJson(t.ws.analyst.client, 'POST', path, b.upload) }))
}

export function measurementForms(t: Target): fc.Arbitrary<Attempt> {
  const path = `${t.base}/studies/${t.studyId}/measurements`
  const asForm = (u: Upload): Part[] => [
    ...(typeof u.csv === 'string' && u.csv !== '' ? [{ name: 'points', filename: 'points.csv', data: u.csv }] : []),
    ...(typeof u.name === 'string' ? [{ name: 'name', data: u.name }] : []),
    ...(typeof u.correlation === 'string' ? [{ name: 'correlation', filename: 'correlation.csv', data: u.correlation }] : []),
    ...(typeof u.correlationOf === 'string' ? [{ name: 'correlationOf', data: u.correlationOf }] : [])
  ]
  // Only what multipart can carry: text files and text fields, none of them empty (an empty
  // field counts as absent), and no lone surrogate (UTF-8 cannot encode one: it would arrive as
  // U+FFFD, a character like any other).
  const sendable = broken.filter(b => [b.upload.csv, b.upload.name, b.upload.correlation, b.upload.correlationOf]
    .every(v => v === undefined || (typeof v === 'string' && v.trim() !== '' && !/[\uD800-\uDFFF]/.test(v))))
  return fc.oneof(
    sendable.map(b => ({ describe: `measurement (multipart) with ${b.what}`, where: b.where, send: () => sendForm(t.ws.analyst.client, path, asForm(b.upload)) })),
    overlong(200).map(name => ({ describe: `measurement (multipart) from a file named with ${name.length} characters`, where: 'name', send: () => sendForm(t.ws.analyst.client, path, [{ name: 'points', filename: `${name}.csv`, data: POINTS_CSV }]) })),
    fc.constant<Attempt>({ describe: 'measurement (multipart) without a points file', where: null, send: () => sendForm(t.ws.analyst.client, path, [{ name: 'name', data: 'no points' }]) })
  )
}
