import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import {
  RANDOM_PURPOSES, deterministicLog, normalStream, philox4x32, standardNormals, uniformStream, type StreamKey
} from '~/shared/physics/random'

// Philox4x32: J. K. Salmon, M. A. Moraes, R. O. Dror and D. E. Shaw, "Parallel random numbers: as
// easy as 1, 2, 3", Proc. SC11 (2011). The known-answer vectors are not printed in the paper;
// they come from the authors' own distribution of the generator (Random123, file
// tests/kat_vectors, lines "philox4x32 7 …" and "philox4x32 10 …": counter words, key words,
// output words).
const KAT: Array<[number, number[], number[], number[]]> = [
  [10, [0, 0, 0, 0], [0, 0], [0x6627e8d5, 0xe169c58d, 0xbc57ac4c, 0x9b00dbd8]],
  [10, [0xffffffff, 0xffffffff, 0xffffffff, 0xffffffff], [0xffffffff, 0xffffffff], [0x408f276d, 0x41c83b0e, 0xa20bc7c6, 0x6d5451fd]],
  [10, [0x243f6a88, 0x85a308d3, 0x13198a2e, 0x03707344], [0xa4093822, 0x299f31d0], [0xd16cfe09, 0x94fdcceb, 0x5001e420, 0x24126ea1]],
  [7, [0, 0, 0, 0], [0, 0], [0x5f6fb709, 0x0d893f64, 0x4f121f81, 0x4f730a48]],
  [7, [0xffffffff, 0xffffffff, 0xffffffff, 0xffffffff], [0xffffffff, 0xffffffff], [0x5207ddc2, 0x45165e59, 0x4d8ee751, 0x8c52f662]],
  [7, [0x243f6a88, 0x85a308d3, 0x13198a2e, 0x03707344], [0xa4093822, 0x299f31d0], [0x4dfccaba, 0x190a87f0, 0xc47362ba, 0xb6b5242a]]
]

/**
 * Philox4x32 written again from the paper's description with exact 64-bit BigInt products (the
 * engine splits the multiplication into 16-bit halves instead): round
 * (c₀, c₁, c₂, c₃) → (hi(M₁c₂) ⊕ c₁ ⊕ k₀, lo(M₁c₂), hi(M₀c₀) ⊕ c₃ ⊕ k₁, lo(M₀c₀)), then the key
 * advances by the Weyl constants.
 */
function referencePhilox(counter: number[], key: number[], rounds: number): number[] {
  const mask = 0xffffffffn
  let c = counter.map(BigInt)
  let k = key.map(BigInt)
  for (let r = 0; r < rounds; r++) {
    const p0 = 0xd2511f53n * c[0]!
    const p1 = 0xcd9e8d57n * c[2]!
    c = [((p1 >> 32n) ^ c[1]! ^ k[0]!) & mask, p1 & mask, ((p0 >> 32n) ^ c[3]! ^ k[1]!) & mask, p0 & mask]
    k = [(k[0]! + 0x9e3779b9n) & mask, (k[1]! + 0xbb67ae85n) & mask]
  }
  return c.map(Number)
}

/** The 53-bit double of two words, ((w₀ ≫ 5)·2²⁶ + (w₁ ≫ 6))/2⁵³, with BigInt. */
const double53 = (w0: number, w1: number) => Number((BigInt(w0 >>> 5) << 26n) | BigInt(w1 >>> 6)) / 2 ** 53

const key = (purpose: StreamKey['purpose'], index = 0): StreamKey => ({ purpose, index })

describe('Philox4x32 (Salmon, Moraes, Dror & Shaw, SC11, 2011)', () => {
  it.each(KAT)('%i rounds: counter %j, key %j → %j (Random123 known-answer vectors)', (rounds, counter, k, expected) => {
    expect(philox4x32(counter, k, rounds)).toEqual(expected)
  })

  it('agrees word for word with an independent BigInt implementation on 500 counters and keys', () => {
    // Inputs from a Weyl sequence that sweeps every bit of every word.
    let s = 0x243f6a88n
    const next = () => Number((s = (s * 0x5851f42dn + 0x14057b7en) & 0xffffffffn))
    for (let i = 0; i < 500; i++) {
      const counter = [next(), next(), next(), next()]
      const k = [next(), next()]
      expect(philox4x32(counter, k), `counter ${counter.join(' ')}, key ${k.join(' ')}`).toEqual(referencePhilox(counter, k, 10))
    }
  })

  it('the BigInt reference itself reproduces the known-answer vectors', () => {
    for (const [rounds, counter, k, expected] of KAT) expect(referencePhilox(counter, k, rounds)).toEqual(expected)
  })
})

describe('streams', () => {
  it('block 0 of seed 0, purpose code 0, index 0 is the all-zero known-answer vector: its first doubles and normals follow', () => {
    // Counter (block 0, index 0, purpose code 0, 0) and key (0, 0): the first vector of the table.
    expect(RANDOM_PURPOSES['fit-replicas']).toBe(0)
    const [w0, w1, w2, w3] = KAT[0]![3]!
    const u1 = double53(w0!, w1!)
    const u2 = double53(w2!, w3!)
    const u = uniformStream(0, key('fit-replicas'))
    expect([u(), u()]).toEqual([u1, u2])
    // Polar method (Marsaglia & Bray 1964) on these two uniforms, with Math.log: s = 0.263 < 1 is accepted.
    const v1 = 2 * u1 - 1
    const v2 = 2 * u2 - 1
    const s = v1 * v1 + v2 * v2
    expect(s).toBeLessThan(1)
    const f = Math.sqrt(-2 * Math.log(s) / s)
    const z = standardNormals(0, key('fit-replicas'), 2)
    expect(Math.abs(z[0]! / (v1 * f) - 1)).toBeLessThan(4 * Number.EPSILON)
    expect(Math.abs(z[1]! / (v2 * f) - 1)).toBeLessThan(4 * Number.EPSILON)
  })

  it('block b of a stream is Philox of the counter (b, index, purpose code, 0) with the seed as key', () => {
    const seed = 2 ** 40 + 12345
    const u = uniformStream(seed, key('pooling', 7))
    for (let b = 0; b < 5; b++) {
      const w = referencePhilox([b, 7, RANDOM_PURPOSES.pooling, 0], [seed % 2 ** 32, Math.floor(seed / 2 ** 32)], 10)
      expect([u(), u()]).toEqual([double53(w[0]!, w[1]!), double53(w[2]!, w[3]!)])
    }
  })

  it('every purpose has its own counter word', () => {
    const codes = Object.values(RANDOM_PURPOSES)
    expect(new Set(codes).size).toBe(codes.length)
  })

  it('the same seed and key give the same numbers; another seed, index or purpose gives others', () => {
    expect(standardNormals(42, key('fit-replicas', 3), 50)).toEqual(standardNormals(42, key('fit-replicas', 3), 50))
    const a = standardNormals(42, key('fit-replicas', 3), 5)
    for (const other of [standardNormals(43, key('fit-replicas', 3), 5), standardNormals(42, key('fit-replicas', 4), 5), standardNormals(42, key('toy-sets', 3), 5)]) {
      expect(other[0]).not.toBe(a[0])
    }
  })

  it.each([
    ['two purposes', 11, key('pooling', 0), 11, key('toy-sets', 0)],
    ['two indices', 11, key('synthetic', 1), 11, key('synthetic', 2)],
    ['two seeds', 11, key('fit-replicas', 0), 12, key('fit-replicas', 0)]
  ] as const)('%s: streams are uncorrelated (|Pearson r| < 4/√n, n = 20 000)', (_label, seedA, ka, seedB, kb) => {
    const n = 20000
    const a = Array.from(normalStream(seedA, ka).fill(n))
    const b = Array.from(normalStream(seedB, kb).fill(n))
    expect(Math.abs(jStat.corrcoeff(a, b))).toBeLessThan(4 / Math.sqrt(n))
  })

  it('successive normals are uncorrelated: lag-1 autocorrelation below 4/√n (n = 40 000)', () => {
    const z = Array.from(normalStream(3, key('synthetic')).fill(40000))
    expect(Math.abs(jStat.corrcoeff(z.slice(1), z.slice(0, -1)))).toBeLessThan(4 / Math.sqrt(z.length))
  })
})

describe('distributions', () => {
  it('deterministicLog is within 2 ulp of the logarithm over 60 decades', () => {
    let worst = 0
    for (let k = 0; k <= 2000; k++) {
      const x = Math.exp(-69 + (138 * k) / 2000) * (1 + 1e-3 * Math.sin(k))
      const exact = Math.log(x)
      if (exact === 0) continue
      worst = Math.max(worst, Math.abs(deterministicLog(x) - exact) / (Math.abs(exact) * Number.EPSILON))
    }
    expect(worst).toBeLessThanOrEqual(2)
  })

  it('uniforms lie in [0, 1) with mean ½ and variance 1/12 (to 4σ of 40 000 draws)', () => {
    const u = uniformStream(9, key('synthetic'))
    const n = 40000
    let s = 0
    let s2 = 0
    for (let i = 0; i < n; i++) {
      const v = u()
      expect(v >= 0 && v < 1).toBe(true)
      s += v
      s2 += v * v
    }
    const mean = s / n
    // sd of the mean √(1/12/n); of the sample variance √(1/180/n) (uniform: μ₄ − σ⁴ = 1/80 − 1/144)
    expect(Math.abs(mean - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n))
    expect(Math.abs(s2 / n - mean * mean - 1 / 12)).toBeLessThan(4 * Math.sqrt(1 / 180 / n))
  })

  it('uniforms fill 50 equal bins evenly: Pearson χ² below its 0.1% critical value (jstat.chisquare.inv)', () => {
    const u = uniformStream(2024, key('synthetic', 5))
    const n = 50000
    const counts = new Array<number>(50).fill(0)
    for (let i = 0; i < n; i++) counts[Math.floor(u() * 50)]!++
    const expected = n / 50
    const chi2 = counts.reduce((sum, c) => sum + (c - expected) ** 2 / expected, 0)
    expect(chi2).toBeLessThan(jStat.chisquare.inv(0.999, 49))
  })

  it('normals pass a Kolmogorov–Smirnov test against jstat.normal.cdf at the 1% level (D < 1.628/√n)', () => {
    const n = 20000
    const z = Array.from(standardNormals(2025, key('synthetic'), n)).sort((a, b) => a - b)
    let d = 0
    z.forEach((v, i) => {
      const f = jStat.normal.cdf(v, 0, 1)
      d = Math.max(d, Math.abs(f - i / n), Math.abs(f - (i + 1) / n))
    })
    // 1.628 is the 99% quantile of the Kolmogorov distribution (standard KS tables, from memory).
    expect(d).toBeLessThan(1.628 / Math.sqrt(n))
  })

  it('normals have mean 0, variance 1 and fourth moment 3 within 5 standard errors (n = 40 000)', () => {
    const z = Array.from(normalStream(21, key('synthetic', 9)).fill(40000))
    const n = z.length
    // standard errors for a Gaussian sample: 1/√n, √(2/n), √(96/n) (E z⁸ − (E z⁴)² = 105 − 9)
    expect(Math.abs(jStat.mean(z))).toBeLessThan(5 / Math.sqrt(n))
    expect(Math.abs(jStat.stdev(z, true) ** 2 - 1)).toBeLessThan(5 * Math.sqrt(2 / n))
    expect(Math.abs(z.reduce((s, v) => s + v ** 4, 0) / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n))
  })
})

describe('bad input', () => {
  it.each([
    ['a negative seed', () => uniformStream(-1, key('synthetic')), /seed/],
    ['a fractional seed', () => uniformStream(1.5, key('synthetic')), /seed/],
    ['a seed beyond 2⁵³', () => uniformStream(2 ** 53, key('synthetic')), /seed/],
    ['a stream index beyond 2³²', () => uniformStream(1, key('synthetic', 2 ** 32)), /stream index/],
    ['an unknown purpose', () => uniformStream(1, { purpose: 'dice' as StreamKey['purpose'], index: 0 }), /unknown random-stream purpose 'dice'/],
    ['a negative count', () => normalStream(1, key('synthetic')).fill(-1), /whole number/],
    ['the log of 0', () => deterministicLog(0), /x > 0/]
  ])('refuses %s', (_label, f, message) => {
    expect(f).toThrow(RangeError)
    expect(f).toThrow(message)
  })
})
