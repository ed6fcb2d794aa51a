import type { Role } from '~~/shared/roles'

export interface NavItem {
  to: string
  label: string
  roles: readonly Role[]
}

// One list drives both the header and the page guard's idea of "home" per role.
const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Shift overview', roles: [] },
  { to: '/plans', label: 'Plans', roles: [] },
  { to: '/schedule', label: 'Schedule', roles: [] },
  { to: '/floor', label: 'Floor', roles: ['operator', 'admin', 'metallurgist'] },
  { to: '/records', label: 'Records', roles: ['qa', 'metallurgist', 'admin'] },
  { to: '/library/materials', label: 'Materials', roles: [] },
  { to: '/library/quenchants', label: 'Quench media', roles: [] },
  { to: '/admin/furnaces', label: 'Furnaces', roles: ['admin'] },
  { to: '/admin/users', label: 'People', roles: ['admin'] },
  { to: '/admin/audit', label: 'Audit trail', roles: ['admin', 'qa'] },
  { to: '/admin/outbox', label: 'Outbox', roles: ['admin'] },
  { to: '/admin/mail-recipients', label: 'Mail recipients', roles: ['admin'] },
]

/** Navigation entries the signed-in user's role may open. */
export function useNavigation() {
  const { role } = useRole()
  const items = computed(() => NAV_ITEMS.filter((item) => item.roles.length === 0 || (role.value && item.roles.includes(role.value))))
  return { items, role }
}
