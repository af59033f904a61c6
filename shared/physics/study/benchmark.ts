import type { StudySpec } from './spec'
import { parseStudySpec } from './spec'

/**
 * The study of the evaluation benchmark (`npm run bench`; see shared/physics/README.md, "Study
 * evaluation"): `masses` mass points log-spaced in [20, 1000] GeV × `rapidityBins` rapidity bins
 * covering |y| ≤ 2.5, Drell–Yan d²σ/dM dy at √s = 13 TeV integrated over each rapidity bin with
 * `order` Gauss–Legendre points (the defaults give 1000 bins × 8 points). Bin edges are exactly
 * mirror-symmetric in y.
 * @example benchmarkSpec().bins.length // 1000
 */
export function benchmarkSpec(masses = 40, rapidityBins = 25, order = 8): StudySpec {
  const bins = []
  const edge = (j: number) => 2.5 * (2 * j - rapidityBins) / rapidityBins
  for (let i = 0; i < masses; i++) {
    const m = 20 * (1000 / 20) ** (i / Math.max(1, masses - 1))
    for (let j = 0; j < rapidityBins; j++) bins.push({ m, yMin: edge(j), yMax: edge(j + 1) })
  }
  return parseStudySpec({ kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins, quadratureOrder: order })
}
