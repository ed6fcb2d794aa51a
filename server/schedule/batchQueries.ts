import { and, asc, eq, gt, inArray, lt, ne } from 'drizzle-orm'
import type { Database, Transaction } from '../db/client'
import { batchEventCorrections, batchEvents, batches, furnaces, planRevisions, plans, quenchStations, users, type BatchRow } from '../db/schema'
import { OPEN_STATES, batchFlags, stateByClock, type ShopSettings, type Slots } from '../../shared/schedule'
import type { PlanSummary } from '../../shared/types/plan'
import type { BatchEventView, BatchView } from '../../shared/types/schedule'

// The batch queries and views that booking, moves, the floor and the cooldown records
// all read; kept here so those modules import one place and never each other.

/** A stored summary is JSON from another feature: check the parts the schedule relies on. */
export function readSummary(value: unknown): PlanSummary | null {
  const s = value as PlanSummary | null
  if (!s || typeof s.quenchToHandling_s !== 'number' || !(s.quenchToHandling_s > 0)) return null
  if (!Array.isArray(s.handlingPointSeries) || s.handlingPointSeries.length === 0) return null
  if (s.soak !== null && (typeof s.soak !== 'object' || typeof s.soak.total_s !== 'number')) return null
  return s
}

export const ms = (date: Date | null) => (date ? date.getTime() : null)

/** A row's stored slots as instants (ms). */
export function slotsOf(row: BatchRow): Slots {
  return {
    furnaceStart: row.furnaceStart.getTime(),
    furnaceEnd: row.furnaceEnd.getTime(),
    quenchStart: row.quenchStart.getTime(),
    quenchEnd: row.quenchEnd.getTime(),
    handlingAt: row.handlingAt.getTime(),
  }
}

export function toBatchView(row: BatchRow, settings: ShopSettings, now = Date.now()): BatchView {
  const slots = slotsOf(row)
  const state = stateByClock(row.state, slots, now)
  return {
    id: row.id,
    loadNumber: row.loadNumber,
    planRevisionId: row.planRevisionId,
    furnaceId: row.furnaceId,
    stationId: row.stationId,
    partCount: row.partCount,
    mass_kg: row.mass_kg,
    reference: row.reference,
    state,
    plannedCharge: row.plannedCharge.getTime(),
    ...slots,
    chargedAt: ms(row.chargedAt),
    soakingAt: ms(row.soakingAt),
    unloadedAt: ms(row.unloadedAt),
    quenchedAt: ms(row.quenchedAt),
    furnaceIsDefault: row.furnaceIsDefault,
    conflictWith: row.conflictWith,
    conflictNote: row.conflictNote,
    flags: batchFlags(state, slots, now, row.quenchDelayAllowance_s, settings.temperWithin_s),
  }
}

/** Open batches on the furnace and the station whose slots overlap the given ones. */
export async function collisions(tx: Transaction, furnaceId: number, stationId: number, slots: Slots, exceptId = 0) {
  const open = inArray(batches.state, [...OPEN_STATES])
  const [furnace, station] = await Promise.all([
    tx
      .select()
      .from(batches)
      .where(and(
        eq(batches.furnaceId, furnaceId), open, ne(batches.id, exceptId),
        lt(batches.furnaceStart, new Date(slots.furnaceEnd)), gt(batches.furnaceEnd, new Date(slots.furnaceStart)),
      ))
      .orderBy(asc(batches.furnaceStart)),
    tx
      .select()
      .from(batches)
      .where(and(
        eq(batches.stationId, stationId), open, ne(batches.id, exceptId),
        lt(batches.quenchStart, new Date(slots.quenchEnd)), gt(batches.quenchEnd, new Date(slots.quenchStart)),
      ))
      .orderBy(asc(batches.quenchStart)),
  ])
  return { furnace, station }
}

/** Locks the furnace, then the station (always this order, so two bookings never wait on each other in a cycle). */
export async function lockResources(tx: Transaction, furnaceId: number, stationId: number) {
  const [furnace] = await tx.select().from(furnaces).where(eq(furnaces.id, furnaceId)).for('update')
  const [station] = await tx.select().from(quenchStations).where(eq(quenchStations.id, stationId)).for('update')
  return { furnace, station }
}

/** Batches with the plan, revision summary, furnace and station they were booked on: the detail, the floor and the record read these. */
export function selectBatchesInContext(db: Database | Transaction) {
  return db
    .select({
      batch: batches,
      plan: { id: plans.id, name: plans.name },
      revision: { id: planRevisions.id, revision: planRevisions.revision, summary: planRevisions.summary },
      furnace: { id: furnaces.id, name: furnaces.name },
      station: { id: quenchStations.id, name: quenchStations.name },
    })
    .from(batches)
    .innerJoin(planRevisions, eq(planRevisions.id, batches.planRevisionId))
    .innerJoin(plans, eq(plans.id, planRevisions.planId))
    .innerJoin(furnaces, eq(furnaces.id, batches.furnaceId))
    .innerJoin(quenchStations, eq(quenchStations.id, batches.stationId))
}

/** The columns of a recorded move as the records and the views read it. */
const eventColumns = {
  id: batchEvents.id,
  fromState: batchEvents.fromState,
  toState: batchEvents.toState,
  at: batchEvents.at,
  actorId: batchEvents.actorId,
  actorName: users.displayName,
  shortfallNote: batchEvents.shortfallNote,
}

/** The columns of a tap's correction, with who made it. */
const correctionColumns = {
  id: batchEventCorrections.id,
  eventId: batchEventCorrections.eventId,
  correctedAt: batchEventCorrections.correctedAt,
  reason: batchEventCorrections.reason,
  actorId: batchEventCorrections.actorId,
  actorName: users.displayName,
  createdAt: batchEventCorrections.createdAt,
}

/** A batch's recorded moves in the order they happened, each with who made it. */
export function batchEventsOf(db: Database | Transaction, batchId: number) {
  return db
    .select(eventColumns)
    .from(batchEvents)
    .leftJoin(users, eq(users.id, batchEvents.actorId))
    .where(eq(batchEvents.batchId, batchId))
    .orderBy(asc(batchEvents.at), asc(batchEvents.id))
}

/** A batch's event corrections, oldest first, each with who made it. */
export function correctionsOf(db: Database | Transaction, batchId: number) {
  return db
    .select(correctionColumns)
    .from(batchEventCorrections)
    .innerJoin(users, eq(users.id, batchEventCorrections.actorId))
    .where(eq(batchEventCorrections.batchId, batchId))
    .orderBy(asc(batchEventCorrections.createdAt), asc(batchEventCorrections.id))
}

/**
 * The events of several batches as views: each at its corrected time (the latest
 * correction counts), with the original time and the corrections beside it.
 */
export async function eventViewsOf(db: Database | Transaction, batchIds: number[]): Promise<Map<number, BatchEventView[]>> {
  const views = new Map<number, BatchEventView[]>(batchIds.map((id) => [id, []]))
  if (batchIds.length === 0) return views
  const [events, corrections] = await Promise.all([
    db
      .select({ ...eventColumns, batchId: batchEvents.batchId })
      .from(batchEvents)
      .leftJoin(users, eq(users.id, batchEvents.actorId))
      .where(inArray(batchEvents.batchId, batchIds))
      .orderBy(asc(batchEvents.at), asc(batchEvents.id)),
    db
      .select(correctionColumns)
      .from(batchEventCorrections)
      .innerJoin(users, eq(users.id, batchEventCorrections.actorId))
      .where(inArray(batchEventCorrections.batchId, batchIds))
      .orderBy(asc(batchEventCorrections.createdAt), asc(batchEventCorrections.id)),
  ])
  for (const event of events) {
    const own = corrections
      .filter((c) => c.eventId === event.id)
      .map((c) => ({ at: c.correctedAt.toISOString(), reason: c.reason, by: c.actorName, madeAt: c.createdAt.toISOString() }))
    views.get(event.batchId)!.push({
      id: event.id,
      fromState: event.fromState,
      toState: event.toState,
      at: own.at(-1)?.at ?? event.at.toISOString(),
      actorId: event.actorId,
      actorName: event.actorName,
      shortfallNote: event.shortfallNote,
      originalAt: own.length ? event.at.toISOString() : null,
      corrections: own,
    })
  }
  return views
}
