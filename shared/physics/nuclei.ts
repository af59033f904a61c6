/**
 * Element symbols and the usual mass numbers of common targets, for naming the sets of a nuclear
 * family ("Ostrand-25-Fe56") and for requests written as symbols ("Fe" = ⁵⁶Fe). The symbols are
 * the IUPAC ones (from memory); the default mass numbers are the most abundant isotope of each
 * listed element (from memory), the targets experiments usually name.
 */
import type { Nucleus } from './input/mass-number'

const SYMBOLS = (
  'H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Ge As Se Br Kr '
  + 'Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu '
  + 'Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn Fr Ra Ac Th Pa U Np Pu Am Cm Bk Cf Es Fm Md No Lr Rf Db Sg '
  + 'Bh Hs Mt Ds Rg Cn Nh Fl Mc Lv Ts Og'
).split(' ')

/** Mass number of the usual target for some elements (most abundant isotope; deuterium as "D"). */
const USUAL_A: Readonly<Record<string, Nucleus>> = Object.freeze({
  D: { z: 1, a: 2 }, He: { z: 2, a: 4 }, Li: { z: 3, a: 7 }, Be: { z: 4, a: 9 }, C: { z: 6, a: 12 },
  N: { z: 7, a: 14 }, O: { z: 8, a: 16 }, Al: { z: 13, a: 27 }, Ar: { z: 18, a: 40 }, Ca: { z: 20, a: 40 },
  Fe: { z: 26, a: 56 }, Cu: { z: 29, a: 63 }, Kr: { z: 36, a: 84 }, Ag: { z: 47, a: 107 }, Sn: { z: 50, a: 120 },
  Xe: { z: 54, a: 132 }, W: { z: 74, a: 184 }, Au: { z: 79, a: 197 }, Pb: { z: 82, a: 208 }, U: { z: 92, a: 238 }
})

/**
 * The element symbol of Z ("D" for the deuteron Z = 1, A = 2).
 * @example elementSymbol(26) // 'Fe'
 */
export function elementSymbol(z: number, a?: number): string {
  if (z === 1 && a === 2) return 'D'
  const s = SYMBOLS[z - 1]
  if (!s) throw new RangeError(`no element has Z = ${z}`)
  return s
}

/**
 * The usual target nucleus of a symbol ("Fe" → Z = 26, A = 56), or undefined.
 * @example usualNucleus('Pb') // { z: 82, a: 208 }
 */
export function usualNucleus(symbol: string): Nucleus | undefined {
  return Object.hasOwn(USUAL_A, symbol) ? { ...USUAL_A[symbol]! } : undefined
}

/**
 * The name of a family's set for one nucleus: "<document name>-<symbol><A>".
 * @example nucleusSetName('Ostrand-25', { z: 26, a: 56 }) // 'Ostrand-25-Fe56'
 */
export function nucleusSetName(documentName: string, nucleus: Nucleus): string {
  const symbol = elementSymbol(nucleus.z, nucleus.a)
  return `${documentName}-${symbol}${symbol === 'D' ? '' : nucleus.a}`
}
