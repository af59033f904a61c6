import { describe, expect, it } from 'vitest'
import { CORRELATION_SCALE, bandFigure, correlationFigure, eigenvectorFigure, houseConfig, pointDodgeStep, withAlpha } from '#shared/export/figures'
import { makeBands } from '#shared/physics/uncertainty/band'

const series = (id: string, central: number[], rel = 0.1) => ({ id, label: id.toUpperCase(), band: makeBands(central, central.map(c => c * rel), central.map(c => c * rel / 2)) })

describe('bandFigure', () => {
  it('draws touching bins as one stepped outline and breaks at gaps', () => {
    // bins [1,2], [2,3] touch; [5,6] stands apart; given out of order on purpose
    const fig = bandFigure({ positions: { lo: [2, 1, 5], hi: [3, 2, 6] }, variable: { label: 'M', unit: 'GeV' }, observable: { label: 'dσ/dM', unit: 'pb/GeV' }, series: [series('a', [20, 10, 5])] })
    const [area, line] = fig.data
    expect(area).toMatchObject({ fill: 'toself', hoverinfo: 'skip', showlegend: true, name: 'A' })
    expect(area!.x).toEqual([1, 2, 2, 3, 3, 2, 2, 1, null, 5, 6, 6, 5])
    expect(area!.y).toEqual([11, 11, 22, 22, 19, 19, 9.5, 9.5, null, 5.5, 5.5, 4.75, 4.75])
    expect(line!.x).toEqual([1, 2, 2, 3, null, 5, 6])
    expect(line!.y).toEqual([10, 10, 20, 20, null, 5, 5])
    expect(fig.layout.xaxis).toMatchObject({ title: { text: 'M [GeV]' }, ticks: 'outside', mirror: 'ticks', showline: true })
    expect(fig.layout.paper_bgcolor).toBe('#ffffff')
  })

  it('adds a ratio panel dividing every band by the reference central value', () => {
    const fig = bandFigure({ positions: { lo: [1, 2] }, variable: { label: 'x', log: true }, observable: { label: 'xf' }, series: [series('ref', [2, 4]), series('other', [3, 2])], referenceId: 'ref' })
    const ratio = fig.data.filter(t => t.yaxis === 'y2')
    expect(ratio).toHaveLength(4)
    expect(ratio[3]!.y).toEqual([1.5, 0.5]) // other central / ref central
    expect(ratio[0]!.y).toEqual([1.1, 1.1, 0.95, 0.95]) // ref band / ref central
    expect(fig.layout.yaxis2).toMatchObject({ domain: [0, 0.25] })
    expect(fig.layout.xaxis2).toMatchObject({ type: 'log', title: { text: 'x' } })
    expect(() => bandFigure({ positions: { lo: [1] }, variable: { label: 'x' }, observable: { label: 'y' }, series: [series('a', [1])], referenceId: 'zz' })).toThrow("Reference series 'zz'")
  })

  it('draws bars with asymmetric errors at spread positions inside each bin', () => {
    const fig = bandFigure({ draw: 'bars', positions: { lo: [0, 10], hi: [10, 20] }, variable: { label: 'y' }, observable: { label: 'σ' }, series: [series('a', [10, 20]), series('b', [10, 20])] })
    const close = (got: unknown, want: number[]) => (got as number[]).forEach((v, i) => expect(v).toBeCloseTo(want[i]!, 12))
    close(fig.data[0]!.x, [10 / 3, 10 + 10 / 3])
    close(fig.data[1]!.x, [20 / 3, 10 + 20 / 3])
    expect(fig.data[0]!.error_y).toMatchObject({ symmetric: false, array: [1, 2], arrayminus: [0.5, 1] })
  })

  it('draws the envelope hatched and dashed, apart from the PDF bands', () => {
    const fig = bandFigure({ positions: { lo: [1, 2] }, variable: { label: 'x' }, observable: { label: 'y' }, series: [series('a', [1, 1])], envelope: { label: 'scale variation', lower: [0.8, 0.9], upper: [1.3, 1.2] } })
    const env = fig.data.find(t => t.name === 'scale variation')!
    expect(env).toMatchObject({ fillpattern: { shape: '/' }, line: { dash: 'dash' } })
    expect(env.y).toEqual([1.3, 1.2, 0.9, 0.8])
  })

  it('refuses series whose lengths do not match the bins', () => {
    expect(() => bandFigure({ positions: { lo: [1, 2] }, variable: { label: 'x' }, observable: { label: 'y' }, series: [series('a', [1])] })).toThrow('Series A has 1 central values for 2 bins')
  })
})

describe('correlationFigure', () => {
  it('fixes the colour range to [−1, 1] with a white middle', () => {
    const fig = correlationFigure({ matrix: [[1, -0.3], [-0.3, 1]] })
    expect(fig.data[0]).toMatchObject({ type: 'heatmap', zmin: -1, zmax: 1, z: [[1, -0.3], [-0.3, 1]], x: ['1', '2'] })
    expect(CORRELATION_SCALE.find(([t]) => t === 0.5)![1]).toBe('#ffffff')
    expect(fig.layout.yaxis).toMatchObject({ autorange: 'reversed' })
    expect(() => correlationFigure({ matrix: [[1, 0], [0]] })).toThrow('row 2 has 1 entries for 2 bins')
  })
})

describe('eigenvectorFigure', () => {
  const shifts = [{ label: '1', up: 0.1, down: -0.05 }, { label: '2', up: -0.4, down: 0.3 }, { label: '3', up: 0.2, down: -0.25 }]
  it('sorts by size, keeps the top ones, and shows percent of the central value', () => {
    const fig = eigenvectorFigure({ binLabel: 'bin 4', shifts, central: 2, sortBy: 'size', top: 2 })
    expect(fig.data[0]!.x).toEqual(['2', '3'])
    expect(fig.data[0]!.y).toEqual([-20, 10])
    expect(fig.data[1]!.y).toEqual([15, -12.5])
    expect(fig.layout.yaxis).toMatchObject({ title: { text: 'shift from central [%]' } })
  })
  it('shows one bar per eigenvector for one-sided members', () => {
    expect(eigenvectorFigure({ binLabel: 'b', shifts: [{ label: '1', up: 1 }], unit: 'pb' }).data).toHaveLength(1)
  })
})

describe('house style', () => {
  it('hides the vendor logo and checks colours', () => {
    expect(houseConfig('f')).toMatchObject({ displaylogo: false, toImageButtonOptions: { filename: 'f' } })
    expect(withAlpha('#2f6f94', 0.25)).toBe('rgba(47, 111, 148, 0.25)')
    expect(() => withAlpha('tide', 1)).toThrow(RangeError)
  })
})

describe('points at one x', () => {
  it('are set side by side within a third of the narrowest gap, on linear and log axes', () => {
    expect(pointDodgeStep([1, 2, 4, 4], false)).toBeCloseTo(1 / 3, 15)
    expect(pointDodgeStep([0.01, 0.1, 1], true)).toBeCloseTo(Math.log(10) / 3, 12)
    expect(pointDodgeStep([5, 5], false)).toBe(0)
  })
})
