import type { Role } from '~~/shared/roles'

/**
 * The signed-in user's role as the session reports it (undefined when signed out), for
 * showing or hiding controls; the server checks the role again on every request.
 */
export function useRole() {
  const { data } = useAuth()
  const role = computed(() => (data.value?.user as { role?: Role } | undefined)?.role)
  return { role }
}
