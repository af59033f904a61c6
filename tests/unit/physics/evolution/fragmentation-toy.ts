/**
 * Invented fragmentation inputs for the timelike-evolution tests (not fits). Each parton i gives
 * species h the momentum fraction m_ih = ∫₀¹ z D_i^h dz through one of three shapes whose Beta
 * integrals are hand-worked (B(p, q) = (p−1)!(q−1)!/(p+q−1)! for whole p, q; DLMF §5.12):
 *   z(1−z)²: ∫ = B(2, 3) = 1/12,  z(1−z)³: ∫ = B(2, 4) = 1/20,  z²(1−z)³: ∫ = B(3, 4) = 1/60,
 * so the amplitude of a term is m·12, m·20 or m·60.
 */
import type { SetDensity } from '~/shared/physics/fragmentation/species'
import { compileInput, type InputModel } from '~/shared/physics/input/model'
import { parseInputDocument } from '~/shared/physics/input/parse'
import type { FlavourScheme } from '~/shared/physics/types'

export type ToyShape = 'z(1-z)^2' | 'z(1-z)^3' | 'z^2(1-z)^3'

const SHAPES: Record<ToyShape, { a: number, b: number, inverseIntegral: number }> = {
  'z(1-z)^2': { a: 1, b: 2, inverseIntegral: 12 },
  'z(1-z)^3': { a: 1, b: 3, inverseIntegral: 20 },
  'z^2(1-z)^3': { a: 2, b: 3, inverseIntegral: 60 }
}

/** One piece: partons (PDG codes) that give this species `momentum` each, with a shape. */
export interface ToyPiece {
  partons: number[]
  momentum: number
  shape: ToyShape
}

export const TOY_MASSES = { charm: 1.4142, bottom: 4.5, top: 175 }

/** A compiled fragmentation input at μ₀² = 2 GeV², α_s(μ₀²) = 0.35, for `hadron`. */
export function toyFragmentation(hadron: Extract<SetDensity, { type: 'fragmentation' }>['hadron'], pieces: ToyPiece[], scheme: FlavourScheme): InputModel {
  const doc = {
    format: 'sheaf.parametrised-input',
    formatVersion: 1,
    name: `toy-ff-${hadron}`,
    family: 'toy-ff',
    version: '1',
    description: 'invented fragmentation input for tests (not a fit)',
    density: { type: 'fragmentation', hadron },
    target: { type: 'proton' },
    startScaleGeV2: 2,
    alphas: { value: 0.35, scaleGeV2: 2 },
    scheme,
    parameters: [],
    pieces: pieces.map((p, i) => ({
      id: `p${i}`,
      flavours: Object.fromEntries(p.partons.map(c => [String(c), 1])),
      terms: [{ A: p.momentum * SHAPES[p.shape].inverseIntegral, a: SHAPES[p.shape].a, b: SHAPES[p.shape].b }]
    }))
  }
  return compileInput(parseInputDocument(doc, `toy ${hadron}`))
}
