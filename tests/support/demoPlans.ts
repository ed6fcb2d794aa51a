import type { DEMO_PLANS } from '../../server/db/demo/plans'
import { DEMO_MATERIALS } from '../../server/db/demo/materials'
import { DEMO_QUENCHANTS } from '../../server/db/demo/quenchants'
import { planSpecSchema } from '../../shared/schemas/plan'
import { materialInputSchema } from '../../shared/schemas/material'
import { quenchantInputSchema } from '../../shared/schemas/quenchant'

/** A demo plan resolved against the demo library the way the seed does it, with ids by position. */
export function resolveDemo({ material, stages, ...rest }: (typeof DEMO_PLANS)[number]) {
  const m = materialInputSchema.parse(DEMO_MATERIALS.find((x) => x.name === material))
  const media = stages.map((s) => quenchantInputSchema.parse(DEMO_QUENCHANTS.find((x) => x.name === s.quenchant)))
  const spec = planSpecSchema.parse({
    ...rest,
    materialId: 1,
    stages: stages.map((s, i) => ({ quenchantId: 100 + i, ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }) })),
  })
  return {
    ...spec,
    library: {
      material: {
        id: 1,
        name: m.name,
        k_W_mK: m.k_W_mK,
        density_kg_m3: m.density_kg_m3,
        specificHeat_J_kgK: m.specificHeat_J_kgK,
        gradedProfile: m.gradedProfile,
        propertyTable: m.propertyTable,
        propertyTableSource: m.propertyTableSource,
        source: m.source,
      },
      quenchants: media.map((q, i) => ({
        id: 100 + i,
        name: q.name,
        kind: q.kind,
        hLow_W_m2K: q.hLow_W_m2K,
        hTypical_W_m2K: q.hTypical_W_m2K,
        hHigh_W_m2K: q.hHigh_W_m2K,
        bath_C: q.bath_C,
        coolingCurves: q.coolingCurves,
        emissivity: q.emissivity,
        curveSource: q.curveSource,
        source: q.source,
      })),
    },
  }
}
