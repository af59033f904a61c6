import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

// The workspace's error-set library, and the builds from fits that are queued, running or failed.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  await requireMembership(workspaceId, user.id, 'viewer')
  const builds = await useDB().select().from(t.setBuilds)
    .where(eq(t.setBuilds.workspaceId, workspaceId)).orderBy(desc(t.setBuilds.createdAt)).limit(50)
  return { sets: await listSets(workspaceId), builds: builds.map(publicSetBuild) }
})
