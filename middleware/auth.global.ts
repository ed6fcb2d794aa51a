import { type Capability, can } from '~~/shared/access'
import type { Role } from '~~/shared/roles'

declare module '#app' {
  interface PageMeta {
    /** Open without signing in (the sign-in page). */
    public?: boolean
    /** What opening the page takes (shared/access.ts); absent means any signed-in role. */
    capability?: Capability
  }
}

// Navigation only: the server enforces roles on every API call regardless.
export default defineNuxtRouteMiddleware(async (to) => {
  if (to.meta.public) return
  const { data, getSession } = useAuth()
  if (!data.value?.user) await getSession()
  const user = data.value?.user as { role?: Role; mustChangePassword?: boolean } | undefined
  if (!user?.role) {
    return navigateTo({ path: '/login', query: { next: to.fullPath } })
  }
  if (user.mustChangePassword && to.path !== '/account/password') return navigateTo('/account/password')
  if (to.meta.capability && !can(user.role, to.meta.capability)) {
    return navigateTo({ path: '/', query: { denied: to.path } })
  }
})
