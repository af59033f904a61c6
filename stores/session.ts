import { defineStore } from 'pinia'
import { roleAtLeast, type Role } from '#shared/utils/roles'

export interface SessionUser { id: string, email: string, name: string, emailVerified: boolean }
export interface SessionMembership { workspaceId: string, name: string, role: Role }

/** The signed-in user, their workspaces and the current one (kept in the sheaf_workspace cookie). */
export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null)
  const memberships = ref<SessionMembership[]>([])
  const loaded = ref(false)
  const workspaceCookie = useCookie<string | null>('sheaf_workspace', { sameSite: 'lax', maxAge: 365 * 24 * 3600, default: () => null })

  const currentWorkspace = computed(() =>
    memberships.value.find(m => m.workspaceId === workspaceCookie.value) ?? memberships.value[0] ?? null)
  const currentWorkspaceId = computed(() => currentWorkspace.value?.workspaceId ?? null)
  const role = computed<Role | null>(() => currentWorkspace.value?.role ?? null)

  /** True when the current workspace role is at least `min`. */
  function can(min: Role) {
    return role.value !== null && roleAtLeast(role.value, min)
  }

  async function load() {
    const fetcher = useRequestFetch()
    try {
      const me = await fetcher('/api/auth/me')
      user.value = me.user
      memberships.value = me.memberships
    } catch {
      user.value = null
      memberships.value = []
    }
    loaded.value = true
  }

  async function ensureLoaded() {
    if (!loaded.value) await load()
  }

  async function signIn(email: string, password: string) {
    await $fetch('/api/auth/signin', { method: 'POST', body: { email, password } })
    await load()
  }

  async function signOut() {
    await $fetch('/api/auth/signout', { method: 'POST' })
    user.value = null
    memberships.value = []
    clearNuxtData()
    await navigateTo('/signin')
  }

  function selectWorkspace(id: string) {
    workspaceCookie.value = id
    clearNuxtData()
  }

  /** After joining or creating a workspace: reload memberships, switch to it, open the dashboard. */
  async function enterWorkspace(id: string) {
    await load()
    selectWorkspace(id)
    await navigateTo('/')
  }

  return { user, memberships, loaded, currentWorkspace, currentWorkspaceId, role, can, load, ensureLoaded, signIn, signOut, selectWorkspace, enterWorkspace }
})
