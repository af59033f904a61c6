/**
 * Sheaf's error-set file format, version 2 ("*.sheafset"). Designed for Sheaf; byte layout:
 *
 *   offset 0        16 bytes   the magic line "SHEAF-ERROR-SET\n" (ASCII)
 *   offset 16        4 bytes   H, the header length in bytes, unsigned 32-bit little-endian
 *   offset 20        H bytes   the header: UTF-8 JSON, padded with spaces so that 20 + H is a
 *                              multiple of 8 (the body then starts 8-byte aligned)
 *   offset 20 + H    B bytes   the body: every value, IEEE-754 little-endian, Float64 (8 bytes)
 *                              or Float32 (4 bytes) as the header's body.encoding says
 *   end of file                (nothing after the body: the file is exactly 20 + H + B bytes)
 *
 * Body order, slowest index first: member, Q² node, x node, flavour — so member k's values are
 * one contiguous block laid out exactly like MemberGrid.values (types.ts):
 *   value(k, iq, ix, ifl) at byte 20 + H + (((k·nQ² + iq)·nx + ix)·nf + ifl) · bytesPerValue.
 * Values are momentum densities x·f(x, Q²) of partons, or z·D_i^h(z, Q²) of fragmentation
 * functions (set.density below), dimensionless.
 *
 * Header keys (version 2, what the writer writes): formatVersion (2); set: the SetHeader fields
 * of types.ts (name, family, version, kind, confidenceLevelPercent, alphasMzCentral, alphasMz?,
 * alphasMembers?, order, scheme, target?, provenance, memberCount, replicaCentral?) plus density;
 * grid: the momentum-fraction nodes (in (0, 1), increasing), q2GeV2 (nodes in GeV², increasing; a
 * value may repeat once at a declared heavy-quark threshold m_h² of a variable-flavour scheme),
 * flavours (PDG codes of partons); body: encoding ("float64-le" or "float32-le"), order (always
 * "member,q2,x,flavour") and valueCount (memberCount · nQ² · nx · nf).
 *
 * What version 2 adds, and why:
 *  - set.density (required): { "type": "parton" } — x·f_i(x, Q²) of partons in the target — or
 *    { "type": "fragmentation", "hadron": h } — z·D_i^h(z, Q²), parton i fragmenting into the
 *    hadron species h (a key of fragmentation/species.ts: pi+, pi-, pi0, K+, K-, p, pbar, h+-).
 *  - The momentum-fraction axis is named for what it is: grid.x for parton densities (the parton's
 *    fraction of the hadron's momentum), grid.z for fragmentation (the hadron's fraction of the
 *    parton's momentum). Exactly one of the two is present, the one the density calls for. The
 *    body order string keeps "x" as the name of the fraction index in both.
 *  - set.target is required for parton densities and absent for fragmentation functions, which
 *    describe no target. In memory a fragmentation set carries the neutral NO_TARGET (header.ts)
 *    so SetHeader.target stays usable; the writer drops it.
 *
 * Version 1 (still read, never written) is version 2 without set.density (it always holds parton
 * densities), with set.target required and the axis always grid.x.
 */

/** The 16-byte magic line that opens every Sheaf error-set file. */
export const SET_FILE_MAGIC = 'SHEAF-ERROR-SET\n'

/** Bytes before the header: the magic line and the 4-byte header length. */
export const SET_FILE_PREAMBLE_BYTES = 20

/** Format version this code writes. */
export const SET_FORMAT_VERSION = 2

/** Format versions this code reads (version 1: parton densities only). */
export const SET_FORMAT_VERSIONS_READ: readonly number[] = [1, 2]

/** Conventional file extension. */
export const SET_FILE_EXTENSION = '.sheafset'

/** Numeric encodings of the body. */
export type SetEncoding = 'float64-le' | 'float32-le'

/** The body order string. */
export const SET_BODY_ORDER = 'member,q2,x,flavour'

/** Bytes per value of an encoding. */
export function bytesPerValue(encoding: SetEncoding): number {
  return encoding === 'float64-le' ? 8 : 4
}
