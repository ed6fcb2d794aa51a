import { can } from '~~/shared/access'
import { NAV_ITEMS } from '~~/shared/navigation'

/** Navigation entries the signed-in user's role may open. */
export function useNavigation() {
  const { role } = useRole()
  const items = computed(() => NAV_ITEMS.filter((item) => can(role.value, item.capability)))
  return { items, role }
}
