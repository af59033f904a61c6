import { describe, expect, it } from 'vitest'
import { findJsonProblem, storableJson, storableString, unstorableCharacter, unstorableMessage } from '../../../shared/utils/storable'

// What PostgreSQL cannot store (a NUL) and what is not Unicode text (a lone UTF-16 surrogate)
// are found and located; well-formed text, surrogate pairs included, passes.

describe('unstorable characters', () => {
  it.each([
    ['plain', null],
    ['quark 🙂 gluon', null],
    ['a\u0000b', { index: 1, what: 'a NUL character (U+0000)' }],
    ['ab\uD800', { index: 2, what: 'a lone UTF-16 surrogate (U+D800)' }],
    ['\uDC00ab', { index: 0, what: 'a lone UTF-16 surrogate (U+DC00)' }],
    ['🙂\uDBFFx', { index: 2, what: 'a lone UTF-16 surrogate (U+DBFF)' }]
  ])('%j', (text, expected) => {
    expect(unstorableCharacter(text)).toEqual(expected)
  })

  it('locates by line and column in a text of several lines', () => {
    expect(unstorableMessage('value,stat\n1,0.1\n2,\u0000')).toBe('holds a NUL character (U+0000) at line 3, column 3; remove it')
    expect(unstorableMessage('name\u0000')).toBe('holds a NUL character (U+0000) at character 5; remove it')
  })

  it('storableString refuses them as a field error and keeps the other checks', () => {
    const schema = storableString().trim().max(5)
    expect(schema.safeParse('ok').success).toBe(true)
    expect(schema.safeParse('o\u0000k').error?.issues[0]?.message).toMatch(/^The text holds a NUL character/)
    expect(schema.safeParse('too long here').error?.issues[0]?.message).toMatch(/<=5/)
  })
})

describe('JSON documents', () => {
  it.each([
    [{ bins: [{ x: 0.1 }, { label: 'a\u0000' }] }, ['bins', 1, 'label'], 'NUL'],
    [{ 'k\uD800': 1 }, [], 'The key "k\\ud800" holds a lone UTF-16 surrogate'],
    [{ options: { sqrtSGeV: Number.POSITIVE_INFINITY } }, ['options', 'sqrtSGeV'], 'too large']
  ])('finds the problem in %j', (value, path, text) => {
    const problem = findJsonProblem(value)
    expect(problem?.path).toEqual(path)
    expect(problem?.message).toContain(text)
  })

  it('refuses nesting deeper than the limit at the level where it passes it', () => {
    expect(findJsonProblem([[1]], 2)).toBeNull()
    expect(findJsonProblem([[[1]]], 2)).toEqual({ path: [0, 0], message: 'The document nests deeper than 2 levels' })
  })

  it('walks a hostile depth without overflowing the stack', () => {
    let deep: unknown = 1
    for (let i = 0; i < 200_000; i++) deep = [deep]
    expect(findJsonProblem(deep)?.message).toBe('The document nests deeper than 64 levels')
  })

  it('storableJson reports at the path inside the field', () => {
    const r = storableJson().safeParse({ a: [1, 'x\u0000'] })
    expect(r.error?.issues[0]?.path).toEqual(['a', 1])
    expect(findJsonProblem({ a: [1, 'fine', null, true] })).toBeNull()
  })
})
