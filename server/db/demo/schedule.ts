import { count, eq } from 'drizzle-orm'
import type { Database } from '../client'
import { batchEvents, batches, furnaceStations, furnaces, planRevisions, plans, quenchStations, users } from '../schema'
import { summaryFromCases, type SummaryCases } from '../../utils/planSummary'
import { bookBatch } from '../../utils/batches'
import { deriveSlots, type BatchState } from '../../../shared/schedule'
import type { PlanSummary } from '../../../shared/types/plan'

const steel = { k: 40, rho: 7850, cp: 475 }

/**
 * Demo plans for Kestrel Bay as engine cases. size_m is the half-thickness (slab)
 * or radius (rod); coefficients are the shop's invented calibration figures.
 */
export const DEMO_PLANS: { name: string; cases: SummaryCases }[] = [
  {
    name: 'Drive pin Ø40 — oil, then still air',
    cases: {
      quench: {
        geometry: 'rod', size_m: 0.02, material: steel, initial_C: 850,
        stages: [{ surface: { h: 800, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 15, ambient_C: 25 } }],
        target: { at: 'centre', below_C: 100 },
      },
      heatUp: {
        geometry: 'rod', size_m: 0.02, material: steel, initial_C: 20,
        stages: [{ surface: { h: 120, ambient_C: 860 } }],
        target: { at: 'centre', above_C: 850 },
      },
      furnace_C: 860,
      minimumSoak_s: 1800,
    },
  },
  {
    name: 'Wear plate 30 mm — water, then still air',
    cases: {
      quench: {
        geometry: 'slab', size_m: 0.015, material: steel, initial_C: 880,
        stages: [{ surface: { h: 3000, ambient_C: 30 }, duration_s: 90 }, { surface: { h: 15, ambient_C: 25 } }],
        target: { at: 'centre', below_C: 60 },
      },
      heatUp: {
        geometry: 'slab', size_m: 0.015, material: steel, initial_C: 20,
        stages: [{ surface: { h: 150, ambient_C: 890 } }],
        target: { at: 'centre', above_C: 880 },
      },
      furnace_C: 890,
      minimumSoak_s: 2400,
    },
  },
  {
    name: 'Flange Ø120 — polymer bath, no soak planning',
    cases: {
      quench: {
        geometry: 'rod', size_m: 0.06, material: steel, initial_C: 860,
        stages: [{ surface: { h: 1500, ambient_C: 40 }, duration_s: 600 }, { surface: { h: 15, ambient_C: 25 } }],
        target: { at: 'centre', below_C: 80 },
      },
    },
  },
]

/** Inserts a plan with one revision whose summary the engine computed. */
export async function insertComputedPlan(db: Database, name: string, cases: SummaryCases, createdBy: number | null): Promise<{ planId: number; planRevisionId: number; summary: PlanSummary }> {
  const summary = summaryFromCases(cases)
  const [{ id: planId }] = await db.insert(plans).values({ name, createdBy }).$returningId()
  const [{ id: planRevisionId }] = await db
    .insert(planRevisions)
    .values({ planId, revision: 1, spec: { cases }, summary: summary as unknown as Record<string, unknown>, note: 'Computed for the demo shop', createdBy })
    .$returningId()
  return { planId, planRevisionId, summary }
}

/**
 * Three furnaces, three stations and about two days of loads around now. Loads
 * whose charge time has passed are advanced as if the floor had followed the plan
 * to the minute, so the floor page has something in every state. Runs once.
 */
export async function seedDemoSchedule(db: Database): Promise<boolean> {
  const [{ total }] = await db.select({ total: count() }).from(furnaces)
  if (total > 0) return false
  const [metallurgist] = await db.select().from(users).where(eq(users.role, 'metallurgist'))
  const [operator] = await db.select().from(users).where(eq(users.role, 'operator'))
  if (!metallurgist || !operator) return false

  const furnaceIds: number[] = []
  for (const f of [
    { name: 'Bay 1 box furnace', kind: 'box' as const, maxTemp_C: 1100, capacity_kg: 800, zoneWidth_mm: 900, zoneDepth_mm: 1200, zoneHeight_mm: 700 },
    { name: 'Bay 2 pit furnace', kind: 'pit' as const, maxTemp_C: 1000, capacity_kg: 2500, zoneWidth_mm: 1000, zoneDepth_mm: 1000, zoneHeight_mm: 2400 },
    { name: 'Bay 3 car-bottom', kind: 'car-bottom' as const, maxTemp_C: 1150, capacity_kg: 6000, zoneWidth_mm: 1800, zoneDepth_mm: 3000, zoneHeight_mm: 1200 },
  ]) {
    const [{ id }] = await db.insert(furnaces).values(f).$returningId()
    furnaceIds.push(id)
  }
  const stationIds: number[] = []
  for (const s of [
    { name: 'Oil tank A', kind: 'oil' as const, maxTemp_C: 90, capacity_kg: 3000 },
    { name: 'Water tank', kind: 'water' as const, maxTemp_C: 40, capacity_kg: 6000 },
    { name: 'Polymer tank', kind: 'polymer' as const, maxTemp_C: 50, capacity_kg: 6000 },
  ]) {
    const [{ id }] = await db.insert(quenchStations).values(s).$returningId()
    stationIds.push(id)
  }
  await db.insert(furnaceStations).values(furnaceIds.flatMap((furnaceId) => stationIds.map((stationId) => ({ furnaceId, stationId }))))

  const demoPlans = []
  for (const plan of DEMO_PLANS) demoPlans.push(await insertComputedPlan(db, plan.name, plan.cases, metallurgist.id))

  const now = Date.now()
  const hour = 3600_000
  let sequence = 0
  for (const [f, furnaceId] of furnaceIds.entries()) {
    let charge = now - 14 * hour + f * 40 * 60_000
    while (charge < now + 36 * hour) {
      const plan = demoPlans[sequence % demoPlans.length]!
      const stationId = stationIds[sequence % demoPlans.length]!
      sequence += 1
      const input = { planRevisionId: plan.planRevisionId, furnaceId, stationId, plannedCharge: new Date(charge).toISOString(), partCount: 12 + (sequence % 5) * 6, mass_kg: 150 + (sequence % 4) * 90, reference: `WO-${4100 + sequence}` }
      let booked
      try {
        booked = await bookBatch(input, metallurgist, db)
      } catch (error) {
        const next = (error as { data?: { nextFreeStart?: string } }).data?.nextFreeStart
        if (!next) throw error
        booked = await bookBatch({ ...input, plannedCharge: next }, metallurgist, db)
      }
      await followPlan(db, booked.id, now, operator.id)
      charge = booked.furnaceEnd + 20 * 60_000
    }
  }
  return true
}

/** Writes the floor events a batch would have by `now` had everything run on time. */
async function followPlan(db: Database, id: number, now: number, operatorId: number) {
  const [row] = await db.select().from(batches).where(eq(batches.id, id))
  if (!row || row.furnaceStart.getTime() > now) return
  const plan = deriveSlots(row.plannedCharge.getTime(), { ...row, minimumSoak_s: row.minimumSoak_s })
  const heatUp_s = row.minimumSoak_s === null ? row.furnace_s / 2 : row.furnace_s - row.minimumSoak_s
  const steps: [BatchState, BatchState, number, number | null][] = [
    ['planned', 'charged', plan.furnaceStart, operatorId],
    ['charged', 'soaking', plan.furnaceStart + heatUp_s * 1000, operatorId],
    ['soaking', 'quenched', plan.quenchStart, operatorId],
    ['quenched', 'cooling', plan.quenchEnd, null],
    ['cooling', 'ready', plan.handlingAt, null],
    ['ready', 'released', plan.handlingAt + 3600_000, operatorId],
  ]
  let state: BatchState = 'planned'
  for (const [from, to, at, actorId] of steps) {
    if (at > now) break
    await db.insert(batchEvents).values({ batchId: id, fromState: from, toState: to, at: new Date(at), actorId })
    state = to
  }
  const reached = (s: BatchState) => steps.findIndex(([, to]) => to === s) <= steps.findIndex(([, to]) => to === state)
  await db
    .update(batches)
    .set({
      state,
      chargedAt: reached('charged') ? new Date(plan.furnaceStart) : null,
      soakingAt: reached('soaking') ? new Date(plan.furnaceStart + heatUp_s * 1000) : null,
      quenchedAt: reached('quenched') ? new Date(plan.quenchStart) : null,
    })
    .where(eq(batches.id, id))
}
