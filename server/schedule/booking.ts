import { and, eq, gt, inArray, ne, sql } from 'drizzle-orm'
import { createError } from 'h3'
import type { z } from 'zod'
import type { Database, Transaction } from '../db/client'
import { batchEvents, batches, furnaceStations, loadCounters, planRevisions } from '../db/schema'
import { BATCH_STATE_LABELS, OPEN_STATES, deriveSlots, loadNumber, nextFreeStart, slotDurations, type ShopSettings } from '../../shared/schedule'
import { STATION_KIND_LABELS } from '../../shared/labels'
import type { bookingInputSchema, bookingMoveSchema } from '../../shared/schemas/schedule'
import type { BatchView } from '../../shared/types/schedule'
import type { SessionUser } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { collisions, lockResources, readSummary, toBatchView } from './batchQueries'
import { formatInstant } from '../records/format'
import { quenchMediumOf } from './quenchMedium'
import { readShopSettings } from './shopSettings'

/** What booking needs from its deployment, built at the edge (server/utils/shopConfig.ts, the seed). */
export interface BookingConfig {
  /** Load numbers start with it, usually the shop's initials. */
  loadPrefix: string
}

type Booking = z.output<typeof bookingInputSchema>
type BookingMove = z.output<typeof bookingMoveSchema>

function problem(status: number, statusMessage: string, field: string, message: string): never {
  throw createError({ statusCode: status, statusMessage, data: { problems: [{ field, message }] } })
}

/**
 * The plan's own quench-delay allowance when its spec states one (seconds), else the
 * shop's. The planner stores null for "not set"; 0 is a real choice (straight into the bath).
 */
function quenchDelayAllowance(spec: unknown, settings: ShopSettings): number {
  const value = (spec as { quenchDelayAllowance_s?: unknown } | null)?.quenchDelayAllowance_s
  return typeof value === 'number' && value >= 0 ? value : settings.quenchDelayAllowance_s
}

async function nextLoadNumber(tx: Transaction, prefix: string, year: number): Promise<string> {
  // One upsert, not select-then-insert: two bookings on different furnaces could
  // otherwise both find no row for a new year and both insert it.
  await tx.insert(loadCounters).values({ year, last: 1 }).onDuplicateKeyUpdate({ set: { last: sql`${loadCounters.last} + 1` } })
  const [counter] = await tx.select().from(loadCounters).where(eq(loadCounters.year, year))
  return loadNumber(prefix, year, counter!.last)
}

/** Where and when a load is to go, and what it weighs: what a booking and a move both check. */
interface Placement {
  planRevisionId: number
  furnaceId: number
  stationId: number
  plannedCharge: number
  mass_kg: number
}

/**
 * Every check a load's place on the schedule must pass, with the furnace and station
 * rows locked first, so of two overlapping bookings the second sees the first's rows
 * (read committed) and is refused with the colliding load and the next free start.
 * `exceptId` is the load being moved, which never collides with itself.
 */
async function checkPlacement(tx: Transaction, p: Placement, exceptId = 0) {
  const { furnace, station } = await lockResources(tx, p.furnaceId, p.stationId)
  if (!furnace) problem(422, 'Unknown furnace', 'furnaceId', `No furnace with id ${p.furnaceId}`)
  if (!station) problem(422, 'Unknown quench station', 'stationId', `No quench station with id ${p.stationId}`)
  if (!furnace.active) problem(422, 'Furnace out of service', 'furnaceId', `${furnace.name} is out of service`)
  if (!station.active) problem(422, 'Quench station out of service', 'stationId', `${station.name} is out of service`)
  const [link] = await tx
    .select()
    .from(furnaceStations)
    .where(and(eq(furnaceStations.furnaceId, furnace.id), eq(furnaceStations.stationId, station.id)))
  if (!link) problem(422, 'Station does not serve this furnace', 'stationId', `${station.name} does not serve ${furnace.name}`)
  if (p.mass_kg > furnace.capacity_kg) problem(422, 'Load too heavy', 'mass_kg', `${furnace.name} takes at most ${furnace.capacity_kg} kg`)
  if (p.mass_kg > station.capacity_kg) problem(422, 'Load too heavy', 'mass_kg', `${station.name} takes at most ${station.capacity_kg} kg`)

  const [revision] = await tx.select().from(planRevisions).where(eq(planRevisions.id, p.planRevisionId))
  if (!revision) problem(422, 'Unknown plan revision', 'planRevisionId', `No plan revision with id ${p.planRevisionId}`)
  const summary = readSummary(revision.summary)
  if (!summary) problem(422, 'Plan revision not computed', 'planRevisionId', 'This revision has no computed summary; open it in the planner and save it again')
  // The floor can only quench in what the station holds: a polymer plan in an oil tank is a different quench.
  const medium = quenchMediumOf(revision.spec)
  if (medium && medium.kind !== station.kind) {
    problem(422, 'Quench station does not fit the plan', 'stationId', `${station.name} is a ${STATION_KIND_LABELS[station.kind].toLowerCase()} station; the plan quenches in ${medium.name} (${STATION_KIND_LABELS[medium.kind].toLowerCase()})`)
  }
  if (summary.soak && summary.soak.furnace_C > furnace.maxTemp_C) {
    problem(422, 'Furnace too cool for this plan', 'furnaceId', `${furnace.name} reaches ${furnace.maxTemp_C} °C; the plan soaks at ${summary.soak.furnace_C} °C`)
  }

  const settings = await readShopSettings(tx)
  const d = slotDurations(summary, settings)
  const slots = deriveSlots(p.plannedCharge, d)
  const hit = await collisions(tx, furnace.id, station.id, slots, exceptId)
  if (hit.furnace.length || hit.station.length) {
    const onFurnace = hit.furnace[0]
    const other = onFurnace ?? hit.station[0]!
    const where = onFurnace ? furnace.name : station.name
    const others = and(inArray(batches.state, [...OPEN_STATES]), ne(batches.id, exceptId))
    const [busyFurnace, busyStation] = await Promise.all([
      tx.select({ start: batches.furnaceStart, end: batches.furnaceEnd }).from(batches)
        .where(and(eq(batches.furnaceId, furnace.id), others, gt(batches.furnaceEnd, new Date(p.plannedCharge)))),
      tx.select({ start: batches.quenchStart, end: batches.quenchEnd }).from(batches)
        .where(and(eq(batches.stationId, station.id), others, gt(batches.quenchEnd, new Date(slots.quenchStart)))),
    ])
    const asMs = (rows: { start: Date; end: Date }[]) => rows.map((row) => ({ start: row.start.getTime(), end: row.end.getTime() }))
    const next = nextFreeStart(
      p.plannedCharge,
      slots.furnaceEnd - slots.furnaceStart,
      slots.quenchStart - slots.furnaceStart,
      slots.quenchEnd - slots.quenchStart,
      asMs(busyFurnace),
      asMs(busyStation),
    )
    throw createError({
      statusCode: 409,
      statusMessage: `${where} is taken by ${other.loadNumber}`,
      data: {
        collidesWith: { id: other.id, loadNumber: other.loadNumber, resource: onFurnace ? 'furnace' : 'station' },
        nextFreeStart: new Date(next).toISOString(),
        problems: [{ field: 'plannedCharge', message: `${where} is taken by ${other.loadNumber}; the next free charge time is ${formatInstant(new Date(next).toISOString())}` }],
      },
    })
  }
  return { furnace, station, revision, settings, d, slots }
}

/** The slot columns of a load's row, from its derived slots. */
function slotColumns(slots: ReturnType<typeof deriveSlots>) {
  return {
    furnaceStart: new Date(slots.furnaceStart),
    furnaceEnd: new Date(slots.furnaceEnd),
    quenchStart: new Date(slots.quenchStart),
    quenchEnd: new Date(slots.quenchEnd),
    handlingAt: new Date(slots.handlingAt),
  }
}

/** Books a plan revision on a furnace and station, after every check of checkPlacement. */
export async function bookBatch(input: Booking, actor: Pick<SessionUser, 'id' | 'role'>, config: BookingConfig, db: Database = useDb()): Promise<BatchView> {
  const plannedCharge = Date.parse(input.plannedCharge)
  return await db.transaction(
    async (tx) => {
      const { furnace, station, revision, settings, d, slots } = await checkPlacement(tx, { ...input, plannedCharge })
      const number = await nextLoadNumber(tx, config.loadPrefix, new Date(plannedCharge).getUTCFullYear())
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
          ...slotColumns(slots),
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
 * Moves a booked load to another charge time, furnace or station, with the same checks
 * as a booking (its own old place excepted). Only a load still booked moves: once
 * charged, its times come from the floor.
 */
export async function moveBooking(id: number, input: BookingMove, actor: Pick<SessionUser, 'id'>, db: Database = useDb()): Promise<BatchView> {
  const plannedCharge = Date.parse(input.plannedCharge)
  return await db.transaction(
    async (tx) => {
      const [current] = await tx.select().from(batches).where(eq(batches.id, id))
      if (!current) throw createError({ statusCode: 404, statusMessage: 'Load not found' })
      if (current.state !== 'planned') {
        throw createError({ statusCode: 409, statusMessage: `Only a booked load can be moved; ${current.loadNumber} is ${BATCH_STATE_LABELS[current.state]}` })
      }
      const placement = { ...input, plannedCharge, planRevisionId: current.planRevisionId, mass_kg: current.mass_kg }
      const { furnace, station, settings, d, slots } = await checkPlacement(tx, placement, id)
      await tx
        .update(batches)
        // A move is a re-booking: the durations come from the shop settings of today, as a new booking's would.
        .set({ furnaceId: furnace.id, stationId: station.id, plannedCharge: new Date(plannedCharge), ...d, ...slotColumns(slots) })
        .where(eq(batches.id, id))
      await recordAudit(tx, {
        actorId: actor.id,
        action: 'batch.move',
        entityType: 'batch',
        entityId: id,
        details: {
          loadNumber: current.loadNumber,
          from: { furnaceId: current.furnaceId, stationId: current.stationId, plannedCharge: current.plannedCharge.toISOString() },
          to: { furnace: furnace.name, station: station.name, plannedCharge: new Date(plannedCharge).toISOString() },
        },
      })
      const [row] = await tx.select().from(batches).where(eq(batches.id, id))
      return toBatchView(row!, settings)
    },
    { isolationLevel: 'read committed' },
  )
}
