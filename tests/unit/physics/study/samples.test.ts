import { readFileSync, readdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { makeAlphas } from '../../../../shared/physics/alphas'
import { MZ_GEV } from '../../../../shared/physics/constants'
import { parseSetFile } from '../../../../shared/physics/sets'
import { buildPlan, checkReach, evaluatePlan, parseStudySpec } from '../../../../shared/physics/study'

// Every sample study in samples/studies must validate, be within reach of the sample TOY set,
// and evaluate to finite numbers (for the demo and the CLI). No physics values are asserted.

const root = fileURLToPath(new URL('../../../../samples/', import.meta.url))
const set = parseSetFile(new Uint8Array(readFileSync(`${root}sets/toy-hessian.sheafset`)))
const alphas = makeAlphas({ value: set.header.alphasMzCentral, scaleGeV2: MZ_GEV ** 2 }, set.header.scheme)
const studies = readdirSync(`${root}studies`).filter(f => f.endsWith('.json'))

describe('sample studies', () => {
  it('there are samples for the main kernel families', () => {
    expect(studies.length).toBeGreaterThanOrEqual(8)
  })

  it.each(studies)('%s validates, is in reach of toy-hessian and evaluates', (file) => {
    const spec = parseStudySpec(JSON.parse(readFileSync(`${root}studies/${file}`, 'utf8')))
    expect(checkReach(spec, { main: set }, { alphas })).toEqual([])
    const values = evaluatePlan(buildPlan(spec, set, { alphas }), set.members)
    expect(values.length).toBe(set.members.length * spec.bins.length)
    expect(values.every(Number.isFinite)).toBe(true)
  })
})
