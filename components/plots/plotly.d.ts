// The part of plotly.js-dist-min's API that Sheaf uses (the package ships no types).
declare module 'plotly.js-dist-min' {
  export interface PlotlyImageOptions {
    format: 'png' | 'svg'
    width?: number
    height?: number
    scale?: number
  }
  export interface PlotlyPointEvent {
    points: Array<{ curveNumber: number, pointIndex: number, pointNumber: number | number[], x: unknown, y: unknown, z?: unknown }>
  }
  export interface PlotlyElement extends HTMLElement {
    on(event: 'plotly_click', handler: (event: PlotlyPointEvent) => void): void
    removeAllListeners?(event: string): void
  }
  export interface PlotlyStatic {
    react(el: HTMLElement, data: unknown[], layout?: Record<string, unknown>, config?: Record<string, unknown>): Promise<PlotlyElement>
    purge(el: HTMLElement): void
    toImage(el: HTMLElement | { data: unknown[], layout?: Record<string, unknown> }, options: PlotlyImageOptions): Promise<string>
    downloadImage(el: HTMLElement, options: PlotlyImageOptions & { filename: string }): Promise<string>
    Plots: { resize(el: HTMLElement): void }
  }
  const Plotly: PlotlyStatic
  export default Plotly
}
