import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import type { VariableSpec } from '#shared/physics/kernels/registry'
import { kernelDefinition } from '#shared/physics/kernels/registry'
import { kernelVariables } from '#shared/physics/study/spec'
import type { BinRow as SpecBin } from '#shared/physics/study/spec'
import {
  bandsQuery, binAxis, binsFromRows, binText, defaultLayout, domainCheck, fetchFailure, gridColumns, layoutsOf, rowsFromBins,
  sameBins, sciText, serverCheck, shownResults, spansDecades, switchLayout, targetText, useStudyViewStore,
  type ResultRow, type StudyDetail, type StudyView
} from '~/stores/study-view'

const dis = kernelVariables(kernelDefinition('dis-nc-f2'), {}) // x, Q²
const dy = kernelVariables(kernelDefinition('drell-yan'), {}) // M, rapidity y
const inelasticity: VariableSpec = { name: 'y', label: 'inelasticity y', gevPower: 0, check: () => null }
const bins = (...b: object[]) => b as SpecBin[]

describe('sameBins', () => {
  it('compares the kinematics, not the key order', () => {
    expect(sameBins(bins({ x: 0.1, q2: 10 }), bins({ q2: 10, x: 0.1 }))).toBe(true)
    expect(sameBins(bins({ x: 0.1, q2: 10, label: 'a' }), bins({ label: 'a', q2: 10, x: 0.1 }))).toBe(true)
  })
  it('tells apart a changed value, a changed label, a missing key and another bin count', () => {
    expect(sameBins(bins({ x: 0.1, q2: 10 }), bins({ x: 0.1, q2: 20 }))).toBe(false)
    expect(sameBins(bins({ x: 0.1, q2: 10, label: 'a' }), bins({ x: 0.1, q2: 10, label: 'b' }))).toBe(false)
    expect(sameBins(bins({ x: 0.1, q2: 10 }), bins({ x: 0.1 }))).toBe(false)
    expect(sameBins(bins({ x: 0.1, q2: 10 }), bins({ x: 0.1, q2: 10 }, { x: 0.2, q2: 10 }))).toBe(false)
    expect(sameBins(bins({ xMin: 0.1, xMax: 0.2, q2: 10 }), bins({ xMin: 0.1, xMax: 0.3, q2: 10 }))).toBe(false)
  })
  it('treats an absent key and an undefined one alike, and two empty lists as the same', () => {
    expect(sameBins(bins({ x: 0.1, q2: 10 }), bins({ x: 0.1, q2: 10, label: undefined }))).toBe(true)
    expect(sameBins([], [])).toBe(true)
  })
})

describe('layouts and grid columns', () => {
  it('reads each variable\'s layout from the bins', () => {
    expect(layoutsOf(dis, bins({ x: 0.1, q2: 10 }))).toEqual({ x: 'point', q2: 'point' })
    expect(layoutsOf(dis, bins({ xMin: 0.1, xMax: 0.2, q2: 10 }))).toEqual({ x: 'range', q2: 'point' })
    expect(layoutsOf(dis, bins({ x: 0.1, q2: 10 }, { xMin: 0.1, xMax: 0.2, q2: 10 }))).toEqual({ x: 'mixed', q2: 'point' })
  })
  it('gives new studies rapidity in ranges and every other variable at points', () => {
    expect(layoutsOf(dy, [])).toEqual({ m: 'point', y: 'range' })
    expect(defaultLayout(inelasticity)).toBe('point')
    expect(layoutsOf(dis, [], () => 'range')).toEqual({ x: 'range', q2: 'range' })
  })
  it('makes a column per point, a Min/Max pair per range, both for mixed data, and a label last', () => {
    const points = gridColumns(dis, { x: 'point', q2: 'point' })
    expect(points.map(c => c.key)).toEqual(['x', 'q2', 'label'])
    expect(points[1]).toMatchObject({ label: 'Q²', unit: 'GeV²', kind: 'number', required: true })
    const ranged = gridColumns(dis, { x: 'range', q2: 'point' })
    expect(ranged.map(c => c.key)).toEqual(['xMin', 'xMax', 'q2', 'label'])
    expect(ranged[0]).toMatchObject({ kind: 'range-lo', pairWith: 'xMax', required: true })
    expect(ranged[1]).toMatchObject({ kind: 'range-hi', required: true })
    const mixed = gridColumns(dis, { x: 'mixed', q2: 'point' })
    expect(mixed.map(c => c.key)).toEqual(['x', 'xMin', 'xMax', 'q2', 'label'])
    expect(mixed.slice(0, 3).map(c => c.required)).toEqual([false, false, false])
  })
})

describe('bins ↔ grid rows', () => {
  const columns = gridColumns(dis, { x: 'point', q2: 'point' })
  it('fills every column, missing ones as null, and converts back without empty labels', () => {
    const spec = bins({ x: 0.1, q2: 10, label: 'first' }, { x: 0.2, q2: 20 })
    const rows = rowsFromBins(spec, columns)
    expect(rows).toEqual([{ x: 0.1, q2: 10, label: 'first' }, { x: 0.2, q2: 20, label: null }])
    expect(binsFromRows(rows, columns)).toEqual(spec)
  })
  it('trims labels and drops blank ones and empty cells', () => {
    expect(binsFromRows([{ x: 0.1, q2: null, label: '  low x  ' }, { x: 0.2, q2: 5, label: '   ' }], columns))
      .toEqual([{ x: 0.1, label: 'low x' }, { x: 0.2, q2: 5 }])
  })
})

describe('switchLayout', () => {
  it('turns a point into the lower end of a range, leaving the upper end to fill', () => {
    expect(switchLayout([{ x: 0.1, q2: 10 }], 'x', 'range')).toEqual([{ q2: 10, xMin: 0.1, xMax: null }])
  })
  it('turns a range into its midpoint, or its lower end when the upper one is missing', () => {
    expect(switchLayout([{ xMin: 0.1, xMax: 0.3, q2: 10 }], 'x', 'point')).toEqual([{ x: 0.2, q2: 10 }])
    expect(switchLayout([{ xMin: 0.1, xMax: null, q2: 10 }], 'x', 'point')).toEqual([{ x: 0.1, q2: 10 }])
  })
  it('keeps a point value that is already there and does not touch other variables', () => {
    expect(switchLayout([{ x: 0.5, xMin: 0.1, xMax: 0.3, q2Min: 1, q2Max: 2 }], 'x', 'point')).toEqual([{ x: 0.5, q2Min: 1, q2Max: 2 }])
  })
})

describe('grid checks', () => {
  it('puts the engine\'s domain complaint on each offending kinematic cell', () => {
    const check = domainCheck(dis)
    const problems = check({ x: 1.2, q2: 10, xMin: 0, label: 'x' }, 0) ?? []
    expect(problems.map(p => p.column)).toEqual(['x', 'xMin'])
    expect(problems[0]!.reason).toBe('x must be in (0, 1)')
    expect(check({ x: 0.5, q2: 10 }, 0)).toEqual([])
  })

  it('places the server\'s issues on their bin and column, reach messages on the named quantity', () => {
    const columns = gridColumns(dis, { x: 'range', q2: 'point' })
    const check = serverCheck([
      { bin: 2, column: 'q2', message: 'bin 2, column q2: Q² must be positive' },
      { bin: 1, message: 'toy-hessian: bin 1: x = 1e-7 (at x = 1e-7, Q² = 10) is below the set\'s smallest x node' },
      { bin: 3, column: 'nowhere', message: 'bin 3: the kernel refused it' },
      { message: 'no bin: not placed' },
      { bin: 0, message: 'bin 0: not placed' }
    ], columns)
    expect(check({}, 1)).toEqual([{ column: 'q2', reason: 'Q² must be positive' }])
    expect(check({}, 0)).toEqual([{ column: 'xMin', reason: 'toy-hessian: x = 1e-7 (at x = 1e-7, Q² = 10) is below the set\'s smallest x node' }])
    expect(check({}, 2)).toEqual([{ column: 'xMin', reason: 'the kernel refused it' }])
    expect(check({}, 3)).toBeUndefined()
  })
})

describe('words and numbers', () => {
  it('writes grid bounds as people do', () => {
    expect(sciText(0)).toBe('0')
    expect(sciText(0.95)).toBe('0.95')
    expect(sciText(1.69)).toBe('1.69')
    expect(sciText(1e-5)).toBe('10⁻⁵')
    expect(sciText(2.5e8)).toBe('2.5×10⁸')
    expect(sciText(1e5)).toBe('10⁵')
    expect(sciText(12345)).toBe('1.23×10⁴')
  })

  it('names a bin: label first, then x, Q², M, y, ranges with a true minus sign', () => {
    expect(binText(undefined)).toBe('')
    expect(binText({ x: 0.01, q2: 10 } as SpecBin)).toBe('x 0.01, Q² 10 GeV²')
    expect(binText({ label: 'Z peak', mMin: 60, mMax: 80, yMin: -1, yMax: 1 } as SpecBin)).toBe('Z peak, M 60–80 GeV, y −1–1')
    expect(binText({ yMin: -2.5, yMax: 0, m: 91.2 } as SpecBin)).toBe('M 91.2 GeV, y −2.5–0')
  })

  it('names the target', () => {
    expect(targetText(null)).toBe('—')
    expect(targetText({ type: 'proton' })).toBe('proton')
    expect(targetText({ type: 'nucleus', z: 26, a: 56 })).toBe('nucleus Z = 26, A = 56')
  })

  it('reads a failed $fetch: the route\'s message and issues, or a plain word when nothing came back', () => {
    const issues = [{ bin: 1, column: 'x', message: 'x must be in (0, 1)' }]
    expect(fetchFailure({ statusCode: 422, data: { statusMessage: 'Bins to fix', data: { issues } } }))
      .toEqual({ status: 422, message: 'Bins to fix', issues })
    expect(fetchFailure({ statusCode: 409, data: { message: 'In use' } })).toEqual({ status: 409, message: 'In use', issues: [] })
    expect(fetchFailure(new Error('network'))).toEqual({ status: 0, message: 'The server could not be reached; try again', issues: [] })
  })
})

describe('the result versions a study shows', () => {
  const result = (id: string, setId: string, version: number, state: ResultRow['state']) =>
    ({ id, setId, version, state }) as ResultRow
  const study = {
    id: 's', setIds: ['A', 'B', 'C'],
    results: [result('a2', 'A', 2, 'failed'), result('b1', 'B', 1, 'running'), result('a1', 'A', 1, 'done')]
  } as StudyDetail
  const view = (versionBySet: Record<string, string> = {}) => ({ versionBySet }) as StudyView

  it('shows the newest finished version, else the newest, in the order of the study\'s sets', () => {
    expect(shownResults(study, view()).map(r => r.id)).toEqual(['a1', 'b1'])
  })
  it('shows the chosen version, but only one of that set', () => {
    expect(shownResults(study, view({ A: 'a2' })).map(r => r.id)).toEqual(['a2', 'b1'])
    expect(shownResults(study, view({ A: 'b1' })).map(r => r.id)).toEqual(['a1', 'b1'])
  })

  it('asks for the chosen prescription of the set\'s kind and the chosen CL, nothing for the defaults', () => {
    const v = { prescriptionByKind: { 'replicas': 'replica-sd', 'hessian-pairs': 'auto' }, clPercent: 90 } as unknown as StudyView
    expect(bandsQuery(v, 'replicas')).toEqual({ prescription: 'replica-sd', cl: 90 })
    expect(bandsQuery(v, 'hessian-pairs')).toEqual({ cl: 90 })
    expect(bandsQuery({ ...v, clPercent: null }, 'hessian-one-sided')).toEqual({})
  })
})

describe('the plot\'s horizontal axis', () => {
  it('calls values worth a log axis when positive and spanning more than a factor 30', () => {
    expect(spansDecades([1, 100])).toBe(true)
    expect(spansDecades([1, 30])).toBe(false)
    expect(spansDecades([0, 100])).toBe(false)
    expect(spansDecades([5])).toBe(false)
    expect(spansDecades(new Float64Array([1, Number.NaN, 100]))).toBe(true)
  })

  it('takes the variable that changes most between bins, on a log axis when it spans decades', () => {
    const spec = bins({ x: 0.001, q2: 10 }, { x: 0.01, q2: 10 }, { x: 0.1, q2: 10 })
    expect(binAxis(spec, dis, null)).toEqual({ variable: 'x', positions: { lo: [0.001, 0.01, 0.1] }, axis: { label: 'x', log: true }, draw: 'band' })
  })

  it('takes the chosen variable; repeated positions are drawn as points', () => {
    const spec = bins({ x: 0.001, q2: 10 }, { x: 0.01, q2: 10 })
    expect(binAxis(spec, dis, 'q2')).toEqual({ variable: 'q2', positions: { lo: [10, 10] }, axis: { label: 'Q²', unit: 'GeV²', log: false }, draw: 'bars' })
    // a chosen variable the kernel does not have is ignored
    expect(binAxis(spec, dis, 'm').variable).toBe('x')
  })

  it('uses bin edges for ranges', () => {
    const spec = bins({ mMin: 60, mMax: 80, yMin: -1, yMax: 1 }, { mMin: 80, mMax: 100, yMin: -1, yMax: 1 })
    expect(binAxis(spec, dy, null)).toEqual({ variable: 'm', positions: { lo: [60, 80], hi: [80, 100] }, axis: { label: 'M', unit: 'GeV', log: false }, draw: 'band' })
  })

  it('numbers the bins when there are no kinematics', () => {
    expect(binAxis(bins({}, {}), [], null)).toEqual({ variable: null, positions: { lo: [1, 2] }, axis: { label: 'bin' }, draw: 'bars' })
  })
})

describe('useStudyViewStore', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('keeps each study\'s choices apart and resets one of them', () => {
    const store = useStudyViewStore()
    const a = store.view('a')
    expect(a).toEqual({ prescriptionByKind: {}, clPercent: null, referenceSetId: null, focusSetId: null, versionBySet: {}, bin: 0, variable: null, showScale: true })
    a.clPercent = 90
    a.versionBySet.A = 'a2'
    expect(store.view('a').clPercent).toBe(90)
    expect(store.view('b').clPercent).toBeNull()
    store.reset('a')
    expect(store.view('a').clPercent).toBeNull()
    expect(store.view('a').versionBySet).toEqual({})
  })
})
