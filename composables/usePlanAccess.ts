import { can } from '~~/shared/access'

/** Whether the signed-in role may edit plans (shared/access.ts; the server enforces the same). */
export function usePlanAccess() {
  const { role } = useRole()
  const canEdit = computed(() => can(role.value, 'plans.edit'))
  return { canEdit }
}
