/**
 * Reproducible random numbers for Monte-Carlo replicas: the same seed gives the same numbers on
 * any machine and in any JavaScript engine.
 *
 * - Uniform bits: Philox4x32-10, the counter-based generator of J. K. Salmon, M. A. Moraes,
 *   R. O. Dror and D. E. Shaw, "Parallel random numbers: as easy as 1, 2, 3", SC'11 (2011),
 *   checked against the known-answer vectors of the authors' Random123 distribution. Counter
 *   (block, stream, 0, 0), key (seed mod 2³², ⌊seed/2³²⌋); stream r is replica r, so a replica
 *   does not depend on how many others are drawn.
 * - Uniform doubles in [0, 1): 53 bits from two words, (w₀ ≫ 5)·2²⁶ + (w₁ ≫ 6) over 2⁵³.
 * - Normal deviates: the polar method of G. Marsaglia and T. A. Bray, SIAM Review 6 (1964) 260,
 *   with its logarithm computed here from IEEE-754 basic operations only (Math.log may differ
 *   between engines in the last bit; +, −, ×, ÷ and √ are correctly rounded everywhere).
 */

const M0 = 0xd2511f53
const M1 = 0xcd9e8d57
const W0 = 0x9e3779b9
const W1 = 0xbb67ae85

/** High 32 bits of the 64-bit product of two unsigned 32-bit integers, exactly. */
function mulHi(a: number, b: number): number {
  const p1 = a * (b & 0xffff)
  const p2 = a * (b >>> 16)
  const low = p1 + (p2 % 65536) * 65536
  return (Math.floor(p2 / 65536) + Math.floor(low / 4294967296)) >>> 0
}

/**
 * One Philox4x32-10 block: four 32-bit words from a 128-bit counter and a 64-bit key.
 * @param counter four unsigned 32-bit words.
 * @param key two unsigned 32-bit words.
 * @returns four unsigned 32-bit words.
 * @example philox4x32([0, 0, 0, 0], [0, 0]) // [0x6627e8d5, 0xe169c58d, 0xbc57ac4c, 0x9b00dbd8]
 */
export function philox4x32(counter: readonly number[], key: readonly number[]): [number, number, number, number] {
  let c0 = counter[0]! >>> 0
  let c1 = counter[1]! >>> 0
  let c2 = counter[2]! >>> 0
  let c3 = counter[3]! >>> 0
  let k0 = key[0]! >>> 0
  let k1 = key[1]! >>> 0
  for (let round = 0; round < 10; round++) {
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

/**
 * A stream of uniform doubles in [0, 1) for one (seed, stream) pair, drawn from consecutive
 * Philox blocks (two doubles per block).
 * @param seed integer 0 ≤ seed ≤ 2⁵³ − 1.
 * @param stream integer 0 ≤ stream < 2³² (the replica index).
 * @throws RangeError for a bad seed or stream.
 * @example const u = uniformStream(42, 0); u() // same value on every machine
 */
export function uniformStream(seed: number, stream: number): () => number {
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`the seed must be an integer 0 … 2^53 − 1; got ${seed}`)
  if (!Number.isInteger(stream) || stream < 0 || stream >= 4294967296) throw new RangeError(`the stream index must be an integer 0 … 2^32 − 1; got ${stream}`)
  const key = [seed % 4294967296, Math.floor(seed / 4294967296)]
  let block = 0
  let buf: number[] = []
  return () => {
    if (buf.length === 0) {
      const w = philox4x32([block, stream, 0, 0], key)
      block++
      if (block >= 4294967296) throw new RangeError('random stream exhausted (2^32 blocks)')
      buf = [
        ((w[0] >>> 5) * 67108864 + (w[1] >>> 6)) / 9007199254740992,
        ((w[2] >>> 5) * 67108864 + (w[3] >>> 6)) / 9007199254740992
      ]
    }
    return buf.shift()!
  }
}

/**
 * `count` standard normal deviates (mean 0, variance 1) for one (seed, stream) pair, by the
 * Marsaglia–Bray polar method on `uniformStream` (see the module comment).
 * @example standardNormals(42, 3, 22) // replica 3's 22 deviates
 */
export function standardNormals(seed: number, stream: number, count: number): Float64Array {
  if (!Number.isInteger(count) || count < 0) throw new RangeError(`count must be a non-negative integer; got ${count}`)
  const u = uniformStream(seed, stream)
  const out = new Float64Array(count)
  let i = 0
  while (i < count) {
    const v1 = 2 * u() - 1
    const v2 = 2 * u() - 1
    const s = v1 * v1 + v2 * v2
    if (s >= 1 || s === 0) continue
    const f = Math.sqrt((-2 * deterministicLog(s)) / s)
    out[i++] = v1 * f
    if (i < count) out[i++] = v2 * f
  }
  return out
}
