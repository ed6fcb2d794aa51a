import { and, eq } from 'drizzle-orm'
import { createError } from 'h3'
import type { Database } from '../db/client'
import { batchEventCorrections, batchEvents, batches, type BatchRow } from '../db/schema'
import { can } from '../../shared/access'
import { formatDuration } from '../../shared/duration'
import { BATCH_STATE_LABELS, FLOOR_TAPS, OPEN_STATES, type BatchState } from '../../shared/schedule'
import type { CorrectionInput } from '../../shared/schemas/schedule'
import type { BatchEventView } from '../../shared/types/schedule'
import type { SessionUser } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import type { RecordConfig } from '../records/config'
import { refuseIfRecordSigned, reissueCooldownRecord } from '../records/service'
import { eventViewsOf, lockResources } from './batchQueries'
import { reflagConflicts, replannedSlots } from './moves'
import { readShopSettings } from './shopSettings'

/** The batch column each floor tap sets. */
const TAP_COLUMN: Partial<Record<BatchState, 'chargedAt' | 'soakingAt' | 'unloadedAt' | 'quenchedAt'>> = {
  charged: 'chargedAt',
  soaking: 'soakingAt',
  unloaded: 'unloadedAt',
  quenched: 'quenchedAt',
}

const utc = (ms: number) => `${new Date(ms).toISOString().slice(0, 19).replace('T', ' ')} UTC`
const atProblem = (message: string) => createError({ statusCode: 422, statusMessage: message, data: { problems: [{ field: 'at', message }] } })

/**
 * Corrects the time of a floor tap, with a reason. The tap stays as it was; the
 * correction is added beside it, the batch is re-planned from the corrected times and,
 * once released, its unsigned record is re-issued, all in one transaction with an audit
 * row. An operator corrects within the shop's window after the tap; a metallurgist or
 * QA lead at any time until the record is signed.
 */
export async function correctEvent(
  batchId: number,
  eventId: number,
  input: CorrectionInput,
  actor: Pick<SessionUser, 'id' | 'role'>,
  records: RecordConfig,
  db: Database = useDb(),
): Promise<{ event: BatchEventView; recordId: number | null }> {
  const [pre] = await db.select({ furnaceId: batches.furnaceId, stationId: batches.stationId }).from(batches).where(eq(batches.id, batchId))
  if (!pre) throw createError({ statusCode: 404, statusMessage: 'Batch not found' })
  return await db.transaction(
    async (tx) => {
      await lockResources(tx, pre.furnaceId, pre.stationId)
      const [row] = await tx.select().from(batches).where(eq(batches.id, batchId)).for('update')
      await refuseIfRecordSigned(tx, batchId)
      const [event] = await tx.select().from(batchEvents).where(and(eq(batchEvents.id, eventId), eq(batchEvents.batchId, batchId)))
      if (!event) throw createError({ statusCode: 404, statusMessage: 'Event not found on this load' })
      if (!FLOOR_TAPS.includes(event.toState) || event.actorId === null) {
        throw createError({ statusCode: 409, statusMessage: `${BATCH_STATE_LABELS[event.toState]} comes from the plan's clock, not a floor tap; only taps can be corrected` })
      }

      const now = Date.now()
      const settings = await readShopSettings(tx)
      if (!can(actor.role, 'records.correct')) {
        if (!can(actor.role, 'floor.record')) throw createError({ statusCode: 403, statusMessage: `A ${actor.role} cannot correct floor taps` })
        const age_s = (now - event.at.getTime()) / 1000
        if (age_s > settings.correctionWindow_s) {
          throw createError({
            statusCode: 403,
            statusMessage: `The ${formatDuration(settings.correctionWindow_s)} window for correcting this tap closed ${formatDuration(age_s - settings.correctionWindow_s)} ago; a metallurgist or QA lead can still correct it`,
          })
        }
      }

      const at = Date.parse(input.at)
      if (at > now) throw atProblem('The corrected time cannot be in the future')
      const taps = (await eventViewsOf(tx, [batchId])).get(batchId)!.filter((e) => FLOOR_TAPS.includes(e.toState) && e.actorId !== null)
      const rank = (state: BatchState) => FLOOR_TAPS.indexOf(state)
      const before = taps.filter((e) => rank(e.toState) < rank(event.toState)).at(-1)
      const after = taps.find((e) => rank(e.toState) > rank(event.toState))
      if (before && at < Date.parse(before.at)) throw atProblem(`The corrected time must not come before ${BATCH_STATE_LABELS[before.toState]} at ${utc(Date.parse(before.at))}`)
      if (after && at > Date.parse(after.at)) throw atProblem(`The corrected time must not come after ${BATCH_STATE_LABELS[after.toState]} at ${utc(Date.parse(after.at))}`)
      const previous = taps.find((e) => e.id === eventId)!.at

      await tx.insert(batchEventCorrections).values({ eventId, batchId, correctedAt: new Date(at), reason: input.reason, actorId: actor.id })
      const column = TAP_COLUMN[event.toState]
      if (column) {
        const corrected: BatchRow = { ...row!, [column]: new Date(at) }
        // A load still on the floor follows its corrected times; a released one keeps its slots as history.
        const values = OPEN_STATES.includes(row!.state) ? { [column]: new Date(at), ...replannedSlots(corrected) } : { [column]: new Date(at) }
        await tx.update(batches).set(values).where(eq(batches.id, batchId))
        if (OPEN_STATES.includes(row!.state)) await reflagConflicts(tx, { ...corrected, ...values }, false)
      }
      const record = await reissueCooldownRecord(tx, batchId, records)
      await recordAudit(tx, {
        actorId: actor.id,
        action: 'batch.event_corrected',
        entityType: 'batch',
        entityId: batchId,
        details: {
          loadNumber: row!.loadNumber,
          eventId,
          event: event.toState,
          tapped: event.at.toISOString(),
          from: previous,
          to: new Date(at).toISOString(),
          reason: input.reason,
          ...(record ? { recordId: record.id, recordHash: record.hash, previousRecordHash: record.previousHash } : {}),
        },
      })
      const view = (await eventViewsOf(tx, [batchId])).get(batchId)!.find((e) => e.id === eventId)!
      return { event: view, recordId: record?.id ?? null }
    },
    { isolationLevel: 'read committed' },
  )
}
