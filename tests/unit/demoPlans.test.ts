import { describe, expect, it } from 'vitest'
import { DEMO_PLANS } from '../../server/db/demo/plans'
import { DEMO_MATERIALS } from '../../server/db/demo/materials'
import { DEMO_QUENCHANTS } from '../../server/db/demo/quenchants'
import { computePlan } from '../../server/planning/computePlan'
import { pointValue } from '../../shared/pointSeries'
import { resolveDemo } from '../support/demoPlans'

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
