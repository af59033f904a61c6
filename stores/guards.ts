// Route guards used inline from definePageMeta (the project keeps no middleware/ folder).

/** Pages that need a signed-in user: otherwise to /signin?next=… */
export const signedIn = defineNuxtRouteMiddleware(async (to) => {
  const session = useSessionStore()
  await session.ensureLoaded()
  if (!session.user) return navigateTo({ path: '/signin', query: { next: to.fullPath } })
})

/** Sign-in and sign-up pages: a signed-in user goes to the dashboard (or ?next). */
export const signedOut = defineNuxtRouteMiddleware(async (to) => {
  const session = useSessionStore()
  await session.ensureLoaded()
  if (session.user) return navigateTo(safeNext(to.query.next))
})

/** Only same-site paths are followed after sign-in. */
export function safeNext(next: unknown): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : '/'
}

declare module '#app' {
  interface PageMeta {
    /** 'bare': no navigation bar (sign-in, sign-up, verify, reset). */
    shell?: 'bare'
  }
}
