// The demo's hadron-production studies: a semi-inclusive π⁺ multiplicity on a deuteron target
// (a parton-density set of the demo varying, the fragmentation set Verrel-FF-26-pi+ held at its
// central member as the second set) and e⁺e⁻ → h X at √s = 10.58 and 91.19 GeV on each
// Verrel-FF-26 fragmentation set. Results are computed in this process (runStudy), as for the
// other demo studies. Idempotent: a study is found by name, a result counts when a finished
// version of it exists.
import { getTableColumns, inArray } from 'drizzle-orm'
import type { DB } from '../../server/database/client'
import { tables as t } from '../../server/database/client'
import type { Study } from '../../server/database/schema'
import { slotIssues } from '../../shared/utils/set-match'
import { DEMO_NOTE, ensureResult, findOrCreateStudy, type DemoStudyText, type ErrorSetRow } from './03-demo-studies'

/** The invented fragmentation family the hadron studies run on (built by the engine in the seed). */
export const HADRON_FAMILY = 'Verrel-FF-26'
/** The family's sets, one per hadron species. */
export const HADRON_SET_NAMES = ['Verrel-FF-26-pi+', 'Verrel-FF-26-pi-', 'Verrel-FF-26-K+', 'Verrel-FF-26-K-'] as const

const LO_CAUTION = 'Leading-order multiplicities and hadron spectra are rough (next-to-leading-order corrections to fragmentation observables are large); read the band as the spread of the sets, not as the accuracy of the prediction.'

export const SIDIS_DEMO: DemoStudyText = {
  name: 'KFR-02 · π⁺ multiplicity on the deuteron',
  description: `Semi-inclusive DIS multiplicity M^{π⁺}(x, z, Q²) = Σ e_q² q D_q^{π⁺} / Σ e_q² q per nucleon of a deuteron (Z = 1, A = 2, free nucleons by isospin) at four x with their own Q² and four z ranges, each bin the ratio of the integrals over its z range; for the invented Kestrel fixed-target hadron programme. The parton-density set varies; the fragmentation set Verrel-FF-26-pi+ is held at its central member. ${LO_CAUTION} ${DEMO_NOTE}`,
  binsFile: 'sidis-deuteron-x-z.csv',
  spec: { title: 'π⁺ multiplicity M^h per nucleon of the deuteron', kernel: 'sidis-multiplicity', options: { target: { type: 'nucleus', z: 1, a: 2 } }, quadratureOrder: 6 }
}

export const ANNIHILATION_DEMO: DemoStudyText = {
  name: 'KFR-03 · e⁺e⁻ → h X at 10.58 and 91.19 GeV',
  description: `Normalised single-hadron spectrum (1/σ_tot) dσ^h/dz in e⁺e⁻ annihilation through γ and Z, averaged over seven z ranges, below the Z (√s = 10.58 GeV) and on the Z pole (√s = 91.19 GeV), on each set of the invented Verrel-FF-26 fragmentation family (π⁺, π⁻, K⁺, K⁻). ${LO_CAUTION} ${DEMO_NOTE}`,
  binsFile: 'epem-two-energies-z.csv',
  spec: { title: '(1/σ_tot) dσ^h/dz, √s = 10.58 and 91.19 GeV', kernel: 'epem-hadron', options: { exchange: 'gamma-z' }, rangeMode: 'average', quadratureOrder: 6 }
}

/** The sets the hadron studies run on. */
export interface HadronStudySets {
  /** A parton-density set of the demo (the multiplicity study's main set). */
  partonSetId: string
  /** The fragmentation set into π⁺ (the multiplicity study's second set). */
  pionSetId: string
  /** The fragmentation sets of the e⁺e⁻ study. */
  annihilationSetIds: string[]
}

/**
 * Creates (or finds) the two hadron demo studies in `workspaceId` and computes their missing
 * results. RangeError when a set does not hold what its slot reads (shared/utils/set-match.ts).
 * Returns the studies and how many results were computed.
 */
export async function seedHadronStudies(db: DB, o: { workspaceId: string, analystId: string, sets: HadronStudySets, log?: (m: string) => void }): Promise<{ studies: Study[], computed: number }> {
  const { content: _content, ...columns } = getTableColumns(t.errorSets)
  const ids = [o.sets.partonSetId, o.sets.pionSetId, ...o.sets.annihilationSetIds]
  const rows = new Map((await db.select(columns).from(t.errorSets).where(inArray(t.errorSets.id, ids))).map(r => [r.id, r as ErrorSetRow]))
  const row = (id: string) => {
    const r = rows.get(id)
    if (!r || r.workspaceId !== o.workspaceId) throw new RangeError(`hadron demo studies: no error set ${id} in the demo workspace`)
    return r
  }
  const plan: Array<{ d: DemoStudyText, sets: ErrorSetRow[], second: ErrorSetRow | null }> = [
    { d: SIDIS_DEMO, sets: [row(o.sets.partonSetId)], second: row(o.sets.pionSetId) },
    { d: ANNIHILATION_DEMO, sets: o.sets.annihilationSetIds.map(row), second: null }
  ]
  const studies: Study[] = []
  let computed = 0
  for (const { d, sets, second } of plan) {
    const slots = slotIssues(String(d.spec.kernel), sets.map(densityOf), second ? densityOf(second) : null)
    if (slots.length) throw new RangeError(`demo study "${d.name}": ${slots[0]!.message}`)
    const started = performance.now()
    const study = await findOrCreateStudy(db, o.workspaceId, o.analystId, d, sets, second)
    let n = 0
    for (const set of sets) if ((await ensureResult(db, study, set, second, o.analystId)).computed) n++
    if (n) o.log?.(`demo study "${d.name}": ${study.spec.bins.length} bins, ${n} result(s) computed (${Math.round(performance.now() - started)} ms)`)
    computed += n
    studies.push(study)
  }
  return { studies, computed }
}

const densityOf = (s: ErrorSetRow) => ({ name: s.name, version: s.version, density: s.header.density ?? null })
