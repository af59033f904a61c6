/**
 * A small seeded random-number generator for reproducible Monte-Carlo replicas: xoshiro128**
 * seeded by SplitMix64, with Box–Muller for standard normal deviates.
 */

const MASK_64 = (1n << 64n) - 1n

/**
 * SplitMix64 (G. L. Steele, D. Lea and C. H. Flood, "Fast splittable pseudorandom number
 * generators", OOPSLA 2014; reference code by S. Vigna, prng.di.unimi.it/splitmix64.c), used only
 * to expand a seed into a generator state, as its authors recommend.
 *
 * Domain: any seed, reduced modulo 2⁶⁴. Result: `count` successive 64-bit outputs as bigints.
 * @example splitMix64(0n, 1) // [0xe220a8397b1dcdafn]
 */
export function splitMix64(seed: bigint, count: number): bigint[] {
  let x = BigInt.asUintN(64, seed)
  const out: bigint[] = []
  for (let i = 0; i < count; i++) {
    x = (x + 0x9E3779B97F4A7C15n) & MASK_64
    let z = x
    z = ((z ^ (z >> 30n)) * 0xBF58476D1CE4E5B9n) & MASK_64
    z = ((z ^ (z >> 27n)) * 0x94D049BB133111EBn) & MASK_64
    out.push(z ^ (z >> 31n))
  }
  return out
}

/**
 * xoshiro128** 1.1 (D. Blackman and S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM Trans. Math. Softw. 47 (2021) 36, arXiv:1805.01407): 128 bits of state, period 2¹²⁸ − 1,
 * 32-bit outputs. State from SplitMix64(seed): the first output's low and high 32-bit words are
 * s₀, s₁, the second's are s₂, s₃. Integer arithmetic only (Math.imul), so the same seed gives
 * the same stream on any machine.
 *
 * Domain: seed an integer 0 ≤ seed ≤ 2⁵³ − 1.
 * @throws RangeError for another seed.
 * @example new Xoshiro128StarStar(42).nextUint32() // the same 32-bit integer on every run
 */
export class Xoshiro128StarStar {
  private readonly s = new Uint32Array(4)

  constructor(seed: number) {
    if (!Number.isSafeInteger(seed) || seed < 0) {
      throw new RangeError(`A random seed must be a whole number from 0 to 2^53 − 1; got ${seed}.`)
    }
    const [a, b] = splitMix64(BigInt(seed), 2) as [bigint, bigint]
    this.s[0] = Number(a & 0xFFFFFFFFn)
    this.s[1] = Number(a >> 32n)
    this.s[2] = Number(b & 0xFFFFFFFFn)
    this.s[3] = Number(b >> 32n)
  }

  /**
   * A generator started from an explicit 128-bit state (four unsigned 32-bit words s₀..s₃, not
   * all zero), e.g. one saved with `state()` or a test vector of the reference code.
   * @throws RangeError for words that are not 32-bit unsigned integers, or an all-zero state.
   * @example Xoshiro128StarStar.fromState([1, 2, 3, 4]).nextUint32() // 11520
   */
  static fromState(words: ArrayLike<number>): Xoshiro128StarStar {
    if (words.length !== 4) throw new RangeError(`A xoshiro128** state has 4 words; got ${words.length}.`)
    for (let i = 0; i < 4; i++) {
      const w = words[i]!
      if (!Number.isInteger(w) || w < 0 || w > 0xFFFFFFFF) throw new RangeError(`State word ${i} must be an integer from 0 to 2^32 − 1; got ${w}.`)
    }
    if (words[0] === 0 && words[1] === 0 && words[2] === 0 && words[3] === 0) {
      throw new RangeError('The all-zero state is a fixed point of xoshiro128**: give at least one non-zero word.')
    }
    const generator = new Xoshiro128StarStar(0)
    generator.s.set(Array.from(words))
    return generator
  }

  /** A copy of the current state s₀..s₃ (to resume the stream later with fromState). */
  state(): Uint32Array {
    return Uint32Array.from(this.s)
  }

  /** Next output, an integer in [0, 2³²). */
  nextUint32(): number {
    const s = this.s
    let s0 = s[0]!
    let s1 = s[1]!
    let s2 = s[2]!
    let s3 = s[3]!
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0
    const t = s1 << 9
    s2 ^= s0
    s3 ^= s1
    s1 ^= s2
    s0 ^= s3
    s2 ^= t
    s3 = rotl(s3, 11)
    s[0] = s0
    s[1] = s1
    s[2] = s2
    s[3] = s3
    return result
  }

  /**
   * Uniform double in [0, 1) with 53 random bits, from two outputs:
   * ((a >>> 5)·2²⁶ + (b >>> 6)) / 2⁵³ (the construction of Matsumoto–Nishimura's genrand_res53).
   */
  nextDouble(): number {
    const a = this.nextUint32() >>> 5
    const b = this.nextUint32() >>> 6
    return (a * 67108864 + b) / 9007199254740992
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k))
}

/** A stream of standard normal deviates. */
export interface NormalGenerator {
  /** Next deviate, N(0, 1). */
  next(): number
  /** A new Float64Array of the next `count` deviates. */
  fill(count: number): Float64Array
}

/**
 * Seeded standard normal generator: Box–Muller (G. E. P. Box and M. E. Muller, Ann. Math. Stat.
 * 29 (1958) 610) on xoshiro128** uniforms, z₁ = √(−2 ln u₁) cos 2πu₂, z₂ = √(−2 ln u₁) sin 2πu₂ with
 * u₁ ∈ (0, 1], both deviates used in turn.
 *
 * Domain: seed an integer 0 ≤ seed ≤ 2⁵³ − 1. Reproducibility: the uniforms are bit-identical
 * everywhere; the deviates are bit-identical on any machine running the same JavaScript engine
 * (Node's V8 implements log, cos and sin by fixed software routines) and agree to the last few
 * bits elsewhere.
 * @throws RangeError for a bad seed, or a negative or non-integer count in fill.
 * @example createNormalGenerator(7).fill(1000) // mean ≈ 0, sd ≈ 1 within ~3%
 */
export function createNormalGenerator(seed: number): NormalGenerator {
  const uniform = new Xoshiro128StarStar(seed)
  let spare: number | undefined
  const next = (): number => {
    if (spare !== undefined) {
      const z = spare
      spare = undefined
      return z
    }
    const radius = Math.sqrt(-2 * Math.log(1 - uniform.nextDouble()))
    const angle = 2 * Math.PI * uniform.nextDouble()
    spare = radius * Math.sin(angle)
    return radius * Math.cos(angle)
  }
  return {
    next,
    fill(count: number) {
      if (!Number.isInteger(count) || count < 0) throw new RangeError(`Cannot draw ${count} normal deviates: give a whole number ≥ 0.`)
      const out = new Float64Array(count)
      for (let i = 0; i < count; i++) out[i] = next()
      return out
    }
  }
}
