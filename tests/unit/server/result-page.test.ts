// Pages of bins of a result (server/domain/results/page.ts): which bins a query asks for, and
// the bands, scale variation and bins cut to that page in step.
import { describe, expect, it } from 'vitest'
import { bandsPage, binPage, binsPage, RESULT_PAGE_BINS, scalePage } from '../../../server/domain/results/page'
import { DomainError } from '../../../server/domain/errors'

const band = (n: number) => ({ central: Array.from({ length: n }, (_, i) => i), plus: Array(n).fill(1), minus: Array(n).fill(2), relPlus: Array(n).fill(0.1), relMinus: Array(n).fill(null) })

describe('binPage', () => {
  it('sends a small result whole and a large one a page at a time', () => {
    expect(binPage(15, {})).toEqual({ offset: 0, limit: 15, total: 15 })
    expect(binPage(10_000, {})).toEqual({ offset: 0, limit: RESULT_PAGE_BINS, total: 10_000 })
    expect(binPage(10_000, { binsLimit: 'all' })).toEqual({ offset: 0, limit: 10_000, total: 10_000 })
  })
  it('stops the last page at the last bin', () => {
    expect(binPage(10_000, { binsOffset: 9_500, binsLimit: 1000 })).toEqual({ offset: 9_500, limit: 500, total: 10_000 })
  })
  it('refuses an offset past the last bin with 400 naming binsOffset', () => {
    expect(() => binPage(10, { binsOffset: 10 })).toThrow(DomainError)
    try {
      binPage(10, { binsOffset: 10 })
    } catch (err) {
      expect((err as DomainError).statusCode).toBe(400)
      expect(JSON.stringify((err as DomainError).data)).toContain('binsOffset')
    }
  })
})

describe('cutting to a page', () => {
  it('cuts every array of the bands, the PDF part, α_s, the scale variation and the bins alike', () => {
    const p = binPage(6, { binsOffset: 2, binsLimit: 3 })
    const b = bandsPage({ ...band(6), prescription: 'hessian-symmetric', clPercent: 68, pdf: band(6), alphas: [0, 1, 2, 3, 4, 5] } as never, p)
    expect(b.central).toEqual([2, 3, 4])
    expect(b.pdf.central).toEqual([2, 3, 4])
    expect(b.relMinus).toEqual([null, null, null])
    expect(b.alphas).toEqual([2, 3, 4])
    const s = scalePage({ kappas: [0.5, 1, 2], values: [[0, 1, 2, 3, 4, 5], [1, 1, 1, 1, 1, 1], [2, 2, 2, 2, 2, 2]], nominal: [0, 1, 2, 3, 4, 5], up: [0, 0, 0, 0, 0, 0], down: [0, 0, 0, 0, 0, 0] }, p)
    expect(s.values[0]).toEqual([2, 3, 4])
    expect(s.nominal).toEqual([2, 3, 4])
    expect(binsPage(['a', 'b', 'c', 'd', 'e', 'f'], p)).toEqual(['c', 'd', 'e'])
  })
})
