import type { Role } from '~~/shared/roles'

export interface NavItem {
  to: string
  label: string
  /** One line for the tool cards on the shift overview. */
  hint: string
  roles: readonly Role[]
}

// One list drives the header and the tool cards on the shift overview; page access
// itself is declared on each page (definePageMeta roles) and enforced by the server.
const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Shift overview', hint: 'What needs you this shift.', roles: [] },
  { to: '/plans', label: 'Plans', hint: 'Soak and quench-to-handling times for each load, with revisions.', roles: [] },
  { to: '/schedule', label: 'Schedule', hint: 'Furnace and quench-station lanes; book loads into free time.', roles: [] },
  { to: '/floor', label: 'Floor', hint: 'Live countdowns and one-tap floor events.', roles: ['operator', 'admin', 'metallurgist'] },
  { to: '/records', label: 'Records', hint: 'Cooldown records of released loads, signed off by QA.', roles: ['qa', 'metallurgist', 'admin'] },
  { to: '/library/materials', label: 'Materials', hint: 'Thermal properties with their sources.', roles: [] },
  { to: '/library/quenchants', label: 'Quench media', hint: 'Heat-transfer coefficients, their spread and bath temperatures.', roles: [] },
  { to: '/admin/furnaces', label: 'Furnaces', hint: 'Furnaces, quench stations and shop settings.', roles: ['admin'] },
  { to: '/admin/users', label: 'People', hint: 'Who may sign in, in which role.', roles: ['admin'] },
  { to: '/admin/audit', label: 'Audit trail', hint: 'Every sign-in and change, newest first.', roles: ['admin', 'qa'] },
  { to: '/admin/outbox', label: 'Outbox', hint: 'Every e-mail with its status; retry failures.', roles: ['admin'] },
  { to: '/admin/mail-recipients', label: 'Mail recipients', hint: 'Who receives sheets, rejections and the digest.', roles: ['admin'] },
]

/** Navigation entries the signed-in user's role may open. */
export function useNavigation() {
  const { role } = useRole()
  const items = computed(() => NAV_ITEMS.filter((item) => item.roles.length === 0 || (role.value && item.roles.includes(role.value))))
  return { items, role }
}
