import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { listSets } from '../../../../domain/sets/library'
import { publicSetBuild, withQueuePlaces } from '../../../../domain/sets/builds'

// The workspace's error-set library, and the builds from fits that are queued, running or failed.
export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  const workspaceId = workspace.id
  const builds = await useDB().select().from(t.setBuilds)
    .where(eq(t.setBuilds.workspaceId, workspaceId)).orderBy(desc(t.setBuilds.createdAt)).limit(50)
  return { sets: await listSets(useDB(), workspaceId), builds: (await withQueuePlaces(useDB(), builds)).map(b => publicSetBuild(b)) }
})
