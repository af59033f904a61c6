/**
 * LO anomalous dimensions γ_ij(N) = ∫₀¹ z^{N−1} P_ij(z) dz of the splitting functions in
 * splitting.ts, for complex N (Ellis–Stirling–Webber, "QCD and Collider Physics", ch. 4;
 * S₁(N) = ψ(N+1) + γ_E):
 *   γ_qq = C_F [3/2 + 1/(N(N+1)) − 2S₁(N)],      γ_qg = T_R (N²+N+2)/(N(N+1)(N+2)) (per flavour),
 *   γ_gq = C_F (N²+N+2)/((N−1)N(N+1)),
 *   γ_gg = 2C_A [1/(N(N−1)) + 1/((N+1)(N+2)) − S₁(N)] + (11C_A − 4n_f T_R)/6.
 * Momentum conservation: γ_qq(2) + γ_gq(2) = 0 and 2n_f γ_qg(2) + γ_gg(2) = 0.
 */
import { cAdd, cDiv, cInv, cMul, cScale, complex, type Complex } from '../input/complex'
import { harmonicS1 } from '../input/special-functions'
import { CA, CF, TR, pggDelta } from './splitting'

const shift = (n: Complex, k: number) => complex(n.re + k, n.im)

/** γ_qq(N); domain Re N > 0. @example gammaQQ(complex(1)) // { re: 0, im: 0 } (quark-number conservation) */
export function gammaQQ(n: Complex): Complex {
  const s1 = harmonicS1(n)
  const t = cInv(cMul(n, shift(n, 1)))
  return cScale(complex(1.5 - 2 * s1.re + t.re, -2 * s1.im + t.im), CF)
}

/** γ_qg(N) for one flavour; domain Re N > 0. @example gammaQG(complex(2)) // 1/6 */
export function gammaQG(n: Complex): Complex {
  const num = cAdd(cMul(n, shift(n, 1)), complex(2, 0))
  return cScale(cDiv(num, cMul(cMul(n, shift(n, 1)), shift(n, 2))), TR)
}

/** γ_gq(N); domain Re N > 1. @example gammaGQ(complex(2)) // 16/9 */
export function gammaGQ(n: Complex): Complex {
  const num = cAdd(cMul(n, shift(n, 1)), complex(2, 0))
  return cScale(cDiv(num, cMul(cMul(shift(n, -1), n), shift(n, 1))), CF)
}

/** γ_gg(N) with n_f active flavours; domain Re N > 1. @example gammaGG(complex(2), 4) // −4/3 */
export function gammaGG(n: Complex, nf: number): Complex {
  const s1 = harmonicS1(n)
  const a = cInv(cMul(n, shift(n, -1)))
  const b = cInv(cMul(shift(n, 1), shift(n, 2)))
  const core = complex(a.re + b.re - s1.re, a.im + b.im - s1.im)
  return complex(2 * CA * core.re + pggDelta(nf), 2 * CA * core.im)
}
