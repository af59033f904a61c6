// The demo studies of the invented Kestrel Forward Collaboration, with results computed in this
// process (runStudy, not the queue: npm start seeds before the worker is up), a
// pseudo-measurement on the Drell–Yan study, and review steps so the review panel has content.
// Idempotent: a study is found by name, a result counts when a finished version of it exists,
// the measurement by name, a review step only on a result that has none yet.
import { readFileSync } from 'node:fs'
import { and, desc, eq, getTableColumns } from 'drizzle-orm'
import type { DB } from '../../server/database/client'
import { tables as t } from '../../server/database/client'
import type { ErrorSetRow as FullSetRow, Result, Study } from '../../server/database/schema'

import { parseCorrelationMatrix, parseMeasurementPoints, type MeasurementData } from '../../shared/measurements/csv'
import { insertResultVersions } from '../../server/domain/results/versions'
import { importBinsCsv, type BinColumn } from '../../shared/bins'
import type { BinRow, StudySpec, StudySpecInput } from '../../shared/physics/study/spec'
import type { Role } from '../../shared/utils/roles'
import type { SeedContext } from './context'
import type { DemoSetKey } from './02-demo-sets'

/** A set's row without its file. */
export type ErrorSetRow = Omit<FullSetRow, 'content'>

export interface DemoStudy {
  name: string
  description: string
  /** Bins file in samples/bins (the same file a user can import into the bins grid). */
  binsFile: string
  spec: Omit<StudySpecInput, 'bins'>
  sets: DemoSetKey[]
  /**
   * The study's second set (the baseline of a nuclear ratio, the other nucleus of a ratio of two
   * nuclei): held at its central member, or paired member by member when it comes from the same
   * family with the same members (shared/physics/uncertainty/two-sets.ts).
   */
  second?: DemoSetKey
  /** Review steps for the result on the study's first set. */
  review?: Array<{ action: 'submitted' | 'approved', by: Role, comment: string }>
  /** A pseudo-measurement stored with the study (files in samples/measurements). */
  measurement?: { name: string, points: string, correlation?: string, correlationOf: 'syst' | 'total' }
}

/** What a demo study says and computes, without the sets it runs on. */
export type DemoStudyText = Pick<DemoStudy, 'name' | 'description' | 'binsFile' | 'spec'>

export const DEMO_NOTE = 'Demo data: the Kestrel Forward Collaboration, its people and the error sets are invented; the numbers are Sheaf\'s leading-order predictions, not physics results.'
const FE = { type: 'nucleus', z: 26, a: 56 } as const
const AR = { type: 'nucleus', z: 18, a: 40 } as const

export const DEMO_STUDIES: DemoStudy[] = [
  {
    name: 'KNU-04 · ν Fe charged-current F₂',
    description: `F₂ per nucleon of neutrino charged-current scattering on iron (Z = 26, A = 56, neutron excess by isospin) at Q² = 10, 30 and 100 GeV², for the invented Kestrel ν-Fe flux-normalisation note. On Ostrand-25-Fe56, the iron set of the invented A-dependent Ostrand-25 family (bound-proton densities; its band is the nuclear-modification uncertainty, the Quillon-22 baseline held at its central values), and on the free-proton sets with the iron target (isospin only, no nuclear modification). ${DEMO_NOTE}`,
    binsFile: 'neutrino-fe-x-q2.csv',
    spec: { title: 'ν Fe charged-current F₂ per nucleon', kernel: 'dis-cc-f2', options: { beam: 'neutrino', target: FE } },
    sets: ['iron', 'hessian', 'replicas']
  },
  {
    name: 'KNU-04 · ν Fe charged-current xF₃',
    description: `xF₃ per nucleon of neutrino charged-current scattering on iron (Z = 26, A = 56), same bins as the F₂ study; its integral over x tests the Gross–Llewellyn Smith sum rule. On the iron set Ostrand-25-Fe56 and on the proton sets with the iron target, as for F₂. ${DEMO_NOTE}`,
    binsFile: 'neutrino-fe-x-q2.csv',
    spec: { title: 'ν Fe charged-current xF₃ per nucleon', kernel: 'dis-cc-xf3', options: { beam: 'neutrino', target: FE } },
    sets: ['iron', 'hessian', 'replicas']
  },
  {
    name: 'KNU-05 · ν Ar charged-current F₂',
    description: `F₂ per nucleon of neutrino charged-current scattering on argon (Z = 18, A = 40) on the bins of the iron study, for an invented Kestrel liquid-argon detector: on Ostrand-25-Ar40, the argon set of the same invented family (built from the same fit as the iron and lead sets), and on Quillon-22 with the argon target (isospin only). ${DEMO_NOTE}`,
    binsFile: 'neutrino-fe-x-q2.csv',
    spec: { title: 'ν Ar charged-current F₂ per nucleon', kernel: 'dis-cc-f2', options: { beam: 'neutrino', target: AR } },
    sets: ['argon', 'hessian']
  },
  {
    name: 'KHM-13 · High-mass Drell–Yan background',
    description: `Irreducible γ* → ℓ⁺ℓ⁻ background of the invented Kestrel dilepton-resonance search at √s = 13 TeV: dσ/dM (fb/GeV) at 15 masses from 200 GeV to 3 TeV, integrated over |y| < 2.5, narrowed above 1 TeV to where x₁ and x₂ stay below 0.99 (the grid's end; the densities are negligible beyond it). Compared with an invented pseudo-measurement. ${DEMO_NOTE}`,
    binsFile: 'drell-yan-high-mass.csv',
    spec: { title: 'Drell–Yan dσ/dM, |y| < 2.5, √s = 13 TeV', kernel: 'drell-yan', options: { sqrtSGeV: 13000, unit: 'fb' }, quadratureOrder: 8 },
    sets: ['hessian', 'replicas'],
    review: [{ action: 'submitted', by: 'analyst', comment: 'Background band for the search note draft; Quillon-22 at 68% CL as agreed.' }],
    measurement: { name: 'Kestrel pseudo-data (invented)', points: 'drell-yan-high-mass-pseudodata.csv', correlation: 'drell-yan-high-mass-correlation.csv', correlationOf: 'syst' }
  },
  {
    name: 'KEW-13 · W charge asymmetry in rapidity',
    description: `W charge asymmetry (W⁺ − W⁻)/(W⁺ + W⁻) of dσ/dy at √s = 13 TeV in 16 rapidity bins from 0 to 4, computed member by member. Companion studies give W⁺ and W⁻ dσ/dy on the same bins. ${DEMO_NOTE}`,
    binsFile: 'w-rapidity.csv',
    spec: { title: 'W charge asymmetry of dσ/dy, √s = 13 TeV', kernel: 'w-charge-asymmetry', options: { sqrtSGeV: 13000 }, rangeMode: 'average' },
    sets: ['hessian', 'replicas'],
    review: [
      { action: 'submitted', by: 'analyst', comment: 'Asymmetry prediction for the electroweak working meeting.' },
      { action: 'approved', by: 'owner', comment: 'Approved for the internal note.' }
    ]
  },
  {
    name: 'KEW-13 · W⁺ dσ/dy',
    description: `On-shell W⁺ production (narrow width, no decay) dσ/dy at √s = 13 TeV, averaged over each rapidity bin; the numerator side of the charge asymmetry study. ${DEMO_NOTE}`,
    binsFile: 'w-rapidity.csv',
    spec: { title: 'W⁺ dσ/dy, √s = 13 TeV', kernel: 'w-plus', options: { sqrtSGeV: 13000 }, rangeMode: 'average' },
    sets: ['hessian', 'replicas']
  },
  {
    name: 'KEW-13 · W⁻ dσ/dy',
    description: `On-shell W⁻ production (narrow width, no decay) dσ/dy at √s = 13 TeV, averaged over each rapidity bin. ${DEMO_NOTE}`,
    binsFile: 'w-rapidity.csv',
    spec: { title: 'W⁻ dσ/dy, √s = 13 TeV', kernel: 'w-minus', options: { sqrtSGeV: 13000 }, rangeMode: 'average' },
    sets: ['hessian', 'replicas']
  },
  {
    name: 'KHI-08 · p Pb / p p Drell–Yan nuclear ratio',
    description: `Per-nucleon ratio of Drell–Yan at M = 20 GeV in p Pb over p p at √s = 8.16 TeV in 16 rapidity bins (negative y: lead-going side), with the lead set Ostrand-25-Pb208 of the invented A-dependent Ostrand-25 family varying and Quillon-22 (its baseline) held at its central member. ${DEMO_NOTE}`,
    binsFile: 'ppb-drell-yan-rapidity.csv',
    spec: { title: 'p Pb / p p Drell–Yan per nucleon, M = 20 GeV, √s = 8.16 TeV', kernel: 'nuclear-ratio', options: { base: 'drell-yan', nucleus: { z: 82, a: 208 }, sqrtSGeV: 8160 } },
    sets: ['lead'],
    second: 'hessian'
  },
  {
    name: 'KNM-12 · Carbon over lead F₂ per nucleon',
    description: `F₂ of carbon (Z = 6, A = 12) over F₂ of lead per nucleon, the lead taken as an isoscalar nucleon ½(p + n) of its bound densities (carbon is isoscalar itself, so the ratio shows the nuclear modifications alone), at Q² = 10 GeV² from x = 0.003 to 0.6, for an invented Kestrel fixed-target proposal. Both sets come from the invented Ostrand-25 family (one A-dependent fit built for each nucleus), so member k of Ostrand-25-C12 is paired with member k of Ostrand-25-Pb208: the band of the ratio carries the correlation between the two nuclei, and is much narrower than the two sets' bands added in quadrature. ${DEMO_NOTE}`,
    binsFile: 'carbon-lead-f2-x.csv',
    spec: { title: 'F₂^C/F₂^Pb per nucleon (Pb isoscalar-corrected), Q² = 10 GeV²', kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 6, a: 12 }, denominator: 'isoscalar' } },
    sets: ['lead'],
    second: 'carbon'
  }
]

const samples = new URL('../../samples/', import.meta.url)
const sampleText = (path: string) => readFileSync(new URL(path, samples), 'utf8')

/**
 * The bins of samples/bins/`file`, read as the bins grid imports them (the header names the
 * columns); throws on any problem. Unknown columns reach the engine's check, which names them.
 */
export function readDemoBins(file: string): BinRow[] {
  const text = sampleText(`bins/${file}`)
  const header = text.split(/\r?\n/).find(l => l.trim() !== '' && !l.startsWith('#')) ?? ''
  const columns: BinColumn[] = header.split(',').map(f => f.trim())
    .map(key => ({ key, label: key, kind: key === 'label' ? 'text' : 'number' }))
  const read = importBinsCsv(text, columns)
  const problems = [...read.errors, ...read.cellErrors]
  if (problems.length) throw new RangeError(`samples/bins/${file}: ${problems[0]!.message}`)
  return read.rows.map(row => Object.fromEntries(Object.entries(row).filter(([, v]) => v !== null)) as BinRow)
}

/** The demo study's validated spec, or a RangeError naming the study and the first problem. */
export async function demoSpec(d: DemoStudyText): Promise<StudySpec> {
  // The engine is imported only when there is something to check or compute (see ensureResult).
  const { checkStudySpec } = await import('../../shared/physics/study/spec')
  const checked = checkStudySpec({ ...d.spec, bins: readDemoBins(d.binsFile) })
  if (!checked.ok) throw new RangeError(`demo study "${d.name}": ${checked.issues[0]!.message}`)
  return checked.spec
}

/** The stored measurement of a demo study, read and checked like an upload. */
function readMeasurement(m: NonNullable<DemoStudy['measurement']>): MeasurementData {
  const points = parseMeasurementPoints(sampleText(`measurements/${m.points}`))
  if (points.issues.length) throw new RangeError(`samples/measurements/${m.points}: ${points.issues[0]!.message}`)
  let correlation: number[][] | null = null
  if (m.correlation) {
    const c = parseCorrelationMatrix(sampleText(`measurements/${m.correlation}`), points.data.values.length)
    if (c.issues.length) throw new RangeError(`samples/measurements/${m.correlation}: ${c.issues[0]!.message}`)
    correlation = c.matrix
  }
  return { ...points.data, correlation, correlationOf: m.correlationOf }
}

export async function findOrCreateStudy(db: DB, workspaceId: string, analyst: string, d: DemoStudyText, sets: ErrorSetRow[], second: ErrorSetRow | null): Promise<Study> {
  const [existing] = await db.select().from(t.studies).where(and(eq(t.studies.workspaceId, workspaceId), eq(t.studies.name, d.name)))
  // A study seeded before a demo set joined it gets that set added (once); nothing else changes.
  const missing = existing ? sets.filter(s => !existing.setIds.includes(s.id)) : []
  if (existing && missing.length) {
    const [updated] = await db.update(t.studies).set({ setIds: [...existing.setIds, ...missing.map(s => s.id)] }).where(eq(t.studies.id, existing.id)).returning()
    return updated!
  }
  if (existing) return existing
  const spec = await demoSpec(d)
  const { reachProblems } = await import('../../server/domain/studies/check')
  const problems = sets.flatMap(s => reachProblems(spec, s, second))
  if (problems.length) throw new RangeError(`demo study "${d.name}": ${problems[0]!.message}`)
  return db.transaction(async (tx) => {
    const [study] = await tx.insert(t.studies).values({
      workspaceId, name: d.name, description: d.description, spec, setIds: sets.map(s => s.id),
      secondSetId: second?.id ?? null, createdBy: analyst
    }).returning()
    await tx.insert(t.auditEvents).values({ workspaceId, actorId: analyst, action: 'study.created', subjectType: 'study', subjectId: study!.id, detail: { name: d.name, seeded: true } })
    return study!
  })
}

/**
 * The finished result of `study` on `set`: the newest done version if there is one; else a
 * pending version left by an interrupted seed, or a new one, computed here.
 */
export async function ensureResult(db: DB, study: Study, set: ErrorSetRow, second: ErrorSetRow | null, analyst: string): Promise<{ result: Result, computed: boolean }> {
  const versions = await db.select().from(t.results)
    .where(and(eq(t.results.studyId, study.id), eq(t.results.setId, set.id))).orderBy(desc(t.results.version))
  const done = versions.find(r => r.state === 'done')
  if (done) return { result: done, computed: false }
  const pending = versions.find(r => r.state === 'queued' || r.state === 'running')
    ?? (await insertResultVersions(db, { study, spec: study.spec, sets: [set], second, userId: analyst }))[0]!
  // Imported here: the engine (and its expression parser) takes about a second to load, which
  // a seed with nothing to compute should not pay.
  const { runStudy } = await import('../../server/domain/studies/run')
  await runStudy(db, pending.id)
  const [row] = await db.select().from(t.results).where(eq(t.results.id, pending.id))
  if (row?.state !== 'done') throw new Error(`demo study "${study.name}" on ${set.name}: the result ended ${row?.state ?? 'missing'}${row?.error ? ` (${row.error})` : ''}`)
  return { result: row, computed: true }
}

/**
 * The demo's review steps (submit, then approve), written as the review routes write them: the
 * state, the step with its comment, the audit event; only on a draft result without any step.
 */
async function seedReview(db: DB, workspaceId: string, result: Result, steps: NonNullable<DemoStudy['review']>, users: Record<Role, string>) {
  const [any] = await db.select({ id: t.resultReviews.id }).from(t.resultReviews).where(eq(t.resultReviews.resultId, result.id)).limit(1)
  if (any || result.reviewState !== 'draft') return false
  await db.transaction(async (tx) => {
    for (const step of steps) {
      const actorId = users[step.by]
      await tx.update(t.results).set({ reviewState: step.action }).where(eq(t.results.id, result.id))
      await tx.insert(t.resultReviews).values({ resultId: result.id, action: step.action, comment: step.comment, actorId })
      await tx.insert(t.auditEvents).values({ workspaceId, actorId, action: `result.${step.action}`, subjectType: 'result', subjectId: result.id, detail: { version: result.version, comment: step.comment } })
    }
  })
  return true
}

async function seedMeasurement(db: DB, workspaceId: string, study: Study, m: NonNullable<DemoStudy['measurement']>, analyst: string) {
  const [existing] = await db.select({ id: t.measurements.id }).from(t.measurements)
    .where(and(eq(t.measurements.studyId, study.id), eq(t.measurements.name, m.name)))
  if (existing) return false
  const data = readMeasurement(m)
  const bins = (study.spec).bins.length
  if (data.values.length !== bins) throw new RangeError(`samples/measurements/${m.points}: ${data.values.length} points for the ${bins} bins of "${study.name}"`)
  await db.transaction(async (tx) => {
    const [row] = await tx.insert(t.measurements).values({ studyId: study.id, name: m.name, data, pointCount: bins, uploadedBy: analyst }).returning({ id: t.measurements.id })
    await tx.insert(t.auditEvents).values({ workspaceId, actorId: analyst, action: 'measurement.uploaded', subjectType: 'measurement', subjectId: row!.id, detail: { studyId: study.id, points: bins, seeded: true } })
  })
  return true
}

export async function run({ db, log, state }: SeedContext) {
  const workspaceId = state.demoWorkspaceId as string
  const users = state.demoUserIds as Record<Role, string>
  const setIds = state.demoSetIds as Record<DemoSetKey, string>
  // Everything but the file itself (tens of MB): the checks need the header and the axes.
  const { content: _content, ...setColumns } = getTableColumns(t.errorSets)
  const setRows = new Map((await db.select(setColumns).from(t.errorSets).where(eq(t.errorSets.workspaceId, workspaceId))).map(s => [s.id, s]))
  const setOf = (key: DemoSetKey) => setRows.get(setIds[key])!
  // The seed's runs are not a user's jobs: no "your run ended" mail however long they take.
  const mailAfter = process.env.SHEAF_MAIL_AFTER_MS
  process.env.SHEAF_MAIL_AFTER_MS = String(Number.MAX_SAFE_INTEGER)
  let changed = 0
  try {
    for (const d of DEMO_STUDIES) {
      const started = performance.now()
      const second = d.second ? setOf(d.second) : null
      const study = await findOrCreateStudy(db, workspaceId, users.analyst, d, d.sets.map(setOf), second)
      const results: Result[] = []
      let computed = 0
      for (const key of d.sets) {
        const r = await ensureResult(db, study, setOf(key), second, users.analyst)
        results.push(r.result)
        if (r.computed) computed++
      }
      const reviewed = d.review ? await seedReview(db, workspaceId, results[0]!, d.review, users) : false
      const measured = d.measurement ? await seedMeasurement(db, workspaceId, study, d.measurement, users.analyst) : false
      if (computed || reviewed || measured) {
        changed++
        log(`demo study "${d.name}": ${(study.spec).bins.length} bins, ${computed} result(s) computed${reviewed ? ', review steps added' : ''}${measured ? ', measurement added' : ''} (${Math.round(performance.now() - started)} ms)`)
      }
    }
    if (!changed) log(`${DEMO_STUDIES.length} demo studies with their results, reviews and measurement already there`)
  } finally {
    if (mailAfter === undefined) delete process.env.SHEAF_MAIL_AFTER_MS
    else process.env.SHEAF_MAIL_AFTER_MS = mailAfter
  }
}
