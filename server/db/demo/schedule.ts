import { and, count, eq, inArray } from 'drizzle-orm'
import type { Database } from '../client'
import { batchEvents, batches, furnaceStations, furnaces, planRevisions, plans, quenchStations, users } from '../schema'
import { bookBatch } from '../../schedule/booking'
import type { RecordConfig } from '../../records/config'
import { writeCooldownRecord } from '../../records/service'
import { deriveSlots, type BatchState } from '../../../shared/schedule'
import type { ResolvedPlan } from '../../../shared/schemas/plan'
import type { QuenchantKind } from '../../../shared/schemas/quenchant'
import type { PlanSummary } from '../../../shared/types/plan'
import { DEMO_PLANS } from './plans'
import { DEMO_LOAD_PREFIX } from './shop'

export interface DemoPlanRevision {
  planRevisionId: number
  summary: PlanSummary
  /** The first stage's medium: the kind of tank the load goes into. */
  bathKind: QuenchantKind
}

/** The latest revisions of the seeded demo plans, in DEMO_PLANS order (for the demo schedule and the schedule benchmark). */
export async function demoPlanRevisions(db: Database): Promise<DemoPlanRevision[]> {
  const names = DEMO_PLANS.map((p) => p.name)
  const rows = await db
    .select({ name: plans.name, planRevisionId: planRevisions.id, spec: planRevisions.spec, summary: planRevisions.summary })
    .from(plans)
    .innerJoin(planRevisions, and(eq(planRevisions.planId, plans.id), eq(planRevisions.revision, plans.latestRevision)))
    .where(inArray(plans.name, names))
  return rows
    .sort((a, b) => names.indexOf(a.name) - names.indexOf(b.name))
    .map((row) => {
      const spec = row.spec as ResolvedPlan
      const first = spec.library.quenchants.find((q) => q.id === spec.stages[0]!.quenchantId)!
      return { planRevisionId: row.planRevisionId, summary: row.summary as unknown as PlanSummary, bathKind: first.kind }
    })
}

export interface DemoScheduleResult {
  loads: number
  /** Cooldown records written for the loads already released (0 without a seal key). */
  records: number
}

/**
 * Three furnaces, three stations and about two days of loads around now. Loads
 * whose charge time has passed are advanced as if the floor had followed the plan
 * to the minute, except that every fifth one went into the bath two and a half
 * minutes late; loads already released get their cooldown record (sealed and linked
 * as `recordConfig` says, their hold-time sheets queued as on a real release), so the
 * QA lead has records to review, one of them with a deviation. Runs once.
 */
export async function seedDemoSchedule(db: Database, recordConfig: RecordConfig | null): Promise<DemoScheduleResult | null> {
  const [{ total }] = await db.select({ total: count() }).from(furnaces)
  if (total > 0) return null
  const [metallurgist] = await db.select().from(users).where(eq(users.role, 'metallurgist'))
  const [operator] = await db.select().from(users).where(eq(users.role, 'operator'))
  const demoPlans = await demoPlanRevisions(db)
  if (!metallurgist || !operator || demoPlans.length === 0) return null

  const furnaceIds: number[] = []
  for (const f of [
    { name: 'Bay 1 box furnace', kind: 'box' as const, maxTemp_C: 1100, capacity_kg: 800, zoneWidth_mm: 900, zoneDepth_mm: 1200, zoneHeight_mm: 700 },
    { name: 'Bay 2 pit furnace', kind: 'pit' as const, maxTemp_C: 1000, capacity_kg: 2500, zoneWidth_mm: 1000, zoneDepth_mm: 1000, zoneHeight_mm: 2400 },
    { name: 'Bay 3 car bottom furnace', kind: 'car-bottom' as const, maxTemp_C: 1150, capacity_kg: 6000, zoneWidth_mm: 1800, zoneDepth_mm: 3000, zoneHeight_mm: 1200 },
  ]) {
    const [{ id }] = await db.insert(furnaces).values(f).$returningId()
    furnaceIds.push(id)
  }
  const stations: { id: number; kind: QuenchantKind }[] = []
  for (const s of [
    { name: 'Oil tank A', kind: 'oil' as const, maxTemp_C: 90, capacity_kg: 3000 },
    { name: 'Water tank', kind: 'water' as const, maxTemp_C: 40, capacity_kg: 6000 },
    { name: 'Polymer tank', kind: 'polymer' as const, maxTemp_C: 50, capacity_kg: 6000 },
  ]) {
    const [{ id }] = await db.insert(quenchStations).values(s).$returningId()
    stations.push({ id, kind: s.kind })
  }
  await db.insert(furnaceStations).values(furnaceIds.flatMap((furnaceId) => stations.map((station) => ({ furnaceId, stationId: station.id }))))
  // Each load goes to the tank holding its plan's first quench medium (the oil tank when there is none).
  const stationFor = (plan: DemoPlanRevision) => (stations.find((s) => s.kind === plan.bathKind) ?? stations[0]!).id

  const now = Date.now()
  const hour = 3600_000
  let sequence = 0
  let records = 0
  const booking = { loadPrefix: DEMO_LOAD_PREFIX }
  for (const [f, furnaceId] of furnaceIds.entries()) {
    let charge = now - 14 * hour + f * 40 * 60_000
    while (charge < now + 36 * hour) {
      const plan = demoPlans[sequence % demoPlans.length]!
      const stationId = stationFor(plan)
      sequence += 1
      const input = { planRevisionId: plan.planRevisionId, furnaceId, stationId, plannedCharge: new Date(charge).toISOString(), partCount: 12 + (sequence % 5) * 6, mass_kg: 150 + (sequence % 4) * 90, reference: `WO-${4100 + sequence}` }
      let booked
      try {
        booked = await bookBatch(input, metallurgist, booking, db)
      } catch (error) {
        const next = (error as { data?: { nextFreeStart?: string } }).data?.nextFreeStart
        if (!next) throw error
        booked = await bookBatch({ ...input, plannedCharge: next }, metallurgist, booking, db)
      }
      const state = await followPlan(db, booked.id, now, operator.id, sequence % 5 === 2 ? LATE_QUENCH_S : 0)
      if (state === 'released' && recordConfig) {
        await db.transaction((tx) => writeCooldownRecord(tx, booked.id, operator, recordConfig))
        records += 1
      }
      charge = booked.furnaceEnd + 20 * 60_000
    }
  }
  return { loads: sequence, records }
}

/** How late the demo's late loads reach the bath: with the 60 s transfer, past a 180 s allowance, so their records show a quench-delay deviation. */
const LATE_QUENCH_S = 150

/**
 * Writes the floor events a batch would have by `now` had everything run on time but
 * the quench, `lateQuench_s` late (with everything after it): the door opens at the
 * planned soak end, so a late quench is a slow transfer; returns the state reached.
 */
async function followPlan(db: Database, id: number, now: number, operatorId: number, lateQuench_s: number): Promise<BatchState> {
  const [row] = await db.select().from(batches).where(eq(batches.id, id))
  if (!row || row.furnaceStart.getTime() > now) return 'planned'
  const plan = deriveSlots(row.plannedCharge.getTime(), row)
  const heatUp_s = row.minimumSoak_s === null ? row.furnace_s / 2 : row.furnace_s - row.minimumSoak_s
  const late = lateQuench_s * 1000
  const steps: [BatchState, BatchState, number, number | null][] = [
    ['planned', 'charged', plan.furnaceStart, operatorId],
    ['charged', 'soaking', plan.furnaceStart + heatUp_s * 1000, operatorId],
    ['soaking', 'unloaded', plan.furnaceEnd, operatorId],
    ['unloaded', 'quenched', plan.quenchStart + late, operatorId],
    ['quenched', 'cooling', plan.quenchEnd + late, null],
    ['cooling', 'ready', plan.handlingAt + late, null],
    ['ready', 'released', plan.handlingAt + late + 3600_000, operatorId],
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
      unloadedAt: reached('unloaded') ? new Date(plan.furnaceEnd) : null,
      quenchedAt: reached('quenched') ? new Date(plan.quenchStart + late) : null,
    })
    .where(eq(batches.id, id))
  return state
}
