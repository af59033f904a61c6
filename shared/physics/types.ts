/**
 * Core data types of the Sheaf physics engine. Pure data, no I/O, no framework imports.
 *
 * Conventions (see DEVELOPERS.md, "Engine conventions"):
 * - Flavours are PDG Monte-Carlo codes: 1 d, 2 u, 3 s, 4 c, 5 b, 6 t, negative for antiquarks,
 *   21 gluon, 22 photon.
 * - Grids hold x·f(x, Q²) (momentum densities, dimensionless), never f itself.
 * - Q² in GeV², masses in GeV, cross-sections in pb unless a name says otherwise.
 */

import type { SetDensity } from './fragmentation/species'

/** PDG code of a parton. */
export type Pdg = number

/** Kind of an error set: how its members are to be combined. */
export type SetKind = 'hessian-pairs' | 'hessian-one-sided' | 'replicas'

/**
 * One member's values on a grid: `values[(iq * nx + ix) * nf + ifl]` = x·f(x_ix, Q²_iq) of
 * flavour `flavours[ifl]` (flavour fastest, then x, then Q²).
 */
export interface MemberGrid {
  /** x nodes, strictly increasing, in (0, 1). */
  x: Float64Array
  /**
   * Q² nodes in GeV², > 0, strictly increasing except at a heavy-flavour threshold m_h², which
   * may appear twice in a row (value just below, then just above the threshold). Interpolation
   * never crosses such a pair: each run between repeated nodes is its own sub-grid.
   */
  q2: Float64Array
  /** PDG codes, one per flavour slot. */
  flavours: Pdg[]
  /** x·f values, length x.length * q2.length * flavours.length. */
  values: Float64Array
}

/** Target of a set: the free proton, or a bound proton in a nucleus (Z, A). */
export type SetTarget =
  | { type: 'proton' }
  | { type: 'nucleus', z: number, a: number }

/** Heavy-flavour treatment and the masses (GeV) at which flavours switch on. */
export interface FlavourScheme {
  /** 'fixed' keeps nf fixed; 'variable' switches nf at μ² = m_h². */
  type: 'fixed' | 'variable'
  /** Active flavours for the fixed scheme, or the maximum for the variable scheme. */
  nf: 3 | 4 | 5 | 6
  /** Heavy-quark masses in GeV. */
  massesGeV: { charm: number, bottom: number, top: number }
}

/** Metadata of an error set (everything but the numbers). */
export interface SetHeader {
  name: string
  family: string
  version: string
  kind: SetKind
  /** Confidence level of the members' spread, in percent (68 or 90 typically). */
  confidenceLevelPercent: number
  /** α_s(M_Z) of each member, when the set carries α_s members (same length as members). */
  alphasMz?: number[]
  /**
   * Members (indices into the member list) that are α_s variations rather than PDF error
   * members: [down, up]. They are excluded from the PDF prescription and added in quadrature.
   */
  alphasMembers?: [number, number]
  /** α_s(M_Z) of the central member. */
  alphasMzCentral: number
  /** Evolution order; always 'LO' in Sheaf-built sets. */
  order: 'LO'
  scheme: FlavourScheme
  target: SetTarget
  /** Free text on where the set came from (fit name, who built it, with which engine version). */
  provenance: string
  /** Number of members including the central one (member 0). */
  memberCount: number
  /**
   * For replica sets only: what member 0 is. 'mean' (the default when absent) — the mean of the
   * replicas, checked when a set file is read; 'fit' — a separate central fit, not the mean.
   */
  replicaCentral?: 'mean' | 'fit'
  /**
   * What the grid holds (fragmentation/species.ts): absent means parton densities (every
   * version-1 file); { type: 'fragmentation', hadron } means z·D_i^h(z, Q²) with the grid's x axis
   * read as z.
   */
  density?: SetDensity
}

/** An error set: header plus members, central first. All members share x, q2 and flavours. */
export interface ErrorSet {
  header: SetHeader
  x: Float64Array
  q2: Float64Array
  flavours: Pdg[]
  /** members[k] has length nx * nq2 * nf, layout as in MemberGrid.values. */
  members: Float64Array[]
}
