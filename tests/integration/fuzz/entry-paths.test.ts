// Property-based fuzzing of every entry path with generated bad input (fast-check, fixed seed):
// each request must be refused with a 4xx whose statusMessage is not empty and, where the input
// has a field, line or cell, names it in data.fields or data.issues; never a 5xx; and no row of
// the workspace or the accounts may change. The totals are printed at the end. A failure prints
// fast-check's seed and path; SHEAF_FUZZ_SEED=<seed> runs the suite with another seed.
import fc from 'fast-check'
import { afterAll, beforeAll, describe, it } from 'vitest'
import { SEED, refused, setUpTarget, tally, tallyLine, type Attempt, type Target } from './harness'
import { accountBodies, workspaceBodies } from './cases/accounts'
import { wholeBodies } from './cases/bodies'
import { measurementForms, measurementJson } from './cases/measurements'
import { pathIds, queryParameters } from './cases/queries'
import { setBuilds, setRenames, setUploads } from './cases/sets'
import { studyCreates, studyPatches, studyValidations, userKernels } from './cases/studies'

let target: Target

beforeAll(async () => {
  console.log(`entry-path fuzz: seed ${SEED} (replay with SHEAF_FUZZ_SEED=${SEED})`)
  target = await setUpTarget()
}, 120_000)

afterAll(() => {
  console.log(tallyLine())
})

/** Runs `runs` generated bad inputs of one entry path through `refused`. */
const fuzz = (arbitrary: (t: Target) => fc.Arbitrary<Attempt>, runs: number) => () =>
  fc.assert(fc.asyncProperty(arbitrary(target), attempt => refused(target, attempt)), { seed: SEED, numRuns: runs })

const ENTRY_PATHS: Array<[string, (t: Target) => fc.Arbitrary<Attempt>, number]> = [
  ['set upload (multipart: file bytes, names, file names)', setUploads, 50],
  ['set rename', setRenames, 20],
  ['set build from a fit (JSON documents)', setBuilds, 50],
  ['study create', studyCreates, 50],
  ['study patch', studyPatches, 30],
  ['study validate', studyValidations, 30],
  ['user-kernel expressions', userKernels, 50],
  ['measurement CSV as JSON', measurementJson, 40],
  ['measurement CSV as multipart', measurementForms, 30],
  ['query parameters of the GET routes', queryParameters, 60],
  ['ids in route paths', pathIds, 40],
  ['account bodies', accountBodies, 60],
  ['workspace, member, review and run bodies', workspaceBodies, 35],
  ['whole bodies that are not the expected object', wholeBodies, 40]
]

describe('every entry path refuses bad input with a located 4xx and changes nothing', () => {
  for (const [name, arbitrary, runs] of ENTRY_PATHS) it(`${name} (${runs} cases)`, fuzz(arbitrary, runs))

  it('ran at least 300 bad inputs without a 5xx', ({ expect }) => {
    expect(tally.serverErrors).toBe(0)
    expect(tally.cases).toBeGreaterThanOrEqual(300)
  })
})
