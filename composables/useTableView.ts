import { computed, ref, type Ref } from 'vue'

export type SortDirection = 'asc' | 'desc'
export type SortValue = string | number | null | undefined

export interface TableViewOptions<Row> {
  /** How each sortable column compares: a number sorts numerically, a string by name. */
  columns: Record<string, (row: Row) => SortValue>
  /** Text a search matches against (name, source, notes…). */
  searchText: (row: Row) => string
  initialSort: string
}

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' })

function compare(a: SortValue, b: SortValue): number {
  // Empty cells sort last in either direction so they never hide the real values.
  if (a == null || b == null) return a == null ? (b == null ? 0 : 1) : -1
  if (typeof a === 'number' && typeof b === 'number') return a - b
  return collator.compare(String(a), String(b))
}

/** Click-to-sort and type-to-filter for the small tables held entirely in the page. */
export function useTableView<Row>(rows: Ref<Row[] | null | undefined>, options: TableViewOptions<Row>) {
  const query = ref('')
  const sortKey = ref(options.initialSort)
  const direction = ref<SortDirection>('asc')

  function toggleSort(key: string) {
    if (sortKey.value === key) direction.value = direction.value === 'asc' ? 'desc' : 'asc'
    else {
      sortKey.value = key
      direction.value = 'asc'
    }
  }

  const visible = computed(() => {
    // Every word typed must appear somewhere in the row, in any order: "304 1000" finds "AISI 304 stainless at 1000 K".
    const words = query.value.toLowerCase().split(/\s+/).filter(Boolean)
    const value = options.columns[sortKey.value] ?? (() => null)
    const sign = direction.value === 'asc' ? 1 : -1
    return (rows.value ?? [])
      .filter((row) => {
        const text = options.searchText(row).toLowerCase()
        return words.every((word) => text.includes(word))
      })
      .map((row, index) => ({ row, index }))
      .sort((a, b) => {
        const va = value(a.row)
        const vb = value(b.row)
        const order = va == null || vb == null ? compare(va, vb) : sign * compare(va, vb)
        return order || a.index - b.index
      })
      .map(({ row }) => row)
  })

  return { query, sortKey, direction, toggleSort, visible }
}
