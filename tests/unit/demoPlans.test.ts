import { describe, expect, it } from 'vitest'
import { DEMO_PLANS } from '../../server/db/demo/plans'
import { DEMO_MATERIALS } from '../../server/db/demo/materials'
import { DEMO_QUENCHANTS } from '../../server/db/demo/quenchants'
import { computePlan } from '../../server/planning/computePlan'
import { pointValue } from '../../shared/pointSeries'
import { planSpecSchema } from '../../shared/schemas/plan'
import { materialInputSchema } from '../../shared/schemas/material'
import { quenchantInputSchema } from '../../shared/schemas/quenchant'

/** A demo plan resolved against the demo library the way the seed does it, with ids by position. */
function resolveDemo({ material, stages, ...rest }: (typeof DEMO_PLANS)[number]) {
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
      material: { id: 1, name: m.name, k_W_mK: m.k_W_mK, density_kg_m3: m.density_kg_m3, specificHeat_J_kgK: m.specificHeat_J_kgK, gradedProfile: m.gradedProfile, source: m.source },
      quenchants: media.map((q, i) => ({ id: 100 + i, name: q.name, kind: q.kind, hLow_W_m2K: q.hLow_W_m2K, hTypical_W_m2K: q.hTypical_W_m2K, hHigh_W_m2K: q.hHigh_W_m2K, bath_C: q.bath_C, source: q.source })),
    },
  }
}

describe('demo plans', () => {
  it('name only materials and quench media of the demo library (the seed skips a plan it cannot resolve)', () => {
    for (const plan of DEMO_PLANS) {
      expect(DEMO_MATERIALS.map((m) => m.name), plan.name).toContain(plan.material)
      for (const stage of plan.stages) expect(DEMO_QUENCHANTS.map((q) => q.name), plan.name).toContain(stage.quenchant)
    }
  })

  it.each(DEMO_PLANS.map((plan) => [plan.name, plan] as const))('%s computes in the planner; its stored series reads the handling temperature at the handling time', (_name, plan) => {
    const resolved = resolveDemo(plan)
    const { summary } = computePlan(resolved)
    expect(summary.quenchToHandling_s).toBeGreaterThan(0)
    expect(pointValue(summary.handlingPointSeries, summary.quenchToHandling_s)).toBeCloseTo(resolved.handling.below_C, 1)
    expect(summary.soak === null).toBe(resolved.soak === null)
    // A graded plan takes about 2 s of a core; on a shared two-core machine the default 5 s is not enough.
  }, 30_000)
})
