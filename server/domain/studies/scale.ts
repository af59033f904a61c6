// The stored factorisation-scale variation of a run: the engine's scaleVariation of the central
// members (κ × ½, 1, 2), kept apart from the PDF band. Used inline and by the evaluation pool.
import type { ScaleVariationJson } from '../../database/schema'
import { scaleVariation } from '../../../shared/physics/study/scale'
import type { StudySpec } from '../../../shared/physics/study/spec'
import type { ErrorSet } from '../../../shared/physics/types'
import { kernelContextOf } from './check'

/** The variation on the main set (with the second set's central member); null when a varied scale leaves a grid. */
export function scaleVariationOf(spec: StudySpec, main: ErrorSet, second: ErrorSet | null): ScaleVariationJson | null {
  try {
    const v = scaleVariation(spec, main, main.members[0]!, {
      ...kernelContextOf(main.header), ...(second ? { second, secondCentral: second.members[0]! } : {})
    })
    const bins = spec.bins.length
    return {
      variation: v.variation, label: v.label,
      kappas: v.kappas,
      values: [0, 1, 2].map(k => Array.from(v.values.subarray(k * bins, (k + 1) * bins))),
      nominal: Array.from(v.nominal), up: Array.from(v.up), down: Array.from(v.down)
    }
  } catch (err) {
    if (err instanceof RangeError) return null
    throw err
  }
}
