import { describe, expect, it } from 'vitest'
import { describeFailure, UsageError } from '../../../scripts/cli/errors'
import { toCsv, toJson } from '../../../scripts/cli/output'
import { oneLine, sheaf } from './run'

describe('sheaf (top level)', () => {
  it('prints the verbs for --help and exits 0', async () => {
    const run = await sheaf(['--help'])
    expect(run.code).toBe(0)
    expect(run.stdout).toMatch(/^Usage: npm run -s sheaf -- <verb>/)
    for (const verb of ['evolve', 'members', 'compute', 'bands']) expect(run.stdout).toMatch(new RegExp(`\\n  ${verb} +\\S`))
  })

  it('prints the help but exits 2 without a verb', async () => {
    const run = await sheaf([])
    expect(run.code).toBe(2)
    expect(run.stdout).toMatch(/^Usage:/)
  })

  it('refuses an unknown verb with one line and exit 2', async () => {
    const run = await sheaf(['fit', 'x.json'])
    expect(run.code).toBe(2)
    expect(oneLine(run)).toMatch(/^sheaf: unknown verb 'fit'; the verbs are /)
  })

  it.each(['evolve', 'members', 'compute', 'bands'])('%s --help describes the verb', async (verb) => {
    const run = await sheaf([verb, '--help'])
    expect(run.code).toBe(0)
    expect(run.stdout.startsWith(`Usage: sheaf ${verb} `)).toBe(true)
    expect(run.stderr).toBe('')
  })
})

describe('failures', () => {
  it('keep only the first line of a message and never a stack', () => {
    const error = new RangeError('first line\n    at somewhere (file.ts:1:1)')
    expect(describeFailure(error)).toEqual({ code: 1, message: 'first line' })
    expect(describeFailure(new UsageError('bad option'))).toEqual({ code: 2, message: 'bad option' })
    expect(describeFailure('thrown text')).toEqual({ code: 1, message: 'thrown text' })
  })
})

describe('output', () => {
  it('writes typed arrays as arrays, number rows on one line and NaN as null', () => {
    expect(toJson({ v: new Float64Array([1, Number.NaN]), rows: [{ a: 1, b: 'x' }] }))
      .toBe('{\n  "v": [1, null],\n  "rows": [\n    { "a": 1, "b": "x" }\n  ]\n}\n')
  })

  it('quotes CSV cells that need it (RFC 4180), ends lines with CRLF and leaves non-finite numbers empty', () => {
    expect(toCsv(['a', 'b'], [['x,y', Number.POSITIVE_INFINITY], ['say "hi"', 0.1]])).toBe('a,b\r\n"x,y",\r\n"say ""hi""",0.1\r\n')
  })
})
