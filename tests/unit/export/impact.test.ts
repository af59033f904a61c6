// The set-update table and figures: band shrinkage per bin worked by hand, the CSV through the one
// writer with both cautions, and the figures' shapes.
import { describe, expect, it } from 'vitest'
import { RESULT_CAUTION } from '../../../shared/export/caution'
import { beforeAfterFigure, chi2ProfileFigure, sensitivityHeatmap, sensitivityLines, shiftsFigure, shrinkageCsv, shrinkageRows } from '../../../shared/export/impact'
import { IMPACT_CAUTION } from '../../../shared/export/impact-caution'

const band = (central: number[], plus: number[], minus: number[]) => ({ central, plus, minus, relPlus: plus.map((p, i) => p / central[i]!), relMinus: minus.map((m, i) => m / central[i]!) })
const update = {
  data: [10.5, 19],
  before: band([10, 20], [1, 2], [1, 2]),
  after: band([10.4, 19.5], [0.5, 1.5], [0.3, 1.5])
}

describe('shrinkageRows', () => {
  it('divides the full band width after by the width before (hand-worked)', () => {
    const rows = shrinkageRows(update, ['a', 'b'])
    // bin 1: (0.5 + 0.3) / (1 + 1) = 0.4; bin 2: (1.5 + 1.5) / (2 + 2) = 0.75
    expect(rows.map(r => r.shrinkage)).toEqual([0.4, 0.75])
    expect(rows[0]).toMatchObject({ bin: 1, label: 'a', data: 10.5, before: 10, after: 10.4, afterPlus: 0.5, afterMinus: 0.3 })
  })

  it('gives null where the band before has no width, and refuses mismatched lengths', () => {
    expect(shrinkageRows({ data: [1], before: band([1], [0], [0]), after: band([1], [0], [0]) })[0]!.shrinkage).toBeNull()
    expect(() => shrinkageRows({ ...update, data: [1] })).toThrow(/2 bins before, 2 after and 1 data points/)
  })
})

describe('shrinkageCsv', () => {
  it('writes RFC 4180 lines with the provenance and both cautions as comments', () => {
    const text = shrinkageCsv(shrinkageRows(update), ['Set update: x, from y'])
    const lines = text.split('\r\n')
    expect(lines[0]).toBe('# Set update: x, from y')
    expect(text).toContain(`# ${RESULT_CAUTION}`)
    expect(text).toContain(`# ${IMPACT_CAUTION}`)
    expect(lines).toContain('bin,label,data,before,before_plus,before_minus,after,after_plus,after_minus,shrinkage')
    expect(lines).toContain('1,1,10.5,10,1,1,10.4,0.5,0.3,0.4')
    expect(text.endsWith('\r\n')).toBe(true)
  })
})

describe('figures', () => {
  it('overlays parent, update and data with a ratio panel', () => {
    const f = beforeAfterFigure({ ...update, parentName: 'P 1', updatedName: 'P-rw 1' })
    expect(f.data.map(d => d.yaxis)).toEqual(['y', 'y', 'y', 'y2', 'y2', 'y2'])
    // The ratio of the update to the parent's central value: 10.4/10 and 19.5/20.
    expect(f.data[4]!.y).toEqual([10.4 / 10, 19.5 / 20])
  })

  it('draws P(α), the shifts and the sensitivity maps', () => {
    expect(chi2ProfileFigure({ alpha: [0.5, 1, 1.5], density: [0.2, 1, 0.3], mostProbableAlpha: 1 }).data[0]!.x).toEqual([0.5, 1, 1.5])
    expect(shiftsFigure([0.5, -0.25]).data[0]).toMatchObject({ type: 'bar', x: ['1', '2'], y: [0.5, -0.25] })
    const grid = { x: [0.01, 0.1], labels: ['1', '2'], values: [[0.5, Number.NaN], [-1, 1]], quantity: 'cosPhi' as const, flavourLabel: 'g', q2GeV2: 100 }
    expect(sensitivityHeatmap(grid).data[0]).toMatchObject({ z: [[0.5, null], [-1, 1]], zmin: -1, zmax: 1 })
    expect(sensitivityHeatmap({ ...grid, quantity: 'sensitivity', values: [[3, -4], [1, 2]] }).data[0]).toMatchObject({ zmin: -4, zmax: 4 })
    expect(sensitivityLines(grid, [1]).data[0]!.y).toEqual([-1, 1])
    expect(() => sensitivityLines(grid, [5])).toThrow(/Bin 6 is not in the map/)
  })
})

describe('beforeAfterFigure axes', () => {
  it('numbers the bins even when labels repeat, and reads a spectrum over decades on a log axis', () => {
    const f = beforeAfterFigure({ data: [100, 0.5], before: band([100, 0.4], [1, 0.1], [1, 0.1]), after: band([100, 0.4], [1, 0.1], [1, 0.1]), labels: ['|y| < 2.5', '|y| < 2.5'], parentName: 'P', updatedName: 'Q' })
    expect(f.data[0]!.x).toEqual(['1', '2'])
    expect((f.layout.yaxis as { type: string }).type).toBe('log')
    expect((beforeAfterFigure({ ...update, parentName: 'P', updatedName: 'Q' }).layout.yaxis as { type: string }).type).toBe('linear')
  })
})
