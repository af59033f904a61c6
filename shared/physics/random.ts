/**
 * The engine's one random-number generator: reproducible uniform and normal deviates, the same
 * for a given seed on any machine and in any JavaScript engine, with a separate stream for every
 * consumer (see shared/physics/README.md, "Random numbers").
 *
 * - Uniform bits: Philox4x32-10, the counter-based generator of J. K. Salmon, M. A. Moraes,
 *   R. O. Dror and D. E. Shaw, "Parallel random numbers: as easy as 1, 2, 3", Proc. SC11 (2011),
 *   doi:10.1145/2063384.2063405. Block b of a stream is philox(counter, key) with the 128-bit
 *   counter (b, index, purpose code, 0) and the 64-bit key (seed mod 2³², ⌊seed/2³²⌋).
 * - Streams: a consumer names its stream with a {@link StreamKey} (a purpose from
 *   {@link RANDOM_PURPOSES} and an index, e.g. the replica number). Distinct keys give distinct
 *   counters for every block, and for a fixed seed Philox is a bijection of the counter, so two
 *   streams never share a block: they cannot overlap, however long they run (2³² blocks each).
 * - Uniform doubles in [0, 1): 53 bits from two words, ((w₀ ≫ 5)·2²⁶ + (w₁ ≫ 6))/2⁵³ (common
 *   practice, the construction of Matsumoto and Nishimura's genrand_res53), two per block.
 * - Normal deviates: the polar method of G. Marsaglia and T. A. Bray, SIAM Review 6 (1964) 260,
 *   with its logarithm computed from IEEE-754 basic operations only (Math.log may differ between
 *   engines in the last bit; +, −, ×, ÷ and √ are correctly rounded everywhere).
 */

/**
 * Who draws from a stream, and its purpose code (counter word 2). Each purpose has its own code,
 * so two purposes never share numbers.
 */
export const RANDOM_PURPOSES = {
  /** Monte-Carlo replicas of a fit's parameters (fit/replicas.ts); index = replica number 0…N−1. */
  'fit-replicas': 0,
  /** Hessian → replica conversion when sets are pooled (uncertainty/pooling.ts); index = the set's position. */
  'pooling': 1,
  /** TOY replica sets (sets/toy.ts); index 0. */
  'toy-sets': 2,
  /** Made-up data for benchmarks, tests and examples, never part of a stored result; index free. */
  'synthetic': 3,
  /** Unweighting a reweighted replica set (impact/unweighting.ts); index 0. */
  'unweighting': 4
} as const

/** A purpose of {@link RANDOM_PURPOSES}. */
export type RandomPurpose = keyof typeof RANDOM_PURPOSES

/** Names one stream of a seed: the consumer's purpose and an index within it (0 … 2³² − 1). */
export interface StreamKey {
  purpose: RandomPurpose
  index: number
}

const M0 = 0xd2511f53
const M1 = 0xcd9e8d57
const W0 = 0x9e3779b9
const W1 = 0xbb67ae85
const TWO_32 = 4294967296

/** High 32 bits of the 64-bit product of two unsigned 32-bit integers, exactly. */
function mulHi(a: number, b: number): number {
  const p1 = a * (b & 0xffff)
  const p2 = a * (b >>> 16)
  const low = p1 + (p2 % 65536) * 65536
  return (Math.floor(p2 / 65536) + Math.floor(low / TWO_32)) >>> 0
}

/**
 * One Philox4x32 block: four 32-bit words from a 128-bit counter and a 64-bit key, with `rounds`
 * rounds (10 in the engine; 7 only to check the key schedule against published vectors).
 * @param counter four unsigned 32-bit words.
 * @param key two unsigned 32-bit words.
 * @returns four unsigned 32-bit words.
 * @example philox4x32([0, 0, 0, 0], [0, 0]) // [0x6627e8d5, 0xe169c58d, 0xbc57ac4c, 0x9b00dbd8]
 */
export function philox4x32(
  counter: readonly number[],
  key: readonly number[],
  rounds = 10
): [number, number, number, number] {
  let c0 = counter[0]! >>> 0
  let c1 = counter[1]! >>> 0
  let c2 = counter[2]! >>> 0
  let c3 = counter[3]! >>> 0
  let k0 = key[0]! >>> 0
  let k1 = key[1]! >>> 0
  for (let round = 0; round < rounds; round++) {
    if (round > 0) {
      k0 = (k0 + W0) >>> 0
      k1 = (k1 + W1) >>> 0
    }
    const hi0 = mulHi(M0, c0)
    const lo0 = Math.imul(M0, c0) >>> 0
    const hi1 = mulHi(M1, c2)
    const lo1 = Math.imul(M1, c2) >>> 0
    const n0 = (hi1 ^ c1 ^ k0) >>> 0
    const n2 = (hi0 ^ c3 ^ k1) >>> 0
    c0 = n0
    c1 = lo1
    c2 = n2
    c3 = lo0
  }
  return [c0, c1, c2, c3]
}

const LN2_HI = 6.93147180369123816490e-1
const LN2_LO = 1.90821492927058770002e-10

/**
 * Natural logarithm of x > 0 from IEEE-754 basic operations only, so that it is bit-identical on
 * every machine: x = m·2^e with m in [√½, √2) by exact scaling, ln m = 2 atanh((m−1)/(m+1)) by its
 * series to t²⁵, ln 2 split in two parts (fdlibm's constants).
 * Accuracy: within 2 ulp of the exact logarithm.
 * @throws RangeError for x ≤ 0 or a non-finite x.
 * @example deterministicLog(Math.E) // 1 (to 2 ulp)
 */
export function deterministicLog(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`deterministicLog needs a finite x > 0; got ${x}`)
  let m = x
  let e = 0
  while (m >= 1.4142135623730951) { m *= 0.5; e++ }
  while (m < 0.7071067811865476) { m *= 2; e-- }
  const t = (m - 1) / (m + 1)
  const t2 = t * t
  // 2(t + t³/3 + … + t²⁵/25), Horner in t²
  let s = 1 / 25
  for (let k = 23; k >= 1; k -= 2) s = 1 / k + t2 * s
  const lnm = 2 * t * s
  return e * LN2_HI + (e * LN2_LO + lnm)
}

function checkSeed(seed: number): void {
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`the seed must be an integer 0 … 2^53 − 1; got ${seed}`)
}

/**
 * The counter words (index, purpose code) of a stream, checked.
 * @throws RangeError for an unknown purpose or an index outside 0 … 2³² − 1.
 */
function streamWords(key: StreamKey): [number, number] {
  const known = Object.prototype.hasOwnProperty.call(RANDOM_PURPOSES, key.purpose)
  if (!known) {
    throw new RangeError(`unknown random-stream purpose '${String(key.purpose)}'; expected one of ${Object.keys(RANDOM_PURPOSES).join(', ')}`)
  }
  const code = RANDOM_PURPOSES[key.purpose]
  if (!Number.isInteger(key.index) || key.index < 0 || key.index >= TWO_32) {
    throw new RangeError(`the stream index must be an integer 0 … 2^32 − 1; got ${key.index}`)
  }
  return [key.index, code]
}

/**
 * Uniform doubles in [0, 1) of one stream of `seed`, drawn from consecutive Philox blocks
 * (two doubles per block).
 * @param seed integer 0 ≤ seed ≤ 2⁵³ − 1.
 * @throws RangeError for a bad seed or stream key, or after 2³² blocks.
 * @example const u = uniformStream(42, { purpose: 'synthetic', index: 0 }); u() // same value on every machine
 */
export function uniformStream(seed: number, key: StreamKey): () => number {
  checkSeed(seed)
  const [index, code] = streamWords(key)
  const seedWords = [seed % TWO_32, Math.floor(seed / TWO_32)]
  let block = 0
  let second = 0
  let pending = false
  return () => {
    if (pending) {
      pending = false
      return second
    }
    if (block >= TWO_32) throw new RangeError('random stream exhausted (2^32 blocks)')
    const w = philox4x32([block, index, code, 0], seedWords)
    block++
    second = ((w[2] >>> 5) * 67108864 + (w[3] >>> 6)) / 9007199254740992
    pending = true
    return ((w[0] >>> 5) * 67108864 + (w[1] >>> 6)) / 9007199254740992
  }
}

/** A stream of standard normal deviates (mean 0, variance 1). */
export interface NormalGenerator {
  /** Next deviate. */
  next(): number
  /** A new Float64Array of the next `count` deviates. */
  fill(count: number): Float64Array
}

/**
 * Standard normal deviates of one stream of `seed`, by the Marsaglia–Bray polar method on
 * {@link uniformStream}: v₁,₂ = 2u − 1 until 0 < s = v₁² + v₂² < 1, then v₁·f and v₂·f with
 * f = √(−2 ln s / s), used in turn.
 * @param seed integer 0 ≤ seed ≤ 2⁵³ − 1.
 * @throws RangeError for a bad seed or stream key; `fill` for a negative or fractional count.
 * @example normalStream(1, { purpose: 'pooling', index: 0 }).fill(1000) // mean ≈ 0, sd ≈ 1
 */
export function normalStream(seed: number, key: StreamKey): NormalGenerator {
  const u = uniformStream(seed, key)
  let spare = 0
  let hasSpare = false
  const next = (): number => {
    if (hasSpare) {
      hasSpare = false
      return spare
    }
    for (;;) {
      const v1 = 2 * u() - 1
      const v2 = 2 * u() - 1
      const s = v1 * v1 + v2 * v2
      if (s >= 1 || s === 0) continue
      const f = Math.sqrt((-2 * deterministicLog(s)) / s)
      spare = v2 * f
      hasSpare = true
      return v1 * f
    }
  }
  return {
    next,
    fill(count: number) {
      if (!Number.isInteger(count) || count < 0) throw new RangeError(`cannot draw ${count} normal deviates: give a whole number ≥ 0`)
      const out = new Float64Array(count)
      for (let i = 0; i < count; i++) out[i] = next()
      return out
    }
  }
}

/**
 * The first `count` standard normal deviates of one stream of `seed` ({@link normalStream}).
 * @example standardNormals(42, { purpose: 'fit-replicas', index: 3 }, 22) // replica 3's 22 deviates
 */
export function standardNormals(seed: number, key: StreamKey, count: number): Float64Array {
  return normalStream(seed, key).fill(count)
}
