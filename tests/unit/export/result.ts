import type { ResultForExport } from '#shared/export'
import { bandToJson, makeBands } from '#shared/physics/uncertainty/band'

/** A hand-made result (invented numbers, no physics claim) to exercise the formatters. */
export function handMadeResult(): ResultForExport {
  return {
    provenance: {
      study: { id: 'st-1', name: 'High-mass DY, test' },
      set: { name: 'Bramble-H', version: '1.2', kind: 'hessian-pairs', family: 'Bramble' },
      prescription: 'Hessian pairs, asymmetric',
      confidenceLevelPercent: 68,
      setConfidenceLevelPercent: 90,
      kernel: { id: 'dy-mass', label: 'Drell–Yan dσ/dM', constants: { sqrtSGeV: 13000, alphaEm: 0.0072973525643 } },
      engineVersion: '0.1.0',
      ranBy: 'ana@example.org',
      ranAt: '2025-03-01T09:30:00.000Z',
      resultVersion: 3,
      approval: { state: 'approved', by: 'owner@example.org', at: new Date('2025-03-02T10:00:00Z') }
    },
    observable: { name: 'dσ/dM', unit: 'pb/GeV', latex: '\\mathrm{d}\\sigma/\\mathrm{d}M' },
    binColumns: [
      { key: 'mMin', label: 'M min', unit: 'GeV', kind: 'range-lo' },
      { key: 'mMax', label: 'M max', unit: 'GeV', kind: 'range-hi' },
      { key: 'note', label: 'note', kind: 'text' }
    ],
    bins: [
      { mMin: 200, mMax: 300, note: 'low, "edge"' },
      { mMin: 300, mMax: 500, note: null },
      { mMin: 500, mMax: 1e4, note: null }
    ],
    // one band in the engine's form, one in the JSON form the API sends
    bands: [
      { id: 'hessian-asym', label: 'Hessian, asymmetric', band: makeBands([1.23456, 0.0996123, 1.234e-5], [0.01234, 0.00996, 2.1e-7], [0.0156, 0.0031, 1.9e-7]) },
      { id: 'hessian-sym', label: 'Hessian, symmetric', band: bandToJson(makeBands([1.23456, 0.0996123, 1.234e-5], [0.014, 0.0065, 2e-7], [0.014, 0.0065, 2e-7])) }
    ]
  }
}
