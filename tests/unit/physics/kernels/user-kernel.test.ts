import { describe, expect, it } from 'vitest'
import {
  ExpressionError, buildUserKernel, compileExpression, d2SigmaDMDyDrellYan, drellYanPairs, evaluateTerm, f2NeutralCurrent
} from '../../../../shared/physics/kernels'
import type { XfFunction } from '../../../../shared/physics/kernels'

// The user-defined kernel is checked against the built-in kernels it can reproduce (F₂ and
// Drell–Yan, PDG "Structure functions" and Ellis–Stirling–Webber ch. 9), and its expression
// parser against inputs that must never run.

const table: Record<number, number> = { 2: 0.5, 1: 0.3, [-2]: 0.1, [-1]: 0.12, 3: 0.06, [-3]: 0.06, 21: 2 }
const xf: XfFunction = (pdg, x) => (table[pdg] ?? 0) * (1 - x) ** 2

describe('safe expressions', () => {
  it.each([
    ['1 / (x * q2)', { x: 0.1, q2: 10 }, 1],
    ['2x^2 + sqrt(q2)', { x: 0.5, q2: 16 }, 4.5],
    ['exp(-x) * log(q2) / pi', { x: 0, q2: Math.E }, 1 / Math.PI],
    ['max(x, q2) - min(x, q2) + abs(-3)', { x: 1, q2: 5 }, 7]
  ])('%s evaluates', (source, vars, expected) => {
    expect(compileExpression(source, ['x', 'q2']).evaluate(vars)).toBeCloseTo(expected, 14)
  })

  it.each([
    ['import("fs")', 8, 'strings are not allowed'],
    ['import(x)', 1, '"import" is not an allowed function'],
    ['evaluate("1+1")', 10, 'strings are not allowed'],
    ['evaluate(x)', 1, '"evaluate" is not an allowed function'],
    ['parse(x)', 1, '"parse" is not an allowed function'],
    ['x = 3', 3, 'assignment is not allowed'],
    ['f(t) = t^2', 6, 'assignment is not allowed'],
    ['x.constructor', 2, 'property access is not allowed'],
    ['[1, 2]', 1, 'matrices and objects are not allowed'],
    ['{a: 1}', 1, 'matrices and objects are not allowed'],
    ['x; 2', 2, 'only one expression'],
    ['x > 1 ? 1 : 0', 3, 'not allowed'],
    ['cube(x)', 1, '"cube" is not an allowed function'],
    ['x * unknown', 5, 'unknown name "unknown"'],
    ['2 +* x', 4, 'syntax error'],
    ['sin(x', 6, 'syntax error'],
    ['', 1, 'empty']
  ])('%s is refused at column %i', (source, column, text) => {
    let error: unknown
    try {
      compileExpression(source, ['x', 'q2'])
    } catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(ExpressionError)
    expect((error as ExpressionError).column).toBe(column)
    expect((error as Error).message).toContain(text)
    expect((error as Error).message).toMatch(/^column \d+: /)
  })

  it('a non-finite value at some point is a RangeError naming the variables', () => {
    const e = compileExpression('log(x - 0.5)', ['x'])
    expect(() => e.evaluate({ x: 0.2 })).toThrow('x = 0.2')
  })
})

describe('user-defined kernels', () => {
  it('DIS-like: weights e_q² on quarks and antiquarks times 1 reproduce F₂', () => {
    const weights = [1, 2, 3].flatMap(q => [q, -q].map(a => ({ a, w: q === 2 ? 4 / 9 : 1 / 9 })))
    const k = buildUserKernel({ mode: 'dis', expression: '1', weights })
    expect(evaluateTerm(k.term({ x: 0.1, q2: 20 }), xf)).toBeCloseTo(f2NeutralCurrent(xf, 0.1, 20), 14)
  })

  it('hadronic: Drell–Yan pairs times 8πα²(ħc)²/(9 m³) reproduce the built-in Drell–Yan kernel', () => {
    const weights = drellYanPairs().map(p => ({ a: p.a, b: p.b, w: p.w }))
    const k = buildUserKernel({ mode: 'hadron', expression: '8 * pi * alpha^2 * hbarc2 / (9 * m^3)', weights, sqrtSGeV: 7000 })
    expect(evaluateTerm(k.term({ m: 40, y: 0.7 }), xf)).toBeCloseTo(d2SigmaDMDyDrellYan(xf, 40, 0.7, { sqrtSGeV: 7000 }), 10)
  })

  it.each([
    ['a hadronic row without b', { mode: 'hadron' as const, expression: '1', weights: [{ a: 2, w: 1 }], sqrtSGeV: 100 }, 'weights row 1, column b'],
    ['a DIS row with b', { mode: 'dis' as const, expression: '1', weights: [{ a: 2, w: 1 }, { a: 1, b: 2, w: 1 }] }, 'weights row 2, column b'],
    ['y without √s in the DIS mode', { mode: 'dis' as const, expression: 'y', weights: [{ a: 2, w: 1 }] }, 'unknown name "y"']
  ])('refuses %s', (_n, options, text) => {
    expect(() => buildUserKernel(options)).toThrow(text)
  })
})
