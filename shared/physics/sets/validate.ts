import { HEAVY_QUARKS, THRESHOLD_TOLERANCE } from '../alphas'
import { PARTON_CODES_TEXT, isPartonCode } from '../partons'
import type { FlavourScheme, Pdg, SetHeader } from '../types'
import { SetFormatError } from './errors'

/**
 * The rules every error set obeys, shared by the file parser and the writer (which refuses to
 * write a set that the parser would refuse). Each check throws a SetFormatError naming the
 * member, node, flavour and header path concerned.
 */

/**
 * Checks the momentum-fraction nodes (x of parton densities, z of fragmentation functions; `axis`
 * names them in messages): finite, in (0, 1), strictly increasing, at least 2.
 * @example checkXNodes(Float64Array.of(1e-3, 0.1, 0.5)) // passes
 */
export function checkXNodes(x: ArrayLike<number>, pathPrefix = 'grid.x', axis: 'x' | 'z' = 'x'): void {
  if (x.length < 2) throw new SetFormatError(`the grid needs at least 2 ${axis} nodes; it has ${x.length}`, { path: pathPrefix })
  for (let i = 0; i < x.length; i++) {
    const v = x[i]!
    const path = `${pathPrefix}[${i}]`
    if (!Number.isFinite(v)) throw new SetFormatError(`${axis} node ${i} is ${v}; ${axis} nodes must be finite numbers`, { xIndex: i, path })
    if (!(v > 0 && v < 1)) throw new SetFormatError(`${axis} node ${i} is ${v}; ${axis} nodes must lie in (0, 1)`, { xIndex: i, path })
    if (i > 0 && !(v > x[i - 1]!)) {
      throw new SetFormatError(`${axis} node ${i} (${v}) does not exceed ${axis} node ${i - 1} (${x[i - 1]}); ${axis} nodes must increase strictly`, { xIndex: i, path })
    }
  }
}

/** Thresholds m_h² (GeV²) at which a Q² node may repeat, for the scheme. */
export function thresholdsGeV2(scheme: FlavourScheme): Array<{ flavour: string, q2: number }> {
  if (scheme.type !== 'variable') return []
  return HEAVY_QUARKS.filter(h => scheme.nf >= h.pdg).map(h => ({ flavour: h.name, q2: scheme.massesGeV[h.key] ** 2 }))
}

/**
 * Checks the Q² nodes: finite, > 0, increasing; a value may appear twice in a row only at a
 * heavy-quark threshold m_h² of a variable-flavour scheme (within 1e-9 relative), never three
 * times, and each sub-grid between thresholds has at least 2 nodes.
 */
export function checkQ2Nodes(q2: ArrayLike<number>, scheme: FlavourScheme, pathPrefix = 'grid.q2GeV2'): void {
  if (q2.length < 2) throw new SetFormatError(`the grid needs at least 2 Q² nodes; it has ${q2.length}`, { path: pathPrefix })
  const thresholds = thresholdsGeV2(scheme)
  let runStart = 0
  for (let i = 0; i < q2.length; i++) {
    const v = q2[i]!
    const path = `${pathPrefix}[${i}]`
    if (!Number.isFinite(v) || !(v > 0)) throw new SetFormatError(`Q² node ${i} is ${v}; Q² nodes must be positive finite numbers of GeV²`, { q2Index: i, path })
    if (i === 0) continue
    const prev = q2[i - 1]!
    if (v === prev) {
      const t = thresholds.find(th => Math.abs(v - th.q2) <= THRESHOLD_TOLERANCE * th.q2)
      if (!t) {
        const declared = thresholds.length > 0 ? `the declared thresholds are ${thresholds.map(th => `m_${th.flavour}² = ${th.q2} GeV²`).join(', ')}` : 'the scheme declares no thresholds (a fixed-flavour scheme has none)'
        throw new SetFormatError(`Q² node ${i} repeats ${v} GeV²; a Q² node may repeat only at a heavy-quark threshold, and ${declared}`, { q2Index: i, path })
      }
      if (i >= 2 && q2[i - 2] === v) throw new SetFormatError(`Q² node ${i} repeats ${v} GeV² a third time; a threshold appears exactly twice`, { q2Index: i, path })
      if (i - 1 - runStart < 1) throw new SetFormatError(`the Q² sub-grid ending at node ${i - 1} has a single node; each sub-grid between thresholds needs at least 2`, { q2Index: i - 1, path })
      runStart = i
    } else if (!(v > prev)) {
      throw new SetFormatError(`Q² node ${i} (${v} GeV²) is below Q² node ${i - 1} (${prev} GeV²); Q² nodes must increase`, { q2Index: i, path })
    }
  }
  if (q2.length - 1 - runStart < 1) throw new SetFormatError(`the last Q² sub-grid (from node ${runStart}) has a single node; each sub-grid needs at least 2`, { q2Index: runStart, path: pathPrefix })
}

/** Checks that the flavour list holds valid, distinct PDG codes. */
export function checkFlavours(flavours: readonly Pdg[], pathPrefix = 'grid.flavours'): void {
  if (flavours.length < 1) throw new SetFormatError('the grid needs at least one flavour', { path: pathPrefix })
  const seen = new Set<Pdg>()
  flavours.forEach((f, i) => {
    if (!isPartonCode(f)) throw new SetFormatError(`flavour ${i} is ${f}; flavours are PDG parton codes ${PARTON_CODES_TEXT}`, { path: `${pathPrefix}[${i}]` })
    if (seen.has(f)) throw new SetFormatError(`flavour ${f} appears twice in the flavour list (slot ${i})`, { flavour: f, path: `${pathPrefix}[${i}]` })
    seen.add(f)
  })
}

/**
 * Checks the member count against the kind (see shared/physics/README.md, "Set kinds") and the α_s
 * members:
 *  - at least one member (member 0, the central one);
 *  - α_s members, when declared, are the last two members [memberCount − 2, memberCount − 1],
 *    and alphasMz (when given) has one entry per member;
 *  - Hessian pairs: 1 + 2N (+ 2 α_s members), members 2k − 1 and 2k being eigenvector k's + and −;
 *  - one-sided Hessian: 1 + N (+ 2); replicas: 1 + N (+ 2), member 0 being the replica mean
 *    (replicaCentral 'mean', the default) or a separate central fit ('fit'), with N ≥ 1 for 'mean'.
 */
export function checkMemberCount(header: SetHeader): void {
  const n = header.memberCount
  if (n < 1) throw new SetFormatError('the set has no members: member 0, the central member, is required', { path: 'set.memberCount' })
  let alphasCount = 0
  if (header.alphasMembers) {
    const [down, up] = header.alphasMembers
    if (down !== n - 2 || up !== n - 1) {
      throw new SetFormatError(`alphasMembers is [${down}, ${up}]; the α_s members must be the last two members, [${n - 2}, ${n - 1}]`, { path: 'set.alphasMembers' })
    }
    alphasCount = 2
  }
  if (header.alphasMz && header.alphasMz.length !== n) {
    throw new SetFormatError(`alphasMz has ${header.alphasMz.length} entries; it needs one per member (${n})`, { path: 'set.alphasMz' })
  }
  if (header.alphasMz && header.alphasMz[0] !== header.alphasMzCentral) {
    throw new SetFormatError(`alphasMz[0] (${header.alphasMz[0]}) differs from alphasMzCentral (${header.alphasMzCentral})`, { path: 'set.alphasMz[0]' })
  }
  const errorMembers = n - 1 - alphasCount
  if (errorMembers < 0) throw new SetFormatError(`memberCount ${n} leaves no room for the central member and the 2 α_s members`, { path: 'set.memberCount' })
  const where = { path: 'set.memberCount' }
  switch (header.kind) {
    case 'hessian-pairs':
      if (errorMembers % 2 !== 0) {
        throw new SetFormatError(`a Hessian set of eigenvector pairs has 1 + 2N${alphasCount ? ' + 2 (α_s)' : ''} members; memberCount ${n} gives an odd number (${errorMembers}) of eigenvector members`, where)
      }
      break
    case 'hessian-one-sided':
      break
    case 'replicas':
      if (header.replicaCentral !== 'fit' && errorMembers < 1) {
        throw new SetFormatError(`a replica set whose member 0 is the replica mean needs at least one replica; memberCount is ${n}`, where)
      }
      break
  }
  if (header.kind !== 'replicas' && header.replicaCentral !== undefined) {
    throw new SetFormatError('replicaCentral applies to replica sets only', { path: 'set.replicaCentral' })
  }
}

/** Locator of a value's byte offset in a file body, if known. */
export type ByteOffsetOf = (index: number) => number | undefined

/**
 * Checks every value is finite; the error names member, Q² node, x node, flavour and (when
 * reading a file) the byte offset of the bad value.
 */
export function checkValuesFinite(members: readonly Float64Array[], nq: number, nx: number, flavours: readonly Pdg[], byteOffsetOf: ByteOffsetOf = () => undefined): void {
  const nf = flavours.length
  const perMember = nq * nx * nf
  members.forEach((m, k) => {
    for (let t = 0; t < m.length; t++) {
      const v = m[t]!
      if (Number.isFinite(v)) continue
      const ifl = t % nf
      const ix = Math.floor(t / nf) % nx
      const iq = Math.floor(t / (nf * nx))
      const byteOffset = byteOffsetOf(k * perMember + t)
      throw new SetFormatError(
        `member ${k}, Q² node ${iq}, x node ${ix}, flavour ${flavours[ifl]}: value is ${v}; every value must be a finite number${byteOffset === undefined ? '' : ` (byte ${byteOffset})`}`,
        { member: k, q2Index: iq, xIndex: ix, flavour: flavours[ifl], byteOffset }
      )
    }
  })
}

/**
 * For a replica set declaring member 0 the replica mean: checks it, value by value, to a
 * relative tolerance (1e-6 for Float64 bodies, 1e-4 for Float32) plus 1e-12 absolute.
 */
export function checkReplicaMean(header: SetHeader, members: readonly Float64Array[], nq: number, nx: number, flavours: readonly Pdg[], relTolerance: number): void {
  if (header.kind !== 'replicas' || header.replicaCentral === 'fit') return
  const alphasCount = header.alphasMembers ? 2 : 0
  const replicas = members.slice(1, members.length - alphasCount)
  if (replicas.length === 0) return
  const nf = flavours.length
  const central = members[0]!
  for (let t = 0; t < central.length; t++) {
    let sum = 0
    for (const r of replicas) sum += r[t]!
    const mean = sum / replicas.length
    if (Math.abs(central[t]! - mean) > relTolerance * Math.abs(mean) + 1e-12) {
      const ifl = t % nf
      const ix = Math.floor(t / nf) % nx
      const iq = Math.floor(t / (nf * nx))
      throw new SetFormatError(
        `member 0 is declared the replica mean but at Q² node ${iq}, x node ${ix}, flavour ${flavours[ifl]} it is ${central[t]} while the mean of the ${replicas.length} replicas is ${mean}; set replicaCentral to "fit" if member 0 is a separate fit`,
        { member: 0, q2Index: iq, xIndex: ix, flavour: flavours[ifl], path: 'set.replicaCentral' }
      )
    }
  }
}
