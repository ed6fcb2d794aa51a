/** Metallurgists and administrators edit plans; operators and QA read them (the server enforces the same). */
export function usePlanAccess() {
  const { role } = useRole()
  const canEdit = computed(() => role.value === 'metallurgist' || role.value === 'admin')
  return { canEdit }
}
