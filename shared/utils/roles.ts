/** Workspace roles, weakest first: viewer reads and exports, analyst builds and runs, owner manages. */
export const ROLES = ['viewer', 'analyst', 'owner'] as const
export type Role = typeof ROLES[number]

export const ROLE_LABELS: Record<Role, string> = {
  viewer: 'Viewer — read and export',
  analyst: 'Analyst — build error sets, run studies',
  owner: 'Owner — members, approvals, everything'
}

/** True when `role` is at least as strong as `min`. */
export function roleAtLeast(role: Role, min: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(min)
}
