// K-factors where a run combines its members (combineRun, inline, no database): the stored
// values, every prescription's bands and the scale variation of a study with K-factors, against
// the same run without them. Member values come from the engine's direct evaluation on a TOY set.
import { describe, expect, it } from 'vitest'
import { combineRun } from '../../../server/domain/studies/run'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../../../shared/physics/sets/toy'
import { evaluateDirect } from '../../../shared/physics/study/direct'
import { parseStudySpec } from '../../../shared/physics/study/spec'
import { binCorrelation } from '../../../shared/physics/uncertainty'
import type { SetKind } from '../../../shared/physics/types'
import { expectClose } from '../physics/close'

function toySet(kind: SetKind) {
  return toyErrorSet({
    kind, errorMembers: kind === 'replicas' ? 20 : 4,
    x: toyXNodes(30, 1e-5, 0.95),
    q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 12, thresholdsGeV2: [1.5 ** 2, 4.75 ** 2] }),
    scheme: { type: 'variable', nf: 5, massesGeV: { charm: 1.5, bottom: 4.75, top: 173 } }
  })
}
const bins = [{ x: 0.001, q2: 10 }, { x: 0.01, q2: 20 }, { x: 0.1, q2: 40 }]
const specWith = (kFactors?: unknown) => parseStudySpec({ kernel: 'dis-nc-f2', bins, ...(kFactors ? { kFactors } : {}) })

async function run(kind: SetKind, kFactors?: unknown) {
  const set = toySet(kind)
  const spec = specWith(kFactors)
  const values = evaluateDirect(spec, set)
  return { set, raw: values.slice(), combined: await combineRun(spec, set, null, values, 68, { pool: false }) }
}

describe.each<SetKind>(['hessian-pairs', 'replicas'])('a run with K-factors on a %s set', (kind) => {
  // Check (common practice): K = 1 in every bin leaves every stored number unchanged, bit for bit.
  it('K = 1 leaves the values, every band and the scale variation unchanged', async () => {
    const plain = await run(kind)
    const ones = await run(kind, { values: [1, 1, 1], errors: [0.1, 0.1, 0.1], source: 'unit test' })
    expect(Array.from(ones.combined.values)).toEqual(Array.from(plain.combined.values))
    expect(ones.combined.bands).toEqual(plain.combined.bands)
    expect(ones.combined.scale).toEqual(plain.combined.scale)
  })

  it('multiplies every member of a bin by the bin\'s K before the bands', async () => {
    const k = [1.5, 0.8, 2.25]
    const { raw, combined } = await run(kind, { values: k })
    const members = combined.members
    expect(combined.values.length).toBe(members * 3)
    for (let m = 0; m < members; m++) {
      for (let b = 0; b < 3; b++) expect(combined.values[m * 3 + b]).toBe(raw[m * 3 + b]! * k[b]!)
    }
    const plain = await run(kind)
    // The scale variation is that of the K-scaled prediction: each κ row times K.
    for (let b = 0; b < 3; b++) {
      expect(combined.scale!.nominal[b]).toBe(plain.combined.scale!.nominal[b]! * k[b]!)
      expect(combined.scale!.values[2]![b]).toBe(plain.combined.scale!.values[2]![b]! * k[b]!)
    }
  })

  // Check: every prescription is homogeneous of degree 1 in the members, so a constant K > 0
  // scales each band by K and leaves the relative band and the bin-to-bin correlation (a ratio
  // of covariances, K² over K²) unchanged (common practice).
  it('a constant K scales every band and keeps the relative bands and the correlations', async () => {
    const K = 1.7
    const plain = await run(kind)
    const scaled = await run(kind, { values: [K, K, K] })
    expect(scaled.combined.bands.map(b => b.prescription)).toEqual(plain.combined.bands.map(b => b.prescription))
    plain.combined.bands.forEach((p, i) => {
      const s = scaled.combined.bands[i]!
      expectClose(s.central, p.central.map(v => v * K), 1e-14)
      expectClose(s.plus, p.plus.map(v => v * K), 1e-12)
      expectClose(s.minus, p.minus.map(v => v * K), 1e-12)
      expectClose(s.relPlus as number[], p.relPlus as number[], 1e-12)
      expectClose(s.relMinus as number[], p.relMinus as number[], 1e-12)
    })
    const matrix = (c: typeof plain.combined) => ({ members: c.members, bins: c.bins, values: c.values })
    expectClose(binCorrelation(matrix(scaled.combined), { kind }).values, binCorrelation(matrix(plain.combined), { kind }).values, 1e-12, 1e-14)
  })
})
