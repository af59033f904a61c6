import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { createNormalGenerator, splitMix64, Xoshiro128StarStar } from '../../../../shared/physics/uncertainty/prng'

describe('SplitMix64 seeder', () => {
  it('reproduces the reference outputs for seed 0 (Vigna, prng.di.unimi.it/splitmix64.c)', () => {
    // First four outputs with state 0, the seeding test vector quoted with the reference code;
    // the C reference compiled with gcc prints the same.
    expect(splitMix64(0n, 4)).toEqual([0xE220A8397B1DCDAFn, 0x6E789E6AA1B965F4n, 0x06C45D188009454Fn, 0xF88BB8A8724C81ECn])
  })
})

describe('xoshiro128**', () => {
  it('state (1, 2, 3, 4): first output by hand, rotl(2·5, 7)·9 = 1280·9 = 11520', () => {
    expect(Xoshiro128StarStar.fromState([1, 2, 3, 4]).nextUint32()).toBe(11520)
  })

  it('state (1, 2, 3, 4): matches the reference C code of Blackman & Vigna (arXiv:1805.01407)', () => {
    // Outputs of the published xoshiro128starstar.c next() (prng.di.unimi.it), transcribed and
    // compiled with gcc for this test; an implementation independent of the TypeScript one.
    const g = Xoshiro128StarStar.fromState([1, 2, 3, 4])
    expect(Array.from({ length: 6 }, () => g.nextUint32())).toEqual([11520, 0, 5927040, 70819200, 2031721883, 1637235492])
  })

  it('seed 42 via SplitMix64 (low word first): matches the same C code', () => {
    const g = new Xoshiro128StarStar(42)
    expect(Array.from({ length: 4 }, () => g.nextUint32())).toEqual([1776835114, 4165204688, 17111135, 2317295270])
  })

  it('resumes from a saved state', () => {
    const g = new Xoshiro128StarStar(9)
    g.nextUint32()
    const h = Xoshiro128StarStar.fromState(g.state())
    expect(h.nextUint32()).toBe(g.nextUint32())
  })

  it('uniform doubles lie in [0, 1) with mean ½ and variance 1/12', () => {
    const g = new Xoshiro128StarStar(5)
    const u = Array.from({ length: 20000 }, () => g.nextDouble())
    expect(Math.min(...u)).toBeGreaterThanOrEqual(0)
    expect(Math.max(...u)).toBeLessThan(1)
    // standard errors: √(1/12/20000) ≈ 0.002 for the mean, ≈ 0.0005 for the variance; 5σ margins
    expect(Math.abs(jStat.mean(u) - 0.5)).toBeLessThan(0.01)
    expect(Math.abs(jStat.stdev(u, true) ** 2 - 1 / 12)).toBeLessThan(0.0025)
  })

  it.each([-1, 1.5, Number.NaN, 2 ** 53])('rejects seed %s', (seed) => {
    expect(() => new Xoshiro128StarStar(seed)).toThrow(RangeError)
  })

  it('rejects the all-zero state', () => {
    expect(() => Xoshiro128StarStar.fromState([0, 0, 0, 0])).toThrow(/fixed point/)
  })
})

describe('Box–Muller normal deviates', () => {
  it('same seed, same stream; different seed, different stream', () => {
    expect(createNormalGenerator(3).fill(50)).toEqual(createNormalGenerator(3).fill(50))
    expect(createNormalGenerator(3).fill(5)).not.toEqual(createNormalGenerator(4).fill(5))
  })

  it('passes a Kolmogorov–Smirnov test against jstat.normal.cdf (n = 20000)', () => {
    const z = createNormalGenerator(11).fill(20000).sort()
    let d = 0
    z.forEach((v, i) => {
      const f = jStat.normal.cdf(v, 0, 1)
      d = Math.max(d, Math.abs(f - i / z.length), Math.abs(f - (i + 1) / z.length))
    })
    // 5% critical value of the Kolmogorov distribution, 1.358/√n (from memory of the
    // standard KS table, e.g. Numerical Recipes §14.3)
    expect(d).toBeLessThan(1.358 / Math.sqrt(z.length))
  })

  it('mean 0, variance 1, fourth moment 3 (Gaussian), within 5 standard errors', () => {
    const z = Array.from(createNormalGenerator(21).fill(40000))
    const n = z.length
    expect(Math.abs(jStat.mean(z))).toBeLessThan(5 / Math.sqrt(n))
    expect(Math.abs(jStat.stdev(z, true) ** 2 - 1)).toBeLessThan(5 * Math.sqrt(2 / n))
    expect(Math.abs(z.reduce((s, v) => s + v ** 4, 0) / n - 3)).toBeLessThan(5 * Math.sqrt(96 / n))
  })

  it('rejects a bad count', () => {
    expect(() => createNormalGenerator(1).fill(-1)).toThrow(RangeError)
  })
})
