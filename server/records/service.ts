import { and, asc, desc, eq, gte, inArray, lt, sql, type SQL } from 'drizzle-orm'
import { createError } from 'h3'
import type { Database, Transaction } from '../db/client'
import {
  batchEventCorrections,
  batchEvents,
  batches,
  cooldownRecords,
  furnaces,
  measurementLogChannels,
  measurementLogs,
  planRevisions,
  plans,
  users,
  type CooldownRecordRow,
} from '../db/schema'
import { fromFloat64Blob } from '../measurements/float64Blob'
import type { LoadLog } from './measuredTraces'
import { bandSeriesOf } from './predictedBand'
import { recordSeal } from './canonical'
import { recordUrl, sealKeyOf, type RecordConfig } from './config'
import { buildSnapshot, checkIntegrity, sheetFromSnapshot, signatureSeal, type Decision } from './cooldownRecord'
import { holdTimeSheetMail } from './sheetMail'
import { digestMail, rejectionMail } from './recordMails'
import { can } from '../../shared/access'
import { BATCH_STATE_LABELS } from '../../shared/schedule'
import type { RecordDetail, RecordListItem, RecordSnapshot } from '../../shared/types/cooldownRecord'
import type { RecordListQuery } from '../../shared/schemas/records'
import type { SessionUser } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { batchEventsOf, correctionsOf, readSummary, selectBatchesInContext } from '../schedule/batchQueries'
import { recipientsFor } from '../outbox/mailRecipients'
import { enqueueMail } from '../outbox/enqueue'

const DAY_MS = 24 * 3600_000

/** 409 for a batch whose record is signed: its account is closed, nothing more may be added to it. */
export async function refuseIfRecordSigned(tx: Transaction, batchId: number): Promise<void> {
  const [record] = await tx.select({ id: cooldownRecords.id, state: cooldownRecords.state }).from(cooldownRecords).where(eq(cooldownRecords.batchId, batchId))
  if (record && record.state !== 'unsigned') {
    throw createError({
      statusCode: 409,
      statusMessage: `The cooldown record of this load is ${record.state}; the load takes no more events`,
      data: { recordId: record.id, recordState: record.state },
    })
  }
}

/**
 * Writes the record of a batch released inside `tx` and queues its hold-time sheet in
 * the same transaction, so a release without its record and mail never commits. The
 * PDF is rendered here, not before: the sheet must show exactly the events this
 * transaction sees, and pdfkit takes tens of milliseconds for one sheet.
 */
export async function writeCooldownRecord(
  tx: Transaction,
  batchId: number,
  releasedBy: Pick<SessionUser, 'id' | 'displayName'>,
  config: RecordConfig,
): Promise<{ id: number; hash: string; outboxId: number }> {
  const snapshot = await snapshotOf(tx, batchId, { id: releasedBy.id, name: releasedBy.displayName })
  const hash = recordSeal(snapshot, sealKeyOf(config))
  const [{ id }] = await tx
    .insert(cooldownRecords)
    .values({
      batchId,
      snapshot: snapshot as unknown as Record<string, unknown>,
      hash,
      deviationCount: snapshot.deviations.length,
      releasedAt: new Date(snapshot.releasedAt),
    })
    .$returningId()

  const to = await recipientsFor(tx, 'released_sheet')
  if (to.length === 0) {
    throw createError({ statusCode: 422, statusMessage: 'Release not recorded: nobody receives released-load sheets; an administrator must name recipients under Mail recipients' })
  }
  const mail = await holdTimeSheetMail(sheetFromSnapshot(snapshot, config.shopName, recordUrl(config, id)), to, `sheet:record-${id}`)
  const queued = await enqueueMail(tx, mail)
  await recordAudit(tx, {
    actorId: releasedBy.id,
    action: 'record.create',
    entityType: 'cooldown_record',
    entityId: id,
    details: { batchId, loadNumber: snapshot.batch.loadNumber, hash, deviations: snapshot.deviations.map((d) => d.rule), outboxId: queued.id, to },
  })
  return { id, hash, outboxId: queued.id }
}

/** The logs attached to a batch, oldest first, with their full series. */
async function loadLogsOf(tx: Transaction, batchId: number): Promise<LoadLog[]> {
  const logs = await tx.select().from(measurementLogs).where(eq(measurementLogs.batchId, batchId)).orderBy(asc(measurementLogs.id))
  if (logs.length === 0) return []
  const channels = await tx
    .select()
    .from(measurementLogChannels)
    .where(inArray(measurementLogChannels.logId, logs.map((log) => log.id)))
    .orderBy(asc(measurementLogChannels.logId), asc(measurementLogChannels.position))
  return logs.map((log) => ({
    id: log.id,
    fileName: log.fileName,
    sha256: log.sha256,
    startedAt: log.startedAt,
    quenchAtLog_s: log.quenchAtLog_s,
    t_s: fromFloat64Blob(log.time_s),
    channels: channels.filter((c) => c.logId === log.id).map((c) => ({ name: c.name, T_C: fromFloat64Blob(c.T_C) })),
  }))
}

/** The snapshot of a batch as its events, corrections and logs stand in `tx`. */
async function snapshotOf(tx: Transaction, batchId: number, releasedBy: { id: number; name: string }): Promise<RecordSnapshot> {
  const [found] = await selectBatchesInContext(tx).where(eq(batches.id, batchId))
  if (!found) throw new Error(`Batch ${batchId} not found`)
  const summary = readSummary(found.revision.summary)
  if (!summary) throw new Error(`Plan revision ${found.revision.id} has no usable summary`)
  const [{ spec }] = await tx.select({ spec: planRevisions.spec }).from(planRevisions).where(eq(planRevisions.id, found.revision.id))
  const [events, corrections, logs] = await Promise.all([batchEventsOf(tx, batchId), correctionsOf(tx, batchId), loadLogsOf(tx, batchId)])
  return buildSnapshot({
    logs,
    // Only a load with a log needs the band: a temperature-dependent plan's summary keeps it; a constant-property one is run again.
    band: logs.length ? bandSeriesOf(spec, summary) : null,
    batch: found.batch,
    furnace: found.furnace,
    station: found.station,
    plan: found.plan,
    revision: { id: found.revision.id, revision: found.revision.revision, spec, summary },
    events: events.map((event) => ({ ...event, actorName: event.actorName ?? null })),
    corrections,
    releasedBy,
  })
}

/**
 * Re-issues the unsigned record of a batch after one of its taps was corrected: the
 * snapshot is rebuilt (the original tap and the correction both in it), re-sealed and
 * its list columns copied again, and the corrected sheet is queued to the same
 * recipients, all in the correction's transaction. Signed records never get here
 * (refuseIfRecordSigned). Returns the record, or null before release.
 */
export async function reissueCooldownRecord(
  tx: Transaction,
  batchId: number,
  config: RecordConfig,
): Promise<{ id: number; hash: string; previousHash: string } | null> {
  const [record] = await tx.select().from(cooldownRecords).where(eq(cooldownRecords.batchId, batchId)).for('update')
  if (!record) return null
  const releasedBy = (record.snapshot as unknown as RecordSnapshot).releasedBy
  const snapshot = await snapshotOf(tx, batchId, releasedBy)
  const hash = recordSeal(snapshot, sealKeyOf(config))
  await tx
    .update(cooldownRecords)
    .set({
      snapshot: snapshot as unknown as Record<string, unknown>,
      hash,
      deviationCount: snapshot.deviations.length,
      releasedAt: new Date(snapshot.releasedAt),
    })
    .where(and(eq(cooldownRecords.id, record.id), eq(cooldownRecords.state, 'unsigned')))
  const to = await recipientsFor(tx, 'released_sheet')
  if (to.length) await enqueueMail(tx, await holdTimeSheetMail(sheetFromSnapshot(snapshot, config.shopName, recordUrl(config, record.id)), to, `sheet:record-${record.id}:${hash}`))
  return { id: record.id, hash, previousHash: record.hash }
}

const signer = sql<string | null>`(SELECT ${users.displayName} FROM ${users} WHERE ${users.id} = ${cooldownRecords.signedBy})`

const listColumns = {
  record: {
    id: cooldownRecords.id,
    batchId: cooldownRecords.batchId,
    releasedAt: cooldownRecords.releasedAt,
    state: cooldownRecords.state,
    deviationCount: cooldownRecords.deviationCount,
    signedAt: cooldownRecords.signedAt,
    createdAt: cooldownRecords.createdAt,
  },
  loadNumber: batches.loadNumber,
  planName: plans.name,
  furnaceId: furnaces.id,
  furnaceName: furnaces.name,
  signedBy: signer,
}

function listQuery(db: Database | Transaction) {
  return db
    .select(listColumns)
    .from(cooldownRecords)
    .innerJoin(batches, eq(batches.id, cooldownRecords.batchId))
    .innerJoin(planRevisions, eq(planRevisions.id, batches.planRevisionId))
    .innerJoin(plans, eq(plans.id, planRevisions.planId))
    .innerJoin(furnaces, eq(furnaces.id, batches.furnaceId))
}

type ListRow = Awaited<ReturnType<ReturnType<typeof listQuery>['execute']>>[number]

function toListItem(row: ListRow): RecordListItem {
  return {
    id: row.record.id,
    batchId: row.record.batchId,
    loadNumber: row.loadNumber,
    planName: row.planName,
    furnaceId: row.furnaceId,
    furnaceName: row.furnaceName,
    releasedAt: row.record.releasedAt.toISOString(),
    state: row.record.state,
    deviationCount: row.record.deviationCount,
    signedBy: row.signedBy,
    signedAt: row.record.signedAt?.toISOString() ?? null,
  }
}

const SORTS = {
  releasedAt: cooldownRecords.releasedAt,
  loadNumber: batches.loadNumber,
  furnace: furnaces.name,
  deviations: cooldownRecords.deviationCount,
  state: cooldownRecords.state,
} as const

export async function listRecords(query: RecordListQuery): Promise<RecordListItem[]> {
  const conditions: SQL[] = []
  if (query.state) conditions.push(eq(cooldownRecords.state, query.state))
  if (query.furnaceId) conditions.push(eq(batches.furnaceId, query.furnaceId))
  if (query.from) conditions.push(gte(cooldownRecords.releasedAt, new Date(query.from)))
  if (query.to) conditions.push(lt(cooldownRecords.releasedAt, new Date(query.to)))
  if (query.deviation === 'yes') conditions.push(sql`${cooldownRecords.deviationCount} > 0`)
  if (query.deviation === 'no') conditions.push(eq(cooldownRecords.deviationCount, 0))
  const column = SORTS[query.sort]
  const rows = await listQuery(useDb())
    .where(conditions.length ? and(...conditions) : undefined)
    .orderBy(query.dir === 'asc' ? asc(column) : desc(column), query.dir === 'asc' ? asc(cooldownRecords.id) : desc(cooldownRecords.id))
    .limit(query.limit)
  return rows.map(toListItem)
}

/** Why `user` may not sign this record, or null when they may. */
async function signRefusal(db: Database | Transaction, row: CooldownRecordRow, user: Pick<SessionUser, 'id' | 'role'>, intact: boolean): Promise<{ status: 403 | 409; message: string } | null> {
  if (!can(user.role, 'records.signOff')) return { status: 403, message: 'Only a QA lead signs cooldown records' }
  if (row.state !== 'unsigned') return { status: 409, message: `This record is already ${row.state}; a signed record cannot be changed` }
  if (!intact) return { status: 409, message: 'This record was altered after it was written; it cannot be signed' }
  const own = await db
    .select({ toState: batchEvents.toState })
    .from(batchEvents)
    .where(and(eq(batchEvents.batchId, row.batchId), eq(batchEvents.actorId, user.id)))
    .orderBy(asc(batchEvents.at))
  if (own.length) {
    const moves = own.map((event) => (event.toState === 'planned' ? 'the booking' : BATCH_STATE_LABELS[event.toState])).join(', ')
    return { status: 403, message: `You recorded events on this load (${moves}); another QA lead must sign its record` }
  }
  const [corrected] = await db
    .select({ id: batchEventCorrections.id })
    .from(batchEventCorrections)
    .where(and(eq(batchEventCorrections.batchId, row.batchId), eq(batchEventCorrections.actorId, user.id)))
    .limit(1)
  if (corrected) return { status: 403, message: 'You corrected an event time on this load; another QA lead must sign its record' }
  return null
}

export async function getRecord(id: number, viewer: Pick<SessionUser, 'id' | 'role'>, config: Pick<RecordConfig, 'sealKey'>): Promise<RecordDetail> {
  const db = useDb()
  const [row] = await db.select().from(cooldownRecords).where(eq(cooldownRecords.id, id))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Record not found' })
  const [listed] = await listQuery(db).where(eq(cooldownRecords.id, id))
  const { integrity, problems } = checkIntegrity(row, sealKeyOf(config))
  const refusal = await signRefusal(db, row, viewer, integrity === 'intact')
  return {
    ...toListItem(listed!),
    snapshot: row.snapshot as unknown as RecordSnapshot,
    hash: row.hash,
    integrity,
    integrityProblems: problems,
    signComment: row.signComment,
    signatureHash: row.signatureHash,
    canSign: { ok: refusal === null, reason: refusal?.message ?? null },
  }
}

/**
 * Approves or rejects a record, once. The row is locked, so of two QA leads signing at
 * the same moment the second sees the first's decision and gets 409. A rejection mails
 * the metallurgists (rejection recipients) with the comment, in the same transaction.
 */
export async function signRecord(id: number, decision: Decision, comment: string | null, user: SessionUser, config: RecordConfig): Promise<RecordDetail> {
  const action = decision === 'approved' ? 'record.approve' : 'record.reject'
  const refused = await useDb().transaction(async (tx) => {
    const [row] = await tx.select().from(cooldownRecords).where(eq(cooldownRecords.id, id)).for('update')
    if (!row) throw createError({ statusCode: 404, statusMessage: 'Record not found' })
    const { integrity, problems } = checkIntegrity(row, sealKeyOf(config))
    const refusal = await signRefusal(tx, row, user, integrity === 'intact')
    if (refusal) return { ...refusal, state: row.state, integrity, problems }
    const signedAt = new Date()
    const signature = signatureSeal(row.hash, decision, user.id, signedAt, sealKeyOf(config))
    await tx.update(cooldownRecords).set({ state: decision, signedBy: user.id, signedAt, signComment: comment, signatureHash: signature }).where(and(eq(cooldownRecords.id, id), eq(cooldownRecords.state, 'unsigned')))
    const snapshot = row.snapshot as unknown as RecordSnapshot
    let outboxId: number | null = null
    if (decision === 'rejected') {
      const to = await recipientsFor(tx, 'rejection')
      if (to.length === 0) throw createError({ statusCode: 422, statusMessage: 'Not rejected: nobody receives rejected records; an administrator must name recipients under Mail recipients' })
      outboxId = (await enqueueMail(tx, rejectionMail(id, snapshot, comment!, user.displayName, signedAt, to, recordUrl(config, id)))).id
    }
    await recordAudit(tx, {
      actorId: user.id,
      action,
      entityType: 'cooldown_record',
      entityId: id,
      details: {
        loadNumber: snapshot.batch.loadNumber,
        recordHash: row.hash,
        signatureHash: signature,
        signedAt: signedAt.toISOString(),
        comment,
        ...(outboxId ? { outboxId } : {}),
      },
    })
    return null
  })
  if (refused) {
    // A refused attempt at a signed or altered record is worth a trace of its own.
    await recordAudit(useDb(), { actorId: user.id, action: `${action}_refused`, entityType: 'cooldown_record', entityId: id, details: { reason: refused.message, state: refused.state, integrity: refused.integrity, problems: refused.problems } })
    throw createError({ statusCode: refused.status, statusMessage: refused.message, data: { recordState: refused.state, integrity: refused.integrity } })
  }
  return await getRecord(id, user, config)
}

/** The UTC day the digest belongs to, as its dedupe key. */
export const digestKey = (now: Date) => `digest:${now.toISOString().slice(0, 10)}`

export interface DigestResult {
  dedupeKey: string
  queued: boolean
  created: boolean
  outboxId: number | null
  to: string[]
  records: { id: number; loadNumber: string; releasedAt: string }[]
}

/**
 * Queues the day's digest of records released more than a day ago and still unsigned,
 * oldest first. One per UTC day whoever asks (the worker's daily check or an admin):
 * the dedupe key is the date, so a second call that day queues nothing. Nothing to
 * list means no message.
 */
export async function queueDailyDigest(db: Database, now: Date, config: Pick<RecordConfig, 'publicOrigin'>, actorId: number | null = null): Promise<DigestResult> {
  const dedupeKey = digestKey(now)
  return await db.transaction(async (tx) => {
    const rows = await listQuery(tx)
      .where(and(eq(cooldownRecords.state, 'unsigned'), lt(cooldownRecords.createdAt, new Date(now.getTime() - DAY_MS))))
      .orderBy(asc(cooldownRecords.createdAt), asc(cooldownRecords.id))
      .limit(500)
    const records = rows.map((row) => ({
      id: row.record.id,
      loadNumber: row.loadNumber,
      releasedAt: row.record.releasedAt.toISOString(),
      plan: row.planName,
      furnace: row.furnaceName,
      deviations: row.record.deviationCount,
    }))
    const to = records.length ? await recipientsFor(tx, 'daily_digest') : []
    if (records.length === 0 || to.length === 0) {
      return {
        dedupeKey,
        queued: false,
        created: false,
        outboxId: null,
        to,
        records: records.map(({ id, loadNumber, releasedAt }) => ({ id, loadNumber, releasedAt })),
      }
    }
    const day = dedupeKey.slice('digest:'.length)
    const queued = await enqueueMail(tx, digestMail(dedupeKey, to, records, (recordId) => recordUrl(config, recordId)))
    if (queued.created) await recordAudit(tx, { actorId, action: 'record.digest', entityType: 'outbox_message', entityId: queued.id, details: { day, records: records.map((r) => r.loadNumber), to } })
    return {
      dedupeKey,
      queued: true,
      created: queued.created,
      outboxId: queued.id,
      to,
      records: records.map(({ id, loadNumber, releasedAt }) => ({ id, loadNumber, releasedAt })),
    }
  })
}
