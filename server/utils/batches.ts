import { and, asc, desc, eq, gt, inArray, lt, ne, sql } from 'drizzle-orm'
import type { z } from 'zod'
import { createError } from 'h3'
import type { Database, Transaction } from '../db/client'
import { batchEvents, batches, furnaceStations, furnaces, loadCounters, planRevisions, plans, quenchStations, users, type BatchRow } from '../db/schema'
import {
  OPEN_STATES,
  FLOOR_STATES,
  batchFlags,
  checkMove,
  deriveSlots,
  loadNumber,
  nextFreeStart,
  slotDurations,
  stateByClock,
  type BatchState,
  type ShopSettings,
  type Slots,
} from '../../shared/schedule'
import type { bookingInputSchema } from '../../shared/schemas/schedule'
import type { PlanSummary } from '../../shared/types/plan'
import type { BatchDetail, BatchView, FloorBatch, PlanOption } from '../../shared/types/schedule'
import type { SessionUser } from './auth'
import { recordAudit } from './audit'
import { readShopSettings } from './shopSettings'
import { refuseIfRecordSigned, writeCooldownRecord } from './records'

/** Load numbers start with the shop's initials (Kestrel Bay). */
const LOAD_PREFIX = process.env.SLAKEWISE_LOAD_PREFIX || 'KB'

type Booking = z.output<typeof bookingInputSchema>

function problem(status: number, statusMessage: string, field: string, message: string): never {
  throw createError({ statusCode: status, statusMessage, data: { problems: [{ field, message }] } })
}

/** A stored summary is JSON from another feature: check the parts the schedule relies on. */
export function readSummary(value: unknown): PlanSummary | null {
  const s = value as PlanSummary | null
  if (!s || typeof s.quenchToHandling_s !== 'number' || !(s.quenchToHandling_s > 0)) return null
  if (!Array.isArray(s.handlingPointSeries) || s.handlingPointSeries.length === 0) return null
  if (s.soak !== null && (typeof s.soak !== 'object' || typeof s.soak.total_s !== 'number')) return null
  return s
}

/**
 * The plan's own quench-delay allowance when its spec states one (seconds), else the
 * shop's. The planner stores null for "not set"; 0 is a real choice (straight into the bath).
 */
function quenchDelayAllowance(spec: unknown, settings: ShopSettings): number {
  const value = (spec as { quenchDelayAllowance_s?: unknown } | null)?.quenchDelayAllowance_s
  return typeof value === 'number' && value >= 0 ? value : settings.quenchDelayAllowance_s
}

const ms = (date: Date | null) => (date ? date.getTime() : null)

/** A row's stored slots as instants (ms). */
function slotsOf(row: BatchRow): Slots {
  return {
    furnaceStart: row.furnaceStart.getTime(),
    furnaceEnd: row.furnaceEnd.getTime(),
    quenchStart: row.quenchStart.getTime(),
    quenchEnd: row.quenchEnd.getTime(),
    handlingAt: row.handlingAt.getTime(),
  }
}

function toBatchView(row: BatchRow, settings: ShopSettings, now = Date.now()): BatchView {
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
    quenchedAt: ms(row.quenchedAt),
    furnaceIsDefault: row.furnaceIsDefault,
    conflictWith: row.conflictWith,
    conflictNote: row.conflictNote,
    flags: batchFlags(state, slots, now, row.quenchDelayAllowance_s, settings.temperWithin_s),
  }
}

/** Open batches on the furnace and the station whose slots overlap the given ones. */
async function collisions(tx: Transaction, furnaceId: number, stationId: number, slots: ReturnType<typeof deriveSlots>, exceptId = 0) {
  const open = inArray(batches.state, [...OPEN_STATES])
  const [furnace, station] = await Promise.all([
    tx
      .select()
      .from(batches)
      .where(and(eq(batches.furnaceId, furnaceId), open, ne(batches.id, exceptId), lt(batches.furnaceStart, new Date(slots.furnaceEnd)), gt(batches.furnaceEnd, new Date(slots.furnaceStart))))
      .orderBy(asc(batches.furnaceStart)),
    tx
      .select()
      .from(batches)
      .where(and(eq(batches.stationId, stationId), open, ne(batches.id, exceptId), lt(batches.quenchStart, new Date(slots.quenchEnd)), gt(batches.quenchEnd, new Date(slots.quenchStart))))
      .orderBy(asc(batches.quenchStart)),
  ])
  return { furnace, station }
}

/** Locks the furnace, then the station (always this order, so two bookings never wait on each other in a cycle). */
async function lockResources(tx: Transaction, furnaceId: number, stationId: number) {
  const [furnace] = await tx.select().from(furnaces).where(eq(furnaces.id, furnaceId)).for('update')
  const [station] = await tx.select().from(quenchStations).where(eq(quenchStations.id, stationId)).for('update')
  return { furnace, station }
}

async function nextLoadNumber(tx: Transaction, year: number): Promise<string> {
  // One upsert, not select-then-insert: two bookings on different furnaces could
  // otherwise both find no row for a new year and both insert it.
  await tx.insert(loadCounters).values({ year, last: 1 }).onDuplicateKeyUpdate({ set: { last: sql`${loadCounters.last} + 1` } })
  const [counter] = await tx.select().from(loadCounters).where(eq(loadCounters.year, year))
  return loadNumber(LOAD_PREFIX, year, counter!.last)
}

/**
 * Books a plan revision on a furnace and station. The furnace and station rows are
 * locked first, so of two overlapping bookings the second sees the first's rows
 * (read committed) and is refused with the colliding load and the next free start.
 */
export async function bookBatch(input: Booking, actor: Pick<SessionUser, 'id' | 'role'>, db: Database = useDb()): Promise<BatchView> {
  const plannedCharge = Date.parse(input.plannedCharge)
  return await db.transaction(
    async (tx) => {
      const { furnace, station } = await lockResources(tx, input.furnaceId, input.stationId)
      if (!furnace) problem(422, 'Unknown furnace', 'furnaceId', `No furnace with id ${input.furnaceId}`)
      if (!station) problem(422, 'Unknown quench station', 'stationId', `No quench station with id ${input.stationId}`)
      if (!furnace.active) problem(422, 'Furnace out of service', 'furnaceId', `${furnace.name} is out of service`)
      if (!station.active) problem(422, 'Quench station out of service', 'stationId', `${station.name} is out of service`)
      const [link] = await tx
        .select()
        .from(furnaceStations)
        .where(and(eq(furnaceStations.furnaceId, furnace.id), eq(furnaceStations.stationId, station.id)))
      if (!link) problem(422, 'Station does not serve this furnace', 'stationId', `${station.name} does not serve ${furnace.name}`)
      if (input.mass_kg > furnace.capacity_kg) problem(422, 'Load too heavy', 'mass_kg', `${furnace.name} takes at most ${furnace.capacity_kg} kg`)
      if (input.mass_kg > station.capacity_kg) problem(422, 'Load too heavy', 'mass_kg', `${station.name} takes at most ${station.capacity_kg} kg`)

      const [revision] = await tx.select().from(planRevisions).where(eq(planRevisions.id, input.planRevisionId))
      if (!revision) problem(422, 'Unknown plan revision', 'planRevisionId', `No plan revision with id ${input.planRevisionId}`)
      const summary = readSummary(revision.summary)
      if (!summary) problem(422, 'Plan revision not computed', 'planRevisionId', 'This revision has no computed summary; open it in the planner and save it again')
      if (summary.soak && summary.soak.furnace_C > furnace.maxTemp_C) {
        problem(422, 'Furnace too cool for this plan', 'furnaceId', `${furnace.name} reaches ${furnace.maxTemp_C} °C; the plan soaks at ${summary.soak.furnace_C} °C`)
      }

      const settings = await readShopSettings(tx)
      const d = slotDurations(summary, settings)
      const slots = deriveSlots(plannedCharge, d)
      const hit = await collisions(tx, furnace.id, station.id, slots)
      if (hit.furnace.length || hit.station.length) {
        const onFurnace = hit.furnace[0]
        const other = onFurnace ?? hit.station[0]!
        const where = onFurnace ? furnace.name : station.name
        const [busyFurnace, busyStation] = await Promise.all([
          tx.select({ start: batches.furnaceStart, end: batches.furnaceEnd }).from(batches)
            .where(and(eq(batches.furnaceId, furnace.id), inArray(batches.state, [...OPEN_STATES]), gt(batches.furnaceEnd, new Date(plannedCharge)))),
          tx.select({ start: batches.quenchStart, end: batches.quenchEnd }).from(batches)
            .where(and(eq(batches.stationId, station.id), inArray(batches.state, [...OPEN_STATES]), gt(batches.quenchEnd, new Date(slots.quenchStart)))),
        ])
        const asMs = (rows: { start: Date; end: Date }[]) => rows.map((row) => ({ start: row.start.getTime(), end: row.end.getTime() }))
        const next = nextFreeStart(plannedCharge, slots.furnaceEnd - slots.furnaceStart, slots.quenchStart - slots.furnaceStart, slots.quenchEnd - slots.quenchStart, asMs(busyFurnace), asMs(busyStation))
        throw createError({
          statusCode: 409,
          statusMessage: `${where} is taken by ${other.loadNumber}`,
          data: {
            collidesWith: { id: other.id, loadNumber: other.loadNumber, resource: onFurnace ? 'furnace' : 'station' },
            nextFreeStart: new Date(next).toISOString(),
            problems: [{ field: 'plannedCharge', message: `${where} is taken by ${other.loadNumber}; the next free charge time is ${new Date(next).toISOString()}` }],
          },
        })
      }

      const number = await nextLoadNumber(tx, new Date(plannedCharge).getUTCFullYear())
      const [{ id }] = await tx
        .insert(batches)
        .values({
          loadNumber: number,
          planRevisionId: revision.id,
          furnaceId: furnace.id,
          stationId: station.id,
          partCount: input.partCount,
          mass_kg: input.mass_kg,
          reference: input.reference,
          plannedCharge: new Date(plannedCharge),
          furnace_s: d.furnace_s,
          furnaceIsDefault: d.furnaceIsDefault,
          minimumSoak_s: d.minimumSoak_s,
          transfer_s: d.transfer_s,
          quench_s: d.quench_s,
          quenchToHandling_s: d.quenchToHandling_s,
          quenchDelayAllowance_s: quenchDelayAllowance(revision.spec, settings),
          furnaceStart: new Date(slots.furnaceStart),
          furnaceEnd: new Date(slots.furnaceEnd),
          quenchStart: new Date(slots.quenchStart),
          quenchEnd: new Date(slots.quenchEnd),
          handlingAt: new Date(slots.handlingAt),
          createdBy: actor.id,
        })
        .$returningId()
      await tx.insert(batchEvents).values({ batchId: id, fromState: 'planned', toState: 'planned', at: new Date(), actorId: actor.id })
      await recordAudit(tx, {
        actorId: actor.id,
        action: 'batch.book',
        entityType: 'batch',
        entityId: id,
        details: { loadNumber: number, planRevisionId: revision.id, furnace: furnace.name, station: station.name, plannedCharge: input.plannedCharge },
      })
      const [row] = await tx.select().from(batches).where(eq(batches.id, id))
      return toBatchView(row!, settings)
    },
    { isolationLevel: 'read committed' },
  )
}

/**
 * Records a floor or planning move at the server's time. A move already recorded
 * answers with the batch as it is (a repeated tap changes nothing). Clock moves
 * (out of the bath, safe to handle) are written first at the times the plan gave
 * them, so the event log reads in order.
 */
export async function moveBatch(id: number, to: BatchState, actor: Pick<SessionUser, 'id' | 'role' | 'displayName'>, db: Database = useDb()): Promise<{ batch: BatchView; repeated: boolean }> {
  const [pre] = await db.select({ furnaceId: batches.furnaceId, stationId: batches.stationId }).from(batches).where(eq(batches.id, id))
  if (!pre) throw createError({ statusCode: 404, statusMessage: 'Batch not found' })
  return await db.transaction(
    async (tx) => {
      await lockResources(tx, pre.furnaceId, pre.stationId)
      const [row] = await tx.select().from(batches).where(eq(batches.id, id)).for('update')
      await refuseIfRecordSigned(tx, id)
      const settings = await readShopSettings(tx)
      const now = Date.now()
      const [already] = await tx.select().from(batchEvents).where(and(eq(batchEvents.batchId, id), eq(batchEvents.toState, to)))
      // Only the move that made the current state repeats harmlessly; an older one asked again is a backwards move.
      if (already && row!.state === to && checkMove(already.fromState, to, actor.role).ok) return { batch: toBatchView(row!, settings, now), repeated: true }

      let state = row!.state
      const clock = stateByClock(state, { quenchEnd: row!.quenchEnd.getTime(), handlingAt: row!.handlingAt.getTime() }, now)
      if (state === 'quenched' && clock !== 'quenched') {
        await tx.insert(batchEvents).values({ batchId: id, fromState: 'quenched', toState: 'cooling', at: row!.quenchEnd, actorId: null })
        state = 'cooling'
      }
      if (state === 'cooling' && clock === 'ready') {
        // A core at handling temperature while still in the bath is safe once the bath stage ends.
        await tx.insert(batchEvents).values({ batchId: id, fromState: 'cooling', toState: 'ready', at: new Date(Math.max(row!.handlingAt.getTime(), row!.quenchEnd.getTime())), actorId: null })
        state = 'ready'
      }

      const verdict = checkMove(state, to, actor.role)
      if (!verdict.ok) {
        throw createError({ statusCode: verdict.status, statusMessage: verdict.message, data: { currentState: state, requestedState: to } })
      }

      const at = new Date(now)
      const recorded: Partial<BatchRow> = { state: to }
      if (to === 'charged') recorded.chargedAt = at
      if (to === 'soaking') recorded.soakingAt = at
      if (to === 'quenched') recorded.quenchedAt = at
      const actual = { chargedAt: ms(recorded.chargedAt ?? row!.chargedAt), soakingAt: ms(recorded.soakingAt ?? row!.soakingAt), quenchedAt: ms(recorded.quenchedAt ?? row!.quenchedAt) }
      // A batch row carries its booked SlotDurations fields.
      const slots = deriveSlots(row!.plannedCharge.getTime(), row!, actual)
      const values = {
        ...recorded,
        furnaceStart: new Date(slots.furnaceStart),
        furnaceEnd: new Date(slots.furnaceEnd),
        quenchStart: new Date(slots.quenchStart),
        quenchEnd: new Date(slots.quenchEnd),
        handlingAt: new Date(slots.handlingAt),
      }
      await tx.update(batches).set(values).where(eq(batches.id, id))
      await tx.insert(batchEvents).values({ batchId: id, fromState: state, toState: to, at, actorId: actor.id })
      const flagged = await reflagConflicts(tx, { ...row!, ...values }, to === 'cancelled')
      await recordAudit(tx, {
        actorId: actor.id,
        action: `batch.${to}`,
        entityType: 'batch',
        entityId: id,
        details: { loadNumber: row!.loadNumber, from: state, to, at: at.toISOString(), ...(flagged.length ? { conflicts: flagged } : {}) },
      })
      if (to === 'released') await releaseRecord(tx, id, actor)
      const [after] = await tx.select().from(batches).where(eq(batches.id, id))
      return { batch: toBatchView(after!, settings, now), repeated: false }
    },
    { isolationLevel: 'read committed' },
  )
}

/**
 * The record and its sheet belong to the release: any failure here rolls the release
 * back, and the operator is told why rather than seeing a release without a record.
 */
async function releaseRecord(tx: Transaction, id: number, actor: Pick<SessionUser, 'id' | 'displayName'>) {
  try {
    await writeCooldownRecord(tx, id, actor)
  } catch (error) {
    if ((error as { statusCode?: number }).statusCode) throw error
    throw createError({
      statusCode: 500,
      statusMessage: 'Release not recorded: the cooldown record could not be written',
      data: { reason: String((error as Error)?.message ?? error) },
    })
  }
}

/**
 * After a batch's slots moved, later bookings it now runs into are flagged with
 * its load number; flags it set before and that no longer hold are cleared.
 * Returns the load numbers flagged.
 */
async function reflagConflicts(tx: Transaction, row: BatchRow, withdrawn: boolean): Promise<string[]> {
  await tx.update(batches).set({ conflictWith: null, conflictNote: null }).where(eq(batches.conflictWith, row.loadNumber))
  if (withdrawn) return []
  const slots = slotsOf(row)
  const hit = await collisions(tx, row.furnaceId, row.stationId, slots, row.id)
  const later = new Map<number, { loadNumber: string; note: string }>()
  const until = (t: number) => new Date(t).toISOString().slice(0, 16).replace('T', ' ') + ' UTC'
  for (const other of hit.furnace) {
    if (other.state === 'planned') later.set(other.id, { loadNumber: other.loadNumber, note: `Furnace still holds ${row.loadNumber} until ${until(slots.furnaceEnd)}` })
  }
  for (const other of hit.station) {
    if (other.state === 'planned' && !later.has(other.id)) later.set(other.id, { loadNumber: other.loadNumber, note: `Quench station still holds ${row.loadNumber} until ${until(slots.quenchEnd)}` })
  }
  for (const [otherId, { note }] of later) await tx.update(batches).set({ conflictWith: row.loadNumber, conflictNote: note }).where(eq(batches.id, otherId))
  return [...later.values()].map((entry) => entry.loadNumber)
}

/** Batches whose time (charge to handling) touches [from, to); the schedule's week query. */
export async function listBatches(from: Date, to: Date, furnaceId?: number, db: Database = useDb()) {
  const settings = await readShopSettings(db)
  const conditions = [lt(batches.furnaceStart, to), gt(batches.handlingAt, from)]
  if (furnaceId) conditions.push(eq(batches.furnaceId, furnaceId))
  const rows = await db.select().from(batches).where(and(...conditions)).orderBy(asc(batches.furnaceStart))
  const now = Date.now()
  return { serverNow: now, batches: rows.map((row) => toBatchView(row, settings, now)) }
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

/** A batch's recorded moves in the order they happened, each with who made it. */
export function batchEventsOf(db: Database | Transaction, batchId: number) {
  return db
    .select({ id: batchEvents.id, fromState: batchEvents.fromState, toState: batchEvents.toState, at: batchEvents.at, actorId: batchEvents.actorId, actorName: users.displayName })
    .from(batchEvents)
    .leftJoin(users, eq(users.id, batchEvents.actorId))
    .where(eq(batchEvents.batchId, batchId))
    .orderBy(asc(batchEvents.at), asc(batchEvents.id))
}

export async function getBatch(id: number): Promise<BatchDetail> {
  const db = useDb()
  const [found] = await selectBatchesInContext(db).where(eq(batches.id, id))
  if (!found) throw createError({ statusCode: 404, statusMessage: 'Batch not found' })
  const events = await batchEventsOf(db, id)
  const b = found.batch
  return {
    ...toBatchView(b, await readShopSettings()),
    planName: found.plan.name,
    revision: found.revision.revision,
    furnaceName: found.furnace.name,
    stationName: found.station.name,
    summary: readSummary(found.revision.summary)!,
    durations: { furnace_s: b.furnace_s, minimumSoak_s: b.minimumSoak_s, transfer_s: b.transfer_s, quench_s: b.quench_s, quenchToHandling_s: b.quenchToHandling_s, quenchDelayAllowance_s: b.quenchDelayAllowance_s },
    events: events.map(({ id: eventId, fromState, toState, at, actorName }) => ({ id: eventId, fromState, toState, at: at.toISOString(), actorName })),
  }
}

/**
 * What the floor works on: every batch in the furnaces, the bath or cooling, not
 * yet handed on, and booked loads due within the next `aheadHours`.
 */
export async function floorBatches(furnaceId: number | undefined, aheadHours = 12) {
  const settings = await readShopSettings()
  const now = Date.now()
  const conditions = [inArray(batches.state, [...FLOOR_STATES]), lt(batches.furnaceStart, new Date(now + aheadHours * 3600_000))]
  if (furnaceId) conditions.push(eq(batches.furnaceId, furnaceId))
  const rows = await selectBatchesInContext(useDb())
    .where(and(...conditions))
    .orderBy(asc(batches.furnaceStart))
    .limit(200)
  const list: FloorBatch[] = rows.map((r) => ({
    ...toBatchView(r.batch, settings, now),
    planName: r.plan.name,
    furnaceName: r.furnace.name,
    stationName: r.station.name,
    summary: readSummary(r.revision.summary)!,
    minimumSoak_s: r.batch.minimumSoak_s,
    quenchDelayAllowance_s: r.batch.quenchDelayAllowance_s,
  }))
  return { serverNow: now, settings, batches: list }
}

/** Plan revisions with a computed summary, newest first: what the booking form offers. */
export async function planOptions(): Promise<PlanOption[]> {
  const rows = await useDb()
    .select({ planRevisionId: planRevisions.id, planName: plans.name, revision: planRevisions.revision, summary: planRevisions.summary })
    .from(planRevisions)
    .innerJoin(plans, eq(plans.id, planRevisions.planId))
    .where(and(eq(plans.archived, false), sql`${planRevisions.summary} IS NOT NULL`))
    .orderBy(asc(plans.name), desc(planRevisions.revision))
    .limit(500)
  return rows.flatMap((row) => {
    const summary = readSummary(row.summary)
    if (!summary) return []
    return [{ planRevisionId: row.planRevisionId, planName: row.planName, revision: row.revision, quenchToHandling_s: summary.quenchToHandling_s, furnace_s: summary.soak?.total_s ?? null, furnace_C: summary.soak?.furnace_C ?? null }]
  })
}
