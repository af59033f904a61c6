// The hadron-production demo studies (scripts/seed/hadron-studies.ts) on the demo's fragmentation
// family Verrel-FF-26, built by step 02: a semi-inclusive π⁺ multiplicity on the deuteron and an
// e⁺e⁻ → h X study at two energies.
import type { Role } from '../../shared/utils/roles'
import type { SeedContext } from './context'
import type { DemoSetKey } from './02-demo-sets'
import { seedHadronStudies } from './hadron-studies'

export async function run({ db, log, state }: SeedContext) {
  const workspaceId = state.demoWorkspaceId as string
  const users = state.demoUserIds as Record<Role, string>
  const setIds = state.demoSetIds as Record<DemoSetKey, string>
  const { computed } = await seedHadronStudies(db, {
    workspaceId, analystId: users.analyst, log,
    sets: { partonSetId: setIds.hessian, pionSetId: setIds.ffPiPlus, annihilationSetIds: [setIds.ffPiPlus, setIds.ffPiMinus, setIds.ffKPlus, setIds.ffKMinus] }
  })
  if (!computed) log('2 hadron demo studies with their results already there')
}
