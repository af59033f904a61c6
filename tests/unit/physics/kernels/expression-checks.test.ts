import { describe, expect, it } from 'vitest'
import { ExpressionError, buildUserKernel, compileExpression } from '../../../../shared/physics/kernels'

// Names every JavaScript object inherits must not pass the whitelist, and a call with the wrong
// number of arguments must be refused while checking, naming the function and its count.

function refusal(source: string, variables = ['x', 'q2']) {
  try {
    compileExpression(source, variables)
  } catch (e) {
    return e as ExpressionError
  }
  throw new Error(`${source} was accepted`)
}

describe('inherited names are unknown names', () => {
  it.each([
    ['constructor', 1, 'unknown name "constructor"'],
    ['x * toString', 5, 'unknown name "toString"'],
    ['__proto__', 1, 'unknown name "__proto__"'],
    ['hasOwnProperty + 1', 1, 'unknown name "hasOwnProperty"'],
    ['valueOf(x)', 1, '"valueOf" is not an allowed function'],
    ['constructor(x)', 1, '"constructor" is not an allowed function']
  ])('%s is refused at column %i', (source, column, text) => {
    const e = refusal(source)
    expect(e).toBeInstanceOf(ExpressionError)
    expect(e.column).toBe(column)
    expect(e.message).toContain(text)
  })

  it('a user kernel with an inherited name is refused by name, not by a crash', () => {
    expect(() => buildUserKernel({ mode: 'dis', expression: 'x * constructor', weights: [{ a: 2, w: 1 }] })).toThrow('unknown name "constructor"')
  })
})

describe('argument counts', () => {
  it.each([
    ['sin(x, q2)', 1, 'sin takes 1 argument, not 2'],
    ['x + sqrt()', 5, 'sqrt takes 1 argument, not 0'],
    ['log(x, 2, 3)', 1, 'log takes 1 or 2 arguments, not 3'],
    ['atan2(x)', 1, 'atan2 takes 2 arguments, not 1'],
    ['pow(x)', 1, 'pow takes 2 arguments, not 1'],
    ['min()', 1, 'min takes at least 1 argument, not 0'],
    ['cbrt(x, 1)', 1, 'cbrt takes 1 argument, not 2'],
    // The third call of sin is the wrong one: the column points at it.
    ['sin(x) + sin(sin(x, q2))', 14, 'sin takes 1 argument, not 2']
  ])('%s is refused at column %i', (source, column, text) => {
    const e = refusal(source)
    expect(e).toBeInstanceOf(ExpressionError)
    expect(e.column).toBe(column)
    expect(e.message).toBe(`column ${column}: ${text}`)
  })

  it.each([
    // log(8, 2) = 3 (8 = 2³); max of one number is that number; atan2(1, 1) = π/4.
    ['log(x, 2)', { x: 8, q2: 1 }, 3],
    ['max(x)', { x: 0.25, q2: 1 }, 0.25],
    ['atan2(x, q2) * 4', { x: 1, q2: 1 }, Math.PI]
  ])('%s with the right count evaluates', (source, vars, expected) => {
    expect(compileExpression(source, ['x', 'q2']).evaluate(vars)).toBeCloseTo(expected, 14)
  })
})
