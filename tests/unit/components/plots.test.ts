// @vitest-environment happy-dom
import { flushPromises, mount } from '@vue/test-utils'
import { beforeEach, describe, expect, it, vi } from 'vitest'

// Plotly itself needs a real browser (the browser tests draw it); here a recorder stands in.
const plotly = vi.hoisted(() => ({
  react: vi.fn(async (el: HTMLElement) => Object.assign(el, { on: vi.fn() })),
  purge: vi.fn(),
  downloadImage: vi.fn(async () => ''),
  // a 1 × 1 PNG, and an empty SVG document
  toImage: vi.fn(async (_el: unknown, o: { format: string }) => (o.format === 'png'
    ? 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg=='
    : `data:image/svg+xml,${encodeURIComponent('<svg xmlns="http://www.w3.org/2000/svg" width="900"><g/></svg>')}`)),
  Plots: { resize: vi.fn() }
}))
vi.mock('plotly.js-dist-min', () => ({ default: plotly }))

const { default: BandPlot } = await import('~/components/plots/BandPlot.vue')
const { default: CorrelationHeatmap } = await import('~/components/plots/CorrelationHeatmap.vue')
const { default: DensityPlot } = await import('~/components/plots/DensityPlot.vue')

/** A band in its JSON form; the relative widths are plus/|central| and minus/|central|. */
const band = (central: number[], plus: number[], minus: number[]) =>
  ({ central, plus, minus, relPlus: plus.map((p, i) => p / Math.abs(central[i]!)), relMinus: minus.map((m, i) => m / Math.abs(central[i]!)) })
const series = [{ id: 'a', label: 'A', band: band([2, 1], [0.2, 0.1], [0.1, 0.1]) }]

describe('plots', () => {
  beforeEach(() => vi.clearAllMocks())

  it('loads Plotly on mount and draws the figure without the vendor logo, at the given height', async () => {
    const wrapper = mount(BandPlot, { props: { positions: { lo: [1, 2], hi: [2, 3] }, variable: { label: 'M', unit: 'GeV' }, observable: { label: 'σ', unit: 'pb' }, series, height: 300, filename: 'dy' } })
    await flushPromises()
    expect(plotly.react).toHaveBeenCalledTimes(1)
    const [, data, layout, config] = plotly.react.mock.calls[0] as unknown as [HTMLElement, unknown[], Record<string, unknown>, Record<string, unknown>]
    expect(data).toHaveLength(2)
    expect(layout).toMatchObject({ height: 300, font: { family: '"Public Sans", system-ui, sans-serif' } })
    expect(config).toMatchObject({ displaylogo: false, toImageButtonOptions: { filename: 'dy' } })
    await wrapper.setProps({ series: [...series, { ...series[0]!, id: 'b', label: 'B' }] })
    await flushPromises()
    expect(plotly.react).toHaveBeenCalledTimes(2)
    wrapper.unmount()
    expect(plotly.purge).toHaveBeenCalled()
  })

  it('exports PNG and SVG through the exposed method and the buttons, provenance and caution inside', async () => {
    const provenance = { title: 'Study A: σ [pb]', lines: ['set: Bramble-H 1.2'], caution: 'Leading-order prediction.' }
    const wrapper = mount(BandPlot, { props: { positions: { lo: [1, 2] }, variable: { label: 'x' }, observable: { label: 'y' }, series, filename: 'band', provenance } })
    await flushPromises()
    const vm = wrapper.vm as unknown as { toImage: (f: 'png' | 'svg') => Promise<string>, exportImage: (f: 'png' | 'svg') => Promise<void> }
    const svg = decodeURIComponent((await vm.toImage('svg')).split(',')[1]!)
    expect(plotly.toImage).toHaveBeenLastCalledWith(expect.anything(), { format: 'svg', width: 900, height: 600, scale: 1 })
    expect(svg).toContain('<title>Study A: σ [pb]</title>')
    expect(svg).toMatch(/<desc>[^<]*set: Bramble-H 1\.2[^<]*caution: Leading-order prediction\.<\/desc>/)
    await wrapper.findAll('button').find(b => b.text() === 'PNG')!.trigger('click')
    await flushPromises()
    expect(plotly.toImage).toHaveBeenLastCalledWith(expect.anything(), { format: 'png', width: 900, height: 600, scale: 2 })
    const png = atob((await vm.toImage('png')).split(',')[1]!)
    expect(png).toContain('tEXt')
    expect(png).toContain('Leading-order prediction.')
  })

  it('shows the reason instead of a plot when the inputs do not fit', async () => {
    const wrapper = mount(CorrelationHeatmap, { props: { matrix: [[1, 0.5], [0.5]] } })
    await flushPromises()
    expect(wrapper.find('[role=alert]').text()).toBe('The correlation matrix is not square: row 2 has 1 entries for 2 bins')
    expect(plotly.react).not.toHaveBeenCalled()
    const density = mount(DensityPlot, { props: { x: [0.1, 1.2], q2GeV2: 10, curves: [{ id: 'g', label: 'g', band: band([1, 1], [0, 0], [0, 0]) }] } })
    await flushPromises()
    expect(density.find('[role=alert]').text()).toBe('x node 2 is 1.2; densities are plotted for 0 < x < 1')
  })

  it('draws densities on a log-x axis with the Q² note', async () => {
    mount(DensityPlot, { props: { x: [1e-3, 0.1], q2GeV2: 100, curves: [{ id: 'g', label: 'g', band: band([3, 1], [0.1, 0.1], [0.1, 0.1]) }] } })
    await flushPromises()
    const layout = (plotly.react.mock.calls[0] as unknown as unknown[])[2] as { xaxis: { type: string }, annotations: Array<{ text: string }> }
    expect(layout.xaxis.type).toBe('log')
    expect(layout.annotations[0]!.text).toBe('Q² = 100 GeV²')
  })
})
