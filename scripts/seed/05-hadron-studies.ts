// The hadron-production demo studies (scripts/seed/hadron-studies.ts), once the fragmentation
// family Verrel-FF-26 is in the demo library; without it this step only says so. Runs after the
// step that builds that family.
import { and, desc, eq, inArray } from 'drizzle-orm'
import { tables as t } from '../../server/database/client'
import type { Role } from '../../shared/utils/roles'
import type { SeedContext } from './context'
import type { DemoSetKey } from './02-demo-sets'
import { HADRON_FAMILY, HADRON_SET_NAMES, seedHadronStudies } from './hadron-studies'

export async function run({ db, log, state }: SeedContext) {
  const workspaceId = state.demoWorkspaceId as string
  const users = state.demoUserIds as Record<Role, string>
  const setIds = state.demoSetIds as Record<DemoSetKey, string>
  const rows = await db.select({ id: t.errorSets.id, name: t.errorSets.name }).from(t.errorSets)
    .where(and(eq(t.errorSets.workspaceId, workspaceId), inArray(t.errorSets.name, [...HADRON_SET_NAMES])))
    .orderBy(desc(t.errorSets.createdAt))
  // The newest version of each set of the family.
  const newest = (name: string) => rows.find(r => r.name === name)?.id
  const pion = newest('Verrel-FF-26-pi+')
  const annihilation = HADRON_SET_NAMES.map(newest).filter((id): id is string => id !== undefined)
  if (!pion) {
    log(`hadron demo studies skipped: the ${HADRON_FAMILY} fragmentation sets are not in the demo library`)
    return
  }
  const { computed } = await seedHadronStudies(db, { workspaceId, analystId: users.analyst, sets: { partonSetId: setIds.hessian, pionSetId: pion, annihilationSetIds: annihilation }, log })
  if (!computed) log('2 hadron demo studies with their results already there')
}
