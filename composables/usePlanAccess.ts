import type { Role } from '~~/shared/roles'

/** Metallurgists and administrators edit plans; operators and QA read them (the server enforces the same). */
export function usePlanAccess() {
  const { data } = useAuth()
  const canEdit = computed(() => {
    const role = (data.value?.user as { role?: Role } | undefined)?.role
    return role === 'metallurgist' || role === 'admin'
  })
  return { canEdit }
}
