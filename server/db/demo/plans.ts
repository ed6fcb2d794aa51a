import { count, eq, inArray } from 'drizzle-orm'
import type { Database } from '../client'
import { materials, plans, quenchants, users } from '../schema'
import { createPlan } from '../../planning/plans'
import { planSpecSchema, type PlanSpecInput } from '../../../shared/schemas/plan'

type DemoStage = { quenchant: string; duration_s?: number }

/**
 * Kestrel Bay's demo plans as a metallurgist would enter them in the editor, naming
 * the demo library's materials and quench media (server/db/demo/materials.ts,
 * quenchants.ts); ids are looked up when seeding.
 */
export interface DemoPlan extends Omit<PlanSpecInput, 'materialId' | 'stages'> {
  material: string
  stages: DemoStage[]
}

export const DEMO_PLANS: DemoPlan[] = [
  {
    name: 'Drive pin Ø40 — agitated oil, then still air',
    part: { shape: 'round-bar', diameter_m: 0.04 },
    material: '1 Cr–½ Mo low-alloy steel',
    start_C: 850,
    stages: [{ quenchant: 'Fast quench oil, agitated', duration_s: 40 }, { quenchant: 'Still air' }],
    handling: { below_C: 100, at: 'centre' },
    soak: { furnace_C: 860, tolerance_K: 10, minimumSoak_s: 1800, charge_C: 20, furnaceH_W_m2K: null },
    // A small pin loses heat fast at the furnace door, so this plan allows less than the shop's default.
    quenchDelayAllowance_s: 180,
  },
  {
    name: 'Wear plate 30 mm — water, then still air',
    part: { shape: 'plate', thickness_m: 0.03 },
    material: 'Plain carbon steel (Mn ≤ 1 %, Si ≤ 0.1 %)',
    start_C: 880,
    stages: [{ quenchant: 'Water', duration_s: 30 }, { quenchant: 'Still air' }],
    handling: { below_C: 60, at: 'centre' },
    soak: { furnace_C: 890, tolerance_K: 10, minimumSoak_s: 2400, charge_C: 20, furnaceH_W_m2K: null },
    quenchDelayAllowance_s: null,
  },
  {
    name: 'Flange Ø120 × 40 — polymer, no soak planning',
    part: { shape: 'cylinder', diameter_m: 0.12, length_m: 0.04 },
    material: '1 Cr–½ Mo low-alloy steel',
    start_C: 860,
    stages: [{ quenchant: 'Polymer solution 10–20 %' }],
    handling: { below_C: 80, at: 'centre' },
    soak: null,
    quenchDelayAllowance_s: null,
  },
  {
    name: 'Case-hardened bar Ø30 — still oil, then still air',
    part: { shape: 'round-bar', diameter_m: 0.03 },
    material: 'Case-hardened AISI 1010 bar (demo)',
    start_C: 830,
    stages: [{ quenchant: 'Fast quench oil, still', duration_s: 45 }, { quenchant: 'Still air' }],
    handling: { below_C: 100, at: 'centre' },
    soak: { furnace_C: 840, tolerance_K: 10, minimumSoak_s: 1200, charge_C: 20, furnaceH_W_m2K: null },
    quenchDelayAllowance_s: null,
  },
]

/**
 * Creates the demo plans through the planner's own service when the plans table is
 * empty, so they open in the editor like any other plan. A plan whose library entries
 * the shop has since renamed is left out rather than guessed. Returns how many were created.
 */
export async function seedDemoPlans(db: Database): Promise<number> {
  const [{ total }] = await db.select({ total: count() }).from(plans)
  if (total > 0) return 0
  const [metallurgist] = await db.select({ id: users.id }).from(users).where(eq(users.role, 'metallurgist'))
  if (!metallurgist) return 0
  const materialRows = await db
    .select({ id: materials.id, name: materials.name })
    .from(materials)
    .where(inArray(materials.name, DEMO_PLANS.map((p) => p.material)))
  const quenchantRows = await db
    .select({ id: quenchants.id, name: quenchants.name })
    .from(quenchants)
    .where(inArray(quenchants.name, DEMO_PLANS.flatMap((p) => p.stages.map((s) => s.quenchant))))
  const materialId = new Map(materialRows.map((m) => [m.name, m.id]))
  const quenchantId = new Map(quenchantRows.map((q) => [q.name, q.id]))

  let created = 0
  for (const { material, stages, ...rest } of DEMO_PLANS) {
    const ids = stages.map((s) => quenchantId.get(s.quenchant))
    if (!materialId.has(material) || ids.some((id) => id === undefined)) continue
    const spec = planSpecSchema.parse({
      ...rest,
      materialId: materialId.get(material),
      stages: stages.map((s, i) => ({ quenchantId: ids[i], ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }) })),
    })
    await createPlan(spec, metallurgist.id, 'Demo plan for Kestrel Bay Heat Treat', db)
    created += 1
  }
  return created
}
