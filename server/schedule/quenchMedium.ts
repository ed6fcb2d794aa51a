import { z } from 'zod'
import { QUENCHANT_KIND_VALUES, type QuenchantKind } from '../../shared/schemas/quenchant'

export interface QuenchMedium {
  name: string
  kind: QuenchantKind
}

// Only what the station check needs, read loosely: older revisions may carry fields the planner has since dropped.
const storedStages = z.object({
  stages: z.array(z.object({ quenchantId: z.number() })).min(1),
  library: z.object({ quenchants: z.array(z.object({ id: z.number(), name: z.string(), kind: z.enum(QUENCHANT_KIND_VALUES) })) }),
})

/**
 * The medium of a revision's first stage, from the library values frozen in its spec:
 * the quench station a load goes to must hold it. Null when the spec names none.
 */
export function quenchMediumOf(spec: unknown): QuenchMedium | null {
  const parsed = storedStages.safeParse(spec)
  if (!parsed.success) return null
  const firstId = parsed.data.stages[0]!.quenchantId
  const quenchant = parsed.data.library.quenchants.find((q) => q.id === firstId)
  return quenchant ? { name: quenchant.name, kind: quenchant.kind } : null
}
