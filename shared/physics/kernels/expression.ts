import type { FactoryFunctionMap, MathNode } from 'mathjs'
import {
  absDependencies, acosDependencies, addDependencies, asinDependencies, atan2Dependencies, atanDependencies,
  cbrtDependencies, coshDependencies, cosDependencies, create, divideDependencies, expDependencies,
  log10Dependencies, log2Dependencies, logDependencies, maxDependencies, minDependencies, multiplyDependencies,
  parseDependencies, powDependencies, sinDependencies, sinhDependencies, sqrtDependencies, subtractDependencies,
  tanDependencies, tanhDependencies, unaryMinusDependencies, unaryPlusDependencies
} from 'mathjs'
import { ALPHA_EM, GF_GEV2, HBARC2_PB_GEV2, MH_GEV, MW_GEV, MZ_GEV, PROTON_MASS_GEV } from '../constants'

/**
 * Safe arithmetic expressions in kinematic variables for user-defined kernels, parsed by a
 * restricted mathjs instance. Three layers keep an expression from doing anything but
 * arithmetic: (1) a scanner admits only numbers, names, + − * / ^ ( ) , and whitespace, and only
 * the whitelisted names below; (2) mathjs parses the text and every node of the tree must be a
 * number, an allowed name, an arithmetic operator, parentheses or a call of an allowed function
 * (assignments, function definitions, accessors, matrices, objects, conditions are refused);
 * (3) the instance is built from the dependencies of the parser and the whitelisted functions
 * only, and its import, createUnit, evaluate, parse, compile, simplify, derivative and resolve
 * are replaced by functions that throw (the mathjs "security" recipe). No eval/Function.
 * Names are looked up as own entries of the tables only, so a word every JavaScript object
 * inherits (constructor, toString, __proto__) is an unknown name like any other; every call is
 * checked against its function's argument count before anything is evaluated.
 */

/**
 * How many arguments each allowed function takes: [fewest, most]. log(x) is the natural
 * logarithm, log(x, b) the logarithm to base b; min and max take one or more.
 */
const ARITY: ReadonlyMap<string, readonly [number, number]> = new Map([
  ['sqrt', [1, 1]], ['cbrt', [1, 1]], ['exp', [1, 1]], ['log', [1, 2]], ['log10', [1, 1]], ['log2', [1, 1]],
  ['sin', [1, 1]], ['cos', [1, 1]], ['tan', [1, 1]], ['asin', [1, 1]], ['acos', [1, 1]], ['atan', [1, 1]],
  ['atan2', [2, 2]], ['sinh', [1, 1]], ['cosh', [1, 1]], ['tanh', [1, 1]], ['abs', [1, 1]], ['pow', [2, 2]],
  ['min', [1, Infinity]], ['max', [1, Infinity]]
])

/** Functions an expression may call (elementary functions of real arguments). */
export const EXPRESSION_FUNCTIONS: readonly string[] = Object.freeze([...ARITY.keys()])

/** "1 argument", "1 or 2 arguments", "at least 1 argument". */
function expectedCount([fewest, most]: readonly [number, number]): string {
  const unit = (n: number) => `${n} argument${n === 1 ? '' : 's'}`
  if (most === Infinity) return `at least ${unit(fewest)}`
  return fewest === most ? unit(fewest) : `${fewest} or ${unit(most)}`
}

/**
 * Named constants an expression may use, in natural units (GeV): pi, alpha (α(0)), GF (GeV⁻²),
 * MZ, MW, MH, mp (GeV), hbarc2 ((ħc)² in pb GeV², to turn GeV⁻² into pb). Values: constants.ts.
 * Look names up with isConstant (own entries only), never with `in`.
 */
export const EXPRESSION_CONSTANTS: Readonly<Record<string, number>> = Object.freeze({
  pi: Math.PI,
  alpha: ALPHA_EM,
  GF: GF_GEV2,
  MZ: MZ_GEV,
  MW: MW_GEV,
  MH: MH_GEV,
  mp: PROTON_MASS_GEV,
  hbarc2: HBARC2_PB_GEV2
})

/** Whether `name` is one of EXPRESSION_CONSTANTS (not a property every object inherits). */
const isConstant = (name: string) => Object.hasOwn(EXPRESSION_CONSTANTS, name)

/** A parse or evaluation failure of an expression, with the 1-based column where it was found. */
export class ExpressionError extends RangeError {
  readonly column: number
  constructor(message: string, column: number) {
    super(`column ${column}: ${message}`)
    this.name = 'ExpressionError'
    this.column = column
  }
}

/** A checked, compiled expression. */
export interface CompiledExpression {
  source: string
  /** The variables (not constants) the expression uses. */
  uses: readonly string[]
  /** Value for the given variables (a finite number), else RangeError. */
  evaluate(variables: Readonly<Record<string, number>>): number
}

interface Restricted {
  parse: (text: string) => MathNode
}

let restricted: Restricted | undefined

function instance(): Restricted {
  if (restricted) return restricted
  const factories = {
    parseDependencies, addDependencies, subtractDependencies, multiplyDependencies, divideDependencies, powDependencies,
    unaryMinusDependencies, unaryPlusDependencies, sqrtDependencies, cbrtDependencies, expDependencies, logDependencies,
    log10Dependencies, log2Dependencies, sinDependencies, cosDependencies, tanDependencies, asinDependencies,
    acosDependencies, atanDependencies, atan2Dependencies, sinhDependencies, coshDependencies, tanhDependencies,
    absDependencies, minDependencies, maxDependencies
  } as unknown as FactoryFunctionMap
  const math = create(factories, { predictable: true })
  const parse = math.parse.bind(math) as (text: string) => MathNode
  const disabled = (name: string) => () => {
    throw new Error(`function ${name} is disabled in Sheaf expressions`)
  }
  math.import({
    import: disabled('import'),
    createUnit: disabled('createUnit'),
    evaluate: disabled('evaluate'),
    parse: disabled('parse'),
    compile: disabled('compile'),
    simplify: disabled('simplify'),
    derivative: disabled('derivative'),
    resolve: disabled('resolve')
  }, { override: true })
  restricted = { parse }
  return restricted
}

const ALLOWED_OPERATORS = new Set(['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus'])

function rejectCharacters(source: string): void {
  for (let i = 0; i < source.length; i++) {
    const c = source[i]!
    if (/[A-Za-z0-9_ \t+\-*/^(),]/.test(c)) continue
    // A decimal point is fine inside a number (a digit on either side of it).
    if (c === '.' && (/\d/.test(source[i + 1] ?? '') || /\d/.test(source[i - 1] ?? '')) && !/[A-Za-z_]/.test(source[i + 1] ?? '')) continue
    const why = c === '=' ? ' (assignment is not allowed)'
      : c === '"' || c === '\'' || c === '`' ? ' (strings are not allowed)'
        : c === '[' || c === ']' || c === '{' || c === '}' ? ' (matrices and objects are not allowed)'
          : c === '.' ? ' (property access is not allowed)'
            : c === ';' ? ' (only one expression is allowed)'
              : ''
    throw new ExpressionError(`character "${c}" is not allowed${why}; use numbers, names, + − * / ^ ( ) and ,`, i + 1)
  }
}

/** Checks the characters and names of `source`; the 1-based columns of its calls, by function name, in order. */
function scan(source: string, variables: ReadonlySet<string>): Map<string, number[]> {
  rejectCharacters(source)
  const calls = new Map<string, number[]>()
  const number = /^(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?/
  const name = /^[A-Za-z_][A-Za-z0-9_]*/
  let i = 0
  while (i < source.length) {
    const rest = source.slice(i)
    const num = number.exec(rest)
    if (num) {
      i += num[0].length
      continue
    }
    const id = name.exec(rest)
    if (id) {
      const word = id[0]
      const after = source.slice(i + word.length).trimStart()
      if (after.startsWith('(')) {
        if (!ARITY.has(word)) {
          throw new ExpressionError(`"${word}" is not an allowed function; allowed: ${EXPRESSION_FUNCTIONS.join(', ')}`, i + 1)
        }
        calls.set(word, [...calls.get(word) ?? [], i + 1])
      } else if (!variables.has(word) && !isConstant(word)) {
        throw new ExpressionError(`unknown name "${word}"; allowed variables: ${[...variables].join(', ')}; constants: ${Object.keys(EXPRESSION_CONSTANTS).join(', ')}`, i + 1)
      }
      i += word.length
      continue
    }
    i++
  }
  return calls
}

/**
 * Checks every node of the parsed tree; `calls` (from scan) gives the column of each call for
 * the argument-count message. The tree is walked depth first, left to right, which meets the
 * calls of one function in the order their names appear in the text.
 */
function checkTree(root: MathNode, variables: ReadonlySet<string>, calls: ReadonlyMap<string, readonly number[]>): void {
  const seen = new Map<string, number>()
  root.traverse((node: MathNode, _path: string, parent: MathNode | null) => {
    const n = node as MathNode & { op?: string, fn?: unknown, name?: string, value?: unknown, implicit?: boolean }
    switch (node.type) {
      case 'ConstantNode':
        if (typeof n.value !== 'number') throw new ExpressionError('only numeric constants are allowed', 1)
        return
      case 'SymbolNode': {
        const isCallee = parent?.type === 'FunctionNode' && (parent as unknown as { fn: MathNode }).fn === node
        if (isCallee ? !ARITY.has(n.name!) : !(variables.has(n.name!) || isConstant(n.name!))) {
          throw new ExpressionError(`name "${n.name}" is not allowed here`, 1)
        }
        return
      }
      case 'OperatorNode':
        if (!ALLOWED_OPERATORS.has(n.fn as string)) throw new ExpressionError(`operator "${n.op}" is not allowed`, 1)
        return
      case 'ParenthesisNode':
        return
      case 'FunctionNode': {
        const fn = n.fn as MathNode & { name?: string }
        const arity = fn.type === 'SymbolNode' ? ARITY.get(fn.name!) : undefined
        if (!arity) throw new ExpressionError('only calls of the allowed functions are allowed', 1)
        const k = seen.get(fn.name!) ?? 0
        seen.set(fn.name!, k + 1)
        const count = (node as MathNode & { args: MathNode[] }).args.length
        if (count < arity[0] || count > arity[1]) {
          throw new ExpressionError(`${fn.name} takes ${expectedCount(arity)}, not ${count}`, calls.get(fn.name!)?.[k] ?? 1)
        }
        return
      }
      default:
        throw new ExpressionError(`${node.type.replace(/Node$/, '').toLowerCase()} expressions are not allowed`, 1)
    }
  })
}

/**
 * Parses and checks `source` as an arithmetic expression in the given variable names.
 * Errors (ExpressionError, a RangeError with `column`, 1-based) for: characters outside the
 * language (e.g. "=", quotes, brackets, "."), unknown names or functions (e.g. import, evaluate),
 * syntax errors (column from the parser), and any non-arithmetic node. Empty text is refused.
 * @example compileExpression('1 / (x * q2)', ['x', 'q2']).evaluate({ x: 0.1, q2: 10 }) // 1
 */
export function compileExpression(source: string, variables: readonly string[]): CompiledExpression {
  if (typeof source !== 'string' || source.trim() === '') throw new ExpressionError('the expression is empty', 1)
  if (source.length > 2000) throw new ExpressionError('the expression is longer than 2000 characters', 2001)
  const allowed = new Set(variables)
  const calls = scan(source, allowed)
  let tree: MathNode
  try {
    tree = instance().parse(source)
  } catch (error) {
    const e = error as Error & { char?: number }
    throw new ExpressionError(`syntax error: ${e.message.replace(/\s*\(char \d+\)$/, '')}`, Math.max(1, Math.min(e.char ?? 1, source.length + 1)))
  }
  checkTree(tree, allowed, calls)
  const uses = new Set<string>()
  tree.traverse((node: MathNode, _p: string, parent: MathNode | null) => {
    const name = (node as MathNode & { name?: string }).name
    if (node.type === 'SymbolNode' && allowed.has(name!) && !(parent?.type === 'FunctionNode' && (parent as unknown as { fn: MathNode }).fn === node)) uses.add(name!)
  })
  const code = tree.compile()
  return {
    source,
    uses: [...uses],
    evaluate(values) {
      const scope: Record<string, number> = { ...EXPRESSION_CONSTANTS }
      for (const v of variables) {
        if (values[v] !== undefined) scope[v] = values[v]!
      }
      for (const u of uses) {
        if (scope[u] === undefined) throw new RangeError(`the expression uses ${u}, which is not defined for this kernel's options`)
      }
      let result: unknown
      try {
        result = code.evaluate(scope)
      } catch (error) {
        // The checks above leave only arithmetic on numbers; should mathjs still refuse, say so
        // as bad input rather than as a crash.
        throw new RangeError(`the expression "${source}" cannot be evaluated: ${(error as Error).message}`)
      }
      if (typeof result !== 'number' || !Number.isFinite(result)) {
        throw new RangeError(`the expression "${source}" gives ${String(result)} at ${variables.filter(v => values[v] !== undefined).map(v => `${v} = ${values[v]}`).join(', ')}; it must be a finite real number`)
      }
      return result
    }
  }
}
