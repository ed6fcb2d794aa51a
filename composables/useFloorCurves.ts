import type { PointStage } from '~~/shared/pointSeries'
import type { FloorCurve } from '~~/shared/types/schedule'

/**
 * The floor cards' curves, fetched once per plan revision and kept for the page's
 * life: the poll sends only card data, and a revision's curve never changes.
 */
export function useFloorCurves() {
  const curves = ref(new Map<number, PointStage[]>())
  const asked = new Set<number>()

  async function ensure(planRevisionIds: number[]): Promise<void> {
    const missing = [...new Set(planRevisionIds)].filter((id) => !asked.has(id))
    if (missing.length === 0) return
    missing.forEach((id) => asked.add(id))
    try {
      const answer = await $fetch<FloorCurve[]>('/api/floor/curves', { query: { ids: missing.join(',') } })
      const next = new Map(curves.value)
      for (const curve of answer) next.set(curve.planRevisionId, curve.handlingPointSeries)
      curves.value = next
    } catch {
      // Asked again on the next poll; until then the cards show no core estimate.
      missing.forEach((id) => asked.delete(id))
    }
  }

  return { curves, ensure }
}
