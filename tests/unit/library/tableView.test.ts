import { describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { useTableView } from '../../../composables/useTableView'

interface Row {
  name: string
  k: number | null
}

const rows = ref<Row[]>([
  { name: 'AISI 316 stainless', k: 13.4 },
  { name: 'AISI 1010', k: 63.9 },
  { name: 'Unmeasured alloy', k: null },
  { name: 'AISI 304 stainless at 1000 K', k: 25.4 },
  { name: 'AISI 304 stainless', k: 14.9 },
])

const view = () => useTableView(rows, { columns: { name: (r) => r.name, k: (r) => r.k }, searchText: (r) => r.name, initialSort: 'name' })

describe('table view', () => {
  it('sorts names naturally (304 before 316 before 1010)', () => {
    expect(view().visible.value.map((r) => r.name)).toEqual(['AISI 304 stainless', 'AISI 304 stainless at 1000 K', 'AISI 316 stainless', 'AISI 1010', 'Unmeasured alloy'])
  })

  it('sorts numbers numerically both ways, empty cells last', () => {
    const table = view()
    table.toggleSort('k')
    expect(table.visible.value.map((r) => r.k)).toEqual([13.4, 14.9, 25.4, 63.9, null])
    table.toggleSort('k')
    expect(table.direction.value).toBe('desc')
    expect(table.visible.value.map((r) => r.k)).toEqual([63.9, 25.4, 14.9, 13.4, null])
  })

  it('filters on every word typed, in any order, ignoring case', () => {
    const table = view()
    table.query.value = '1000 304'
    expect(table.visible.value.map((r) => r.name)).toEqual(['AISI 304 stainless at 1000 K'])
    table.query.value = '  stainless '
    expect(table.visible.value).toHaveLength(3)
    table.query.value = 'brass'
    expect(table.visible.value).toEqual([])
  })
})
