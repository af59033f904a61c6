export default defineEventHandler(async (event) => {
  const { workspace, membership } = await requireWorkspace(event, 'viewer')
  return { id: workspace.id, name: workspace.name, role: membership.role, createdAt: workspace.createdAt }
})
