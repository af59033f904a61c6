import { describe, expect, it } from 'vitest'
import { lineColumn, locateJsonError, parseJsonText } from '../../../scripts/cli/json-text'

// Where each syntax error sits follows from the JSON grammar (RFC 8259 §2–§7) by hand.
describe('locateJsonError', () => {
  it.each([
    ['trailing comma in an array', '[1,2,]', 5, "unexpected \"]\" where a value was expected"],
    ['missing value after a colon', '{"a": 1,\n "b": }', 15, 'unexpected "}" where a value was expected'],
    ['missing colon', '{"a" 1}', 5, "unexpected \"1\" where ':' was expected"],
    ['unquoted property name', '{a: 1}', 1, 'unexpected "a" where a property name in double quotes was expected'],
    ['line break inside a string', '{"a":"x\ny"}', 7, 'a control character (such as a line break) inside a string'],
    ['end of file inside an object', '{"a": 1', 7, "the file ends where ',' or '}' was expected"],
    ['empty file', '', 0, 'the file ends where a value was expected'],
    ['two documents', '{} {}', 3, 'unexpected text after the end of the document'],
    ['leading zero', '[01]', 2, "unexpected \"1\" where ',' or ']' was expected"],
    ['bare minus sign', '[-]', 1, 'unexpected "-" where a value was expected']
  ])('%s', (_, text, offset, what) => {
    expect(() => JSON.parse(text)).toThrow()
    expect(locateJsonError(text)).toEqual({ offset, what })
  })

  it.each(['{"a": [1, -2.5e-3, true, false, null, "\\u00e9\\n"]}', ' [ ] ', '0'])('accepts valid JSON %s', (text) => {
    expect(locateJsonError(text).offset).toBe(-1)
  })
})

describe('parseJsonText', () => {
  it('names the file, line and column', () => {
    expect(() => parseJsonText('{\n  "a": 1,\n  "b": }\n', 'study.json'))
      .toThrow('study.json: not valid JSON at line 3, column 8: unexpected "}" where a value was expected')
  })

  it('counts columns from 1 after the last line break', () => {
    expect(lineColumn('ab\ncd', 4)).toEqual({ line: 2, column: 2 })
    expect(lineColumn('ab', 0)).toEqual({ line: 1, column: 1 })
  })
})
