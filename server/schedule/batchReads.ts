import { and, asc, desc, eq, gt, inArray, lt, sql } from 'drizzle-orm'
import { createError } from 'h3'
import type { Database } from '../db/client'
import { preparedPerDatabase } from '../db/preparedQueries'
import { batches, furnaces, planRevisions, plans, quenchStations } from '../db/schema'
import { FLOOR_STATES, FLOOR_TAPS } from '../../shared/schedule'
import type { BatchDetail, FloorCardWire, FloorCurve, FloorPlanFacts, FloorPoll, PlanOption } from '../../shared/types/schedule'
import { useDb } from '../utils/db'
import { eventViewsOf, readSummary, selectBatchesInContext, toBatchView } from './batchQueries'
import { quenchMediumOf } from './quenchMedium'
import { readShopSettings } from './shopSettings'

/** Batches whose time (charge to handling) touches [from, to); the schedule's week query. */
export async function listBatches(from: Date, to: Date, furnaceId?: number, db: Database = useDb()) {
  const settings = await readShopSettings(db)
  const conditions = [lt(batches.furnaceStart, to), gt(batches.handlingAt, from)]
  if (furnaceId) conditions.push(eq(batches.furnaceId, furnaceId))
  const rows = await db.select().from(batches).where(and(...conditions)).orderBy(asc(batches.furnaceStart))
  const now = Date.now()
  return { serverNow: now, batches: rows.map((row) => toBatchView(row, settings, now)) }
}

export async function getBatch(id: number): Promise<BatchDetail> {
  const db = useDb()
  const [found] = await selectBatchesInContext(db).where(eq(batches.id, id))
  if (!found) throw createError({ statusCode: 404, statusMessage: 'Load not found' })
  const events = (await eventViewsOf(db, [id])).get(id)!
  const b = found.batch
  return {
    ...toBatchView(b, await readShopSettings()),
    planName: found.plan.name,
    revision: found.revision.revision,
    furnaceName: found.furnace.name,
    stationName: found.station.name,
    summary: readSummary(found.revision.summary)!,
    durations: {
      furnace_s: b.furnace_s,
      minimumSoak_s: b.minimumSoak_s,
      transfer_s: b.transfer_s,
      quench_s: b.quench_s,
      quenchToHandling_s: b.quenchToHandling_s,
      quenchDelayAllowance_s: b.quenchDelayAllowance_s,
    },
    events,
  }
}

/** Plan revisions never change once written, so their floor facts are read once per process (bounded). */
const revisionFacts = new Map<number, Omit<FloorPlanFacts, 'planName'>>()
const REVISION_FACTS_KEPT = 1000

/**
 * The handling facts of plan revisions, from the cache or, for those not yet read, from
 * their stored summaries: the floor poll no longer parses a whole summary per card. The
 * answer is a map of its own, so a clearing of the bounded cache (here or by a poll
 * running alongside) cannot take facts from under the caller.
 */
async function revisionFactsOf(revisionIds: number[]): Promise<Map<number, Omit<FloorPlanFacts, 'planName'>>> {
  const found = new Map<number, Omit<FloorPlanFacts, 'planName'>>()
  const missing: number[] = []
  for (const id of new Set(revisionIds)) {
    const cached = revisionFacts.get(id)
    if (cached) found.set(id, cached)
    else missing.push(id)
  }
  if (missing.length > 0) {
    const rows = await useDb().select({ id: planRevisions.id, summary: planRevisions.summary }).from(planRevisions).where(inArray(planRevisions.id, missing))
    if (revisionFacts.size + rows.length > REVISION_FACTS_KEPT) revisionFacts.clear()
    for (const row of rows) {
      const summary = readSummary(row.summary)!
      const facts = {
        handling_C: summary.handling_C,
        quenchToHandling_s: summary.quenchToHandling_s,
        ...(summary.slowEndToHandling_s === undefined ? {} : { slowEndToHandling_s: summary.slowEndToHandling_s }),
      }
      revisionFacts.set(row.id, facts)
      found.set(row.id, facts)
    }
  }
  return found
}

/** The floor's loads charged before `before` (a placeholder), on every furnace or on `furnaceId`. */
function floorRowsQuery(db: Database, oneFurnace: boolean) {
  const conditions = [inArray(batches.state, [...FLOOR_STATES]), lt(batches.furnaceStart, sql.placeholder('before'))]
  if (oneFurnace) conditions.push(eq(batches.furnaceId, sql.placeholder('furnaceId')))
  return db
    .select({ batch: batches, planName: plans.name, furnaceName: furnaces.name, stationName: quenchStations.name })
    .from(batches)
    .innerJoin(planRevisions, eq(planRevisions.id, batches.planRevisionId))
    .innerJoin(plans, eq(plans.id, planRevisions.planId))
    .innerJoin(furnaces, eq(furnaces.id, batches.furnaceId))
    .innerJoin(quenchStations, eq(quenchStations.id, batches.stationId))
    .where(and(...conditions))
    .orderBy(asc(batches.furnaceStart))
    .limit(200)
    .prepare()
}
// Every tablet polls these every few seconds: built once (server/db/preparedQueries.ts).
const floorRowsEverywhere = preparedPerDatabase((db) => floorRowsQuery(db, false))
const floorRowsOnFurnace = preparedPerDatabase((db) => floorRowsQuery(db, true))

/**
 * What the floor works on: every batch in the furnaces, the bath or cooling, not
 * yet handed on, and booked loads due within the next `aheadHours`.
 */
export async function floorBatches(furnaceId: number | undefined, aheadHours = 12) {
  const db = useDb()
  const now = Date.now()
  const before = new Date(now + aheadHours * 3600_000)
  const [settings, rows] = await Promise.all([
    readShopSettings(),
    furnaceId ? floorRowsOnFurnace(db).execute({ before, furnaceId }) : floorRowsEverywhere(db).execute({ before }),
  ])
  const [events, facts] = await Promise.all([eventViewsOf(db, rows.map((r) => r.batch.id)), revisionFactsOf(rows.map((r) => r.batch.planRevisionId))])
  const planFacts: FloorPoll['plans'] = {}
  const cards: FloorCardWire[] = rows.map((r) => {
    const view = toBatchView(r.batch, settings, now)
    planFacts[view.planRevisionId] = { planName: r.planName, ...facts.get(view.planRevisionId)! }
    return {
      id: view.id,
      loadNumber: view.loadNumber,
      planRevisionId: view.planRevisionId,
      partCount: view.partCount,
      mass_kg: view.mass_kg,
      reference: view.reference,
      state: view.state,
      furnaceStart: view.furnaceStart,
      furnaceEnd: view.furnaceEnd,
      quenchEnd: view.quenchEnd,
      handlingAt: view.handlingAt,
      quenchedAt: view.quenchedAt,
      furnaceName: r.furnaceName,
      stationName: r.stationName,
      bookedToHandling_s: Math.round(r.batch.quenchToHandling_s * 10) / 10,
      quenchDelayAllowance_s: r.batch.quenchDelayAllowance_s,
      ...(view.conflictWith ? { conflictWith: view.conflictWith, conflictNote: view.conflictNote } : {}),
      taps: events
        .get(r.batch.id)!
        .filter((event) => event.actorId !== null && FLOOR_TAPS.includes(event.toState))
        .map(({ id, toState, at, originalAt }) => ({ id, toState, at, originalAt })),
    }
  })
  return { serverNow: now, settings, plans: planFacts, batches: cards } satisfies FloorPoll
}

/** The handling-point series of the given plan revisions, for the floor's countdown cards. */
export async function floorCurves(planRevisionIds: number[]): Promise<FloorCurve[]> {
  if (planRevisionIds.length === 0) return []
  const rows = await useDb()
    .select({ id: planRevisions.id, summary: planRevisions.summary })
    .from(planRevisions)
    .where(inArray(planRevisions.id, planRevisionIds))
  return rows.flatMap((row) => {
    const summary = readSummary(row.summary)
    return summary ? [{ planRevisionId: row.id, handlingPointSeries: summary.handlingPointSeries }] : []
  })
}

/** Plan revisions with a computed summary, newest first: what the booking form offers. */
export async function planOptions(): Promise<PlanOption[]> {
  const rows = await useDb()
    .select({
      planRevisionId: planRevisions.id,
      planId: plans.id,
      planName: plans.name,
      revision: planRevisions.revision,
      summary: planRevisions.summary,
      spec: planRevisions.spec,
    })
    .from(planRevisions)
    .innerJoin(plans, eq(plans.id, planRevisions.planId))
    .where(and(eq(plans.archived, false), sql`${planRevisions.summary} IS NOT NULL`))
    .orderBy(asc(plans.name), desc(planRevisions.revision))
    .limit(500)
  // Rows come newest revision first within each plan, so the first seen is the latest.
  const seen = new Set<number>()
  return rows.flatMap((row) => {
    const summary = readSummary(row.summary)
    if (!summary) return []
    const latest = !seen.has(row.planId)
    seen.add(row.planId)
    return [{
      planRevisionId: row.planRevisionId,
      planName: row.planName,
      revision: row.revision,
      latest,
      quenchKind: quenchMediumOf(row.spec)?.kind ?? null,
      quenchToHandling_s: summary.quenchToHandling_s,
      furnace_s: summary.soak?.total_s ?? null,
      furnace_C: summary.soak?.furnace_C ?? null,
    }]
  })
}
