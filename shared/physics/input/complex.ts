/**
 * Minimal complex arithmetic on plain `{ re, im }` records, for Mellin moments and LO anomalous
 * dimensions. Every function returns a new value and never mutates its arguments.
 */

/** A complex number re + i·im. */
export interface Complex {
  re: number
  im: number
}

/**
 * The complex number re + i·im.
 * @example complex(1, 2) // { re: 1, im: 2 }
 */
export function complex(re: number, im = 0): Complex {
  return { re, im }
}

/** a + b. @example cAdd(complex(1, 2), complex(3, -1)) // { re: 4, im: 1 } */
export function cAdd(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im }
}

/** a − b. @example cSub(complex(1, 2), complex(3, -1)) // { re: -2, im: 3 } */
export function cSub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im }
}

/** a·b. @example cMul(complex(0, 1), complex(0, 1)) // { re: -1, im: 0 } */
export function cMul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re }
}

/** s·a for real s. @example cScale(complex(1, 2), 2) // { re: 2, im: 4 } */
export function cScale(a: Complex, s: number): Complex {
  return { re: a.re * s, im: a.im * s }
}

/**
 * a / b by Smith's algorithm (avoids overflow for large |b|).
 * @example cDiv(complex(1, 0), complex(0, 1)) // { re: 0, im: -1 }
 */
export function cDiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re
    const d = b.re + b.im * r
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d }
  }
  const r = b.re / b.im
  const d = b.re * r + b.im
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d }
}

/** 1 / a. @example cInv(complex(2, 0)) // { re: 0.5, im: 0 } */
export function cInv(a: Complex): Complex {
  return cDiv({ re: 1, im: 0 }, a)
}

/** Principal logarithm ln|a| + i·arg a. @example cLog(complex(-1, 0)) // { re: 0, im: π } */
export function cLog(a: Complex): Complex {
  return { re: Math.log(Math.hypot(a.re, a.im)), im: Math.atan2(a.im, a.re) }
}

/** e^a. @example cExp(complex(0, Math.PI)) // { re: -1, im: ~0 } */
export function cExp(a: Complex): Complex {
  const m = Math.exp(a.re)
  return { re: m * Math.cos(a.im), im: m * Math.sin(a.im) }
}

/** Principal square root (branch cut on the negative real axis). @example cSqrt(complex(-4)) // { re: 0, im: 2 } */
export function cSqrt(a: Complex): Complex {
  const r = Math.hypot(a.re, a.im)
  if (r === 0) return { re: 0, im: 0 }
  const t = Math.sqrt((r + Math.abs(a.re)) / 2)
  if (a.re >= 0) return { re: t, im: a.im / (2 * t) }
  return { re: Math.abs(a.im) / (2 * t), im: a.im >= 0 ? t : -t }
}
