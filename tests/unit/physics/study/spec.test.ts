import { describe, expect, it } from 'vitest'
import { StudySpecError, checkStudySpec, parseStudySpec, resultUnit } from '../../../../shared/physics/study'

// Validation rules and messages are Sheaf's own (shared/physics/study/spec.ts); bins are
// numbered from 1 as in the bins grid.

const issuesOf = (doc: unknown) => {
  const r = checkStudySpec(doc)
  if (r.ok) throw new Error('expected the study to be refused')
  return r.issues
}

describe('study specification', () => {
  it('fills in the defaults', () => {
    const spec = parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }] })
    expect(spec).toEqual({ title: undefined, kernel: 'dis-nc-f2', options: {}, bins: [{ x: 0.01, q2: 10 }], quadratureOrder: 8, fullRangeOrder: 32, scaleFactor: 1, rangeMode: 'integrate' })
  })

  it('is plain JSON: a parsed spec survives JSON round trips unchanged', () => {
    const spec = parseStudySpec({ kernel: 'drell-yan', options: { sqrtSGeV: 13000, beam2: { type: 'nucleus', z: 82, a: 208 } }, bins: [{ m: 20, yMin: -1, yMax: 1, label: 'low mass' }] })
    expect(parseStudySpec(JSON.parse(JSON.stringify(spec)))).toEqual(spec)
  })

  it.each([
    ['an x outside (0, 1) in a range', { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }, { x: 0.1, q2: 5 }, { xMin: 1.2, xMax: 1.5, q2: 10 }] }, 'bin 3, column xMin: x must be in (0, 1)'],
    ['a missing variable', { kernel: 'dis-nc-f2', bins: [{ x: 0.01 }] }, 'bin 1: missing Q² in GeV²: give q2, or q2Min and q2Max'],
    ['a point and a range together', { kernel: 'dis-nc-f2', bins: [{ x: 0.1, xMin: 0.01, xMax: 0.2, q2: 4 }] }, 'bin 1, column x: give x either as a point or as xMin and xMax, not both'],
    ['a range upside down', { kernel: 'drell-yan', options: { sqrtSGeV: 7000 }, bins: [{ m: 20, y: 0 }, { m: 20, yMin: 1, yMax: 0.5 }] }, 'bin 2, column yMax: yMax (0.5) must exceed yMin (1)'],
    ['half a range', { kernel: 'drell-yan', options: { sqrtSGeV: 7000 }, bins: [{ m: 20, yMin: 1 }] }, 'bin 1, column yMax: missing; a range needs both yMin and yMax'],
    ['a variable the kernel does not have', { kernel: 'dis-nc-f2', bins: [{ x: 0.1, q2: 4, m: 3 }] }, 'bin 1, column m: this kernel has no variable m; its variables are x, q2'],
    ['an unknown column', { kernel: 'dis-nc-f2', bins: [{ x: 0.1, q2: 4, foo: 1 }] }, 'bin 1, column foo: unknown column'],
    ['a text where a number belongs', { kernel: 'dis-nc-f2', bins: [{ x: 'small', q2: 4 }] }, 'bin 1, column x: must be a number'],
    ['an inelasticity above 1', { kernel: 'dis-cc-d2sigma', options: { beam: 'neutrino', beamEnergyGeV: 100 }, bins: [{ x: 0.1, y: 1.2 }] }, 'bin 1, column y: the inelasticity y must be in (0, 1]'],
    ['a column on a total', { kernel: 'z-total', options: { sqrtSGeV: 13000 }, bins: [{ y: 0 }] }, 'bin 1, column y: this kernel has no bin variables (it integrates the whole phase space); leave the row empty'],
    ['an unknown kernel', { kernel: 'dis-nc-f9', bins: [{}] }, 'kernel: unknown kernel "dis-nc-f9"'],
    ['a quadrature order of 0', { kernel: 'dis-nc-f2', bins: [{ x: 0.1, q2: 4 }], quadratureOrder: 0 }, 'quadratureOrder: must be at least 1'],
    ['no bins', { kernel: 'dis-nc-f2', bins: [] }, 'bins: a study needs at least one bin'],
    ['an unknown option', { kernel: 'drell-yan', options: { sqrtSGeV: 7000, sqrtS: 7000 }, bins: [{ m: 20, y: 0 }] }, 'option sqrtS: unknown key'],
    ['a nucleus with Z > A', { kernel: 'dis-nc-f2', options: { target: { type: 'nucleus', z: 90, a: 56 } }, bins: [{ x: 0.1, q2: 4 }] }, 'option target.z: a nucleus needs Z ≤ A']
  ])('refuses %s with a located message', (_n, doc, message) => {
    const issues = issuesOf(doc)
    expect(issues.map(i => i.message).some(m => m.startsWith(message as string))).toBe(true)
  })

  it('reports every bad bin with its row and column for the grid', () => {
    const issues = issuesOf({ kernel: 'dis-nc-f2', bins: [{ x: 2, q2: 4 }, { x: 0.1, q2: 4 }, { x: 0.1, q2: -4 }] })
    expect(issues.map(i => [i.bin, i.column])).toEqual([[1, 'x'], [3, 'q2']])
  })

  it('a missing required option names the option', () => {
    const issues = issuesOf({ kernel: 'drell-yan', bins: [{ m: 20, y: 0 }] })
    expect(issues[0]!.column).toBe('sqrtSGeV')
    expect(issues[0]!.message).toMatch(/^option sqrtSGeV: /)
  })

  it('checks both parts of a composite', () => {
    const issues = issuesOf({ kernel: 'nuclear-ratio', options: { base: 'drell-yan', nucleus: { z: 82, a: 208 } }, bins: [{ m: 20, y: 0 }] })
    expect(issues[0]!.message).toMatch(/^option sqrtSGeV: /)
    expect(checkStudySpec({ kernel: 'nuclear-ratio', options: { base: 'drell-yan', nucleus: { z: 82, a: 208 }, sqrtSGeV: 8160 }, bins: [{ m: 20, y: 0 }] }).ok).toBe(true)
  })

  it('parseStudySpec throws a StudySpecError (a RangeError) carrying every issue', () => {
    let error: unknown
    try {
      parseStudySpec({ kernel: 'dis-nc-f2', bins: [{ x: 2, q2: 4 }, { x: 3, q2: 4 }] })
    } catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(StudySpecError)
    expect(error).toBeInstanceOf(RangeError)
    expect((error as StudySpecError).issues).toHaveLength(2)
    expect((error as Error).message).toBe('bin 1, column x: x must be in (0, 1) (and 1 more problem)')
  })

  it.each([
    [{ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins: [{ m: 20, y: 0 }] }, 'pb/GeV'],
    [{ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins: [{ m: 20, yMin: 0, yMax: 1 }] }, 'pb/GeV'],
    [{ kernel: 'drell-yan', options: { sqrtSGeV: 13000, unit: 'fb' }, bins: [{ mMin: 20, mMax: 30, yMin: 0, yMax: 1 }] }, 'fb'],
    [{ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins: [{ mMin: 20, mMax: 30, y: 0 }], rangeMode: 'average' }, 'pb/GeV'],
    [{ kernel: 'dis-nc-d2sigma', options: { sqrtSGeV: 300 }, bins: [{ x: 0.01, q2: 10 }] }, 'pb/GeV^2'],
    [{ kernel: 'dis-nc-d2sigma', options: { sqrtSGeV: 300 }, bins: [{ x: 0.01, q2Min: 10, q2Max: 20 }] }, 'pb'],
    [{ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }] }, '1'],
    [{ kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2Min: 10, q2Max: 20 }] }, 'GeV^2'],
    [{ kernel: 'z-total', options: { sqrtSGeV: 13000 }, bins: [{}] }, 'pb'],
    [{ kernel: 'w-charge-asymmetry', options: { sqrtSGeV: 13000 }, bins: [{ y: 0 }] }, '1'],
    [{ kernel: 'user', options: { mode: 'dis', expression: '1', weights: [{ a: 2, w: 1 }], unitLabel: 'arb.' }, bins: [{ x: 0.1, q2: 4 }] }, 'arb.']
  ])('unit of %j is %s', (doc, unit) => {
    expect(resultUnit(parseStudySpec(doc))).toBe(unit)
  })
})
