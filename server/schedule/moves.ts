import { and, eq } from 'drizzle-orm'
import { createError } from 'h3'
import type { Database, Transaction } from '../db/client'
import { batchEvents, batches, type BatchRow } from '../db/schema'
import { checkMove, deriveSlots, stateByClock, type BatchState } from '../../shared/schedule'
import { bookedHeatUp_s, tapShortfall } from '../../shared/floorGuards'
import type { BatchView } from '../../shared/types/schedule'
import type { SessionUser } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import type { RecordConfig } from '../records/config'
import { refuseIfRecordSigned, writeCooldownRecord } from '../records/service'
import { collisions, lockResources, ms, slotsOf, toBatchView } from './batchQueries'
import { readShopSettings } from './shopSettings'

/**
 * Records a floor or planning move at the server's time. A move already recorded
 * answers with the batch as it is (a repeated tap changes nothing). Clock moves
 * (out of the bath, safe to handle) are written first at the times the plan gave
 * them, so the event log reads in order. A tap that comes before the plan says it
 * should answers 409 with the shortfall until the operator acknowledges it; it is
 * then recorded with the shortfall.
 */
export async function moveBatch(
  id: number,
  to: BatchState,
  actor: Pick<SessionUser, 'id' | 'role' | 'displayName'>,
  records: RecordConfig,
  options: { acknowledgeShortfall?: boolean } = {},
  db: Database = useDb(),
): Promise<{ batch: BatchView; repeated: boolean }> {
  const [pre] = await db.select({ furnaceId: batches.furnaceId, stationId: batches.stationId }).from(batches).where(eq(batches.id, id))
  if (!pre) throw createError({ statusCode: 404, statusMessage: 'Load not found' })
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
      const shortfall = tapShortfall(state, to, {
        chargedAt: ms(row!.chargedAt),
        furnaceEnd: row!.furnaceEnd.getTime(),
        handlingAt: row!.handlingAt.getTime(),
        heatUp_s: bookedHeatUp_s(row!),
        minimumSoak_s: row!.minimumSoak_s,
      }, now)
      if (shortfall && !options.acknowledgeShortfall) {
        throw createError({ statusCode: 409, statusMessage: `${shortfall.message} Confirm again to record it anyway.`, data: { shortfall, currentState: state, requestedState: to } })
      }

      const at = new Date(now)
      const recorded: Partial<BatchRow> = { state: to }
      if (to === 'charged') recorded.chargedAt = at
      if (to === 'soaking') recorded.soakingAt = at
      if (to === 'unloaded') recorded.unloadedAt = at
      if (to === 'quenched') recorded.quenchedAt = at
      const values = { ...recorded, ...replannedSlots({ ...row!, ...recorded }) }
      await tx.update(batches).set(values).where(eq(batches.id, id))
      await tx.insert(batchEvents).values({
        batchId: id,
        fromState: state,
        toState: to,
        at,
        actorId: actor.id,
        shortfall_s: shortfall?.short_s ?? null,
        shortfallNote: shortfall?.message ?? null,
      })
      const flagged = await reflagConflicts(tx, { ...row!, ...values }, to === 'cancelled')
      await recordAudit(tx, {
        actorId: actor.id,
        action: `batch.${to}`,
        entityType: 'batch',
        entityId: id,
        details: {
          loadNumber: row!.loadNumber,
          from: state,
          to,
          at: at.toISOString(),
          ...(shortfall ? { shortfall: shortfall.message } : {}),
          ...(flagged.length ? { conflicts: flagged } : {}),
        },
      })
      if (to === 'released') await releaseRecord(tx, id, actor, records)
      const [after] = await tx.select().from(batches).where(eq(batches.id, id))
      return { batch: toBatchView(after!, settings, now), repeated: false }
    },
    { isolationLevel: 'read committed' },
  )
}

/** The slot columns re-planned from a row's recorded floor times (a batch row carries its booked SlotDurations). */
export function replannedSlots(row: BatchRow) {
  const actual = { chargedAt: ms(row.chargedAt), soakingAt: ms(row.soakingAt), unloadedAt: ms(row.unloadedAt), quenchedAt: ms(row.quenchedAt) }
  const slots = deriveSlots(row.plannedCharge.getTime(), row, actual)
  return {
    furnaceStart: new Date(slots.furnaceStart),
    furnaceEnd: new Date(slots.furnaceEnd),
    quenchStart: new Date(slots.quenchStart),
    quenchEnd: new Date(slots.quenchEnd),
    handlingAt: new Date(slots.handlingAt),
  }
}

/**
 * The record and its sheet belong to the release: any failure here rolls the release
 * back, and the operator is told why rather than seeing a release without a record.
 */
async function releaseRecord(tx: Transaction, id: number, actor: Pick<SessionUser, 'id' | 'displayName'>, records: RecordConfig) {
  try {
    await writeCooldownRecord(tx, id, actor, records)
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
export async function reflagConflicts(tx: Transaction, row: BatchRow, withdrawn: boolean): Promise<string[]> {
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
