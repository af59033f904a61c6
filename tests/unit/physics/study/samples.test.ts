import { readFileSync, readdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { makeAlphas } from '../../../../shared/physics/alphas'
import { MZ_GEV } from '../../../../shared/physics/constants'
import { kernelDensities } from '../../../../shared/physics/kernels/registry'
import { parseSetFile } from '../../../../shared/physics/sets'
import { buildPlan, checkReach, evaluatePlan, parseStudySpec } from '../../../../shared/physics/study'

// Every sample study in samples/studies must validate, be within reach of the sample TOY set,
// and evaluate to finite numbers (for the demo and the CLI). No physics values are asserted.
// Kernels that read fragmentation functions get the same TOY grid relabelled as a fragmentation
// set (the plumbing of the slots only; its numbers are parton densities, not fragmentation functions).

const root = fileURLToPath(new URL('../../../../samples/', import.meta.url))
const set = parseSetFile(new Uint8Array(readFileSync(`${root}sets/toy-hessian.sheafset`)))
const alphas = makeAlphas({ value: set.header.alphasMzCentral, scaleGeV2: MZ_GEV ** 2 }, set.header.scheme)
const fragmentation = { ...set, header: { ...set.header, density: { type: 'fragmentation' as const, hadron: 'pi+' as const } } }
const inSlot = (density: string | null) => (density === 'fragmentation' ? fragmentation : set)
const studies = readdirSync(`${root}studies`).filter(f => f.endsWith('.json'))

describe('sample studies', () => {
  it('there are samples for the main kernel families', () => {
    expect(studies.length).toBeGreaterThanOrEqual(8)
  })

  it.each(studies)('%s validates, is in reach of toy-hessian and evaluates', (file) => {
    const spec = parseStudySpec(JSON.parse(readFileSync(`${root}studies/${file}`, 'utf8')))
    const slots = kernelDensities(spec.kernel)
    const main = inSlot(slots.main)
    const second = slots.secondRequired ? inSlot(slots.second) : undefined
    const context = { alphas, scheme: main.header.scheme }
    expect(checkReach(spec, { main, second }, context)).toEqual([])
    const values = evaluatePlan(buildPlan(spec, main, { ...context, second }), main.members, second?.members)
    expect(values.length).toBe(set.members.length * spec.bins.length)
    expect(values.every(Number.isFinite)).toBe(true)
  })
})
