import { can } from '~~/shared/access'

/**
 * The editing state of a library page: whether the signed-in role may edit (the server
 * enforces the same), and which entry the form holds: null when closed, 'new' when adding,
 * otherwise the entry itself. `dataKey` is the page's useFetch key, refreshed on save.
 */
export function useLibraryEditing<Entry>(dataKey: string) {
  const { role } = useRole()
  const canEdit = computed(() => can(role.value, 'library.edit'))
  const editing = shallowRef<Entry | 'new' | null>(null)
  const saved = ref('')
  const formAnchor = ref<HTMLElement | null>(null)

  async function open(target: Entry | 'new') {
    saved.value = ''
    editing.value = target
    await nextTick()
    formAnchor.value?.scrollIntoView({ behavior: 'smooth', block: 'start' })
  }

  async function onSaved(name: string) {
    // Close the form only once the table shows the saved row, so it never flashes the old values.
    await refreshNuxtData(dataKey)
    editing.value = null
    saved.value = `${name} is saved. Plans made from now on use these values; existing plans keep the values they copied.`
  }

  return { canEdit, editing, saved, formAnchor, open, onSaved }
}

/** Saves a library entry: a PATCH of the existing one, or a POST of a new one. */
export async function saveLibraryEntry(collection: 'materials' | 'quenchants', id: number | undefined, body: object): Promise<void> {
  if (id === undefined) await $fetch(`/api/${collection}`, { method: 'POST', body })
  else await $fetch(`/api/${collection}/${id}`, { method: 'PATCH', body })
}
