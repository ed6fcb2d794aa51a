/**
 * The store of uploaded thermocouple logs. A file is parsed (parseLog.ts) before
 * anything is written; a refusal is a 422 naming the reason and stores nothing. A
 * stored log (bytes, SHA-256, the detected columns, the confirmed mapping and the
 * series in °C) is written in one transaction with its audit row and never changed.
 */
import { createHash } from 'node:crypto'
import { desc, eq, inArray } from 'drizzle-orm'
import { createError } from 'h3'
import type { Transaction } from '../db/client'
import { batches, cooldownRecords, measurementLogChannels, measurementLogParts, measurementLogs, users, type MeasurementLogRow } from '../db/schema'
import { can } from '../../shared/access'
import type { LogChannelSeries, LogDetail, LogMapping, LogPreview, LogSummary } from '../../shared/types/measurementLog'
import type { SessionUser } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { fromFloat64Blob, toFloat64Blob } from './float64Blob'
import { LogError, previewLog, readLog, type LogSeries } from './parseLog'

/** Rows a log view gets at most; the stored series keeps every row. */
export const SHOWN_POINTS = 2000
const PART_BYTES = 1024 * 1024

function refusal(error: unknown): never {
  if (error instanceof LogError) {
    const reason = error.message.slice(error.field.length + 2)
    throw createError({ statusCode: 422, statusMessage: 'Log refused', message: error.message, data: { problems: [{ field: error.field, message: reason }] } })
  }
  throw error
}

/** What the file holds, for the person to map; nothing is stored. */
export async function previewUpload(bytes: Uint8Array): Promise<LogPreview> {
  try {
    return await previewLog(bytes)
  } catch (error) {
    refusal(error)
  }
}

export interface LogUpload {
  fileName: string
  bytes: Uint8Array
  mapping: LogMapping
  batchId?: number
  /** How the log lines up with the load's quench tap (server/records/measuredTraces.ts); at most one. */
  startedAt?: Date
  quenchAtLog_s?: number
}

/**
 * Work of another domain that must commit with the stored log (the load's unsigned
 * record re-issued with the new trace); what it returns joins the upload's audit row.
 */
export type AfterLogStored = (tx: Transaction, batchId: number) => Promise<Record<string, unknown> | null>

function conflict(field: string, message: string): never {
  throw createError({ statusCode: 409, statusMessage: message, data: { problems: [{ field, message }] } })
}

/** A load may take a log from its charge until its record is signed; operators attach only to such a load. */
async function checkLoad(tx: Transaction, batchId: number | undefined, user: SessionUser): Promise<void> {
  if (batchId === undefined) {
    if (can(user.role, 'logs.upload')) return
    throw createError({ statusCode: 403, statusMessage: 'Attach the log to a load', data: { problems: [{ field: 'batchId', message: 'operators attach a log to the load they are working on' }] } })
  }
  const [load] = await tx.select({ state: batches.state, loadNumber: batches.loadNumber }).from(batches).where(eq(batches.id, batchId)).for('update')
  if (!load) throw createError({ statusCode: 422, statusMessage: 'No such load', data: { problems: [{ field: 'batchId', message: `there is no load ${batchId}` }] } })
  if (load.state === 'planned' || load.state === 'cancelled') conflict('batchId', `load ${load.loadNumber} is ${load.state}: a log belongs to a load that has been charged`)
  const [record] = await tx.select({ state: cooldownRecords.state }).from(cooldownRecords).where(eq(cooldownRecords.batchId, batchId))
  if (record && record.state !== 'unsigned') conflict('batchId', `the record of load ${load.loadNumber} is signed and sealed; no log can be added`)
}

function rangeOf(values: number[]): { min_C: number; max_C: number } {
  let min_C = Infinity
  let max_C = -Infinity
  for (const v of values) {
    if (v < min_C) min_C = v
    if (v > max_C) max_C = v
  }
  return { min_C, max_C }
}

async function insertLog(
  tx: Transaction,
  upload: LogUpload,
  parsed: { preview: LogPreview; series: LogSeries },
  user: SessionUser,
  afterStored?: AfterLogStored,
): Promise<number> {
  const { preview, series } = parsed
  const { firstRows: _firstRows, ...detected } = preview
  const sha256 = createHash('sha256').update(upload.bytes).digest('hex')
  const [{ id }] = await tx
    .insert(measurementLogs)
    .values({
      fileName: upload.fileName.slice(0, 255),
      sha256,
      size_bytes: upload.bytes.length,
      rows: series.t_s.length,
      duration_s: series.t_s[series.t_s.length - 1],
      detected,
      mapping: upload.mapping,
      time_s: toFloat64Blob(series.t_s),
      batchId: upload.batchId ?? null,
      startedAt: upload.startedAt ?? null,
      quenchAtLog_s: upload.quenchAtLog_s ?? null,
      uploadedBy: user.id,
    })
    .$returningId()
  for (const [position, channel] of series.channels.entries()) {
    const values = { logId: id, position, name: channel.name, unit: channel.unit, ...rangeOf(channel.T_C), T_C: toFloat64Blob(channel.T_C) }
    await tx.insert(measurementLogChannels).values(values)
  }
  for (let part = 0; part * PART_BYTES < upload.bytes.length; part++) {
    const bytes = Buffer.from(upload.bytes.subarray(part * PART_BYTES, (part + 1) * PART_BYTES))
    await tx.insert(measurementLogParts).values({ logId: id, part, bytes })
  }
  const followUp = upload.batchId !== undefined && afterStored ? await afterStored(tx, upload.batchId) : null
  await recordAudit(tx, {
    actorId: user.id,
    action: 'log.upload',
    entityType: 'measurement_log',
    entityId: id,
    details: {
      fileName: upload.fileName,
      sha256,
      size_bytes: upload.bytes.length,
      rows: series.t_s.length,
      mapping: upload.mapping,
      batchId: upload.batchId ?? null,
      startedAt: upload.startedAt?.toISOString() ?? null,
      quenchAtLog_s: upload.quenchAtLog_s ?? null,
      ...(followUp ? { record: followUp } : {}),
    },
  })
  return id
}

/** Parses the file under its mapping and stores it; refusals store nothing. */
export async function storeLog(upload: LogUpload, user: SessionUser, afterStored?: AfterLogStored): Promise<LogSummary> {
  let parsed: Awaited<ReturnType<typeof readLog>>
  try {
    parsed = await readLog(upload.bytes, upload.mapping)
  } catch (error) {
    refusal(error)
  }
  const id = await useDb().transaction(async (tx) => {
    await checkLoad(tx, upload.batchId, user)
    return await insertLog(tx, upload, parsed, user, afterStored)
  })
  return await readLogSummary(id)
}

const summaryColumns = {
  id: measurementLogs.id,
  fileName: measurementLogs.fileName,
  size_bytes: measurementLogs.size_bytes,
  sha256: measurementLogs.sha256,
  rows: measurementLogs.rows,
  duration_s: measurementLogs.duration_s,
  batchId: measurementLogs.batchId,
  startedAt: measurementLogs.startedAt,
  quenchAtLog_s: measurementLogs.quenchAtLog_s,
  loadNumber: batches.loadNumber,
  uploadedBy: users.displayName,
  uploadedAt: measurementLogs.uploadedAt,
}

type SummaryColumn = 'id' | 'fileName' | 'size_bytes' | 'sha256' | 'rows' | 'duration_s' | 'batchId' | 'startedAt' | 'quenchAtLog_s' | 'uploadedAt'
type SummaryRow = Pick<MeasurementLogRow, SummaryColumn> & {
  loadNumber: string | null
  uploadedBy: string
}

function summaryQuery() {
  return useDb()
    .select(summaryColumns)
    .from(measurementLogs)
    .innerJoin(users, eq(users.id, measurementLogs.uploadedBy))
    .leftJoin(batches, eq(batches.id, measurementLogs.batchId))
}

async function withChannelNames(rows: SummaryRow[]): Promise<LogSummary[]> {
  if (rows.length === 0) return []
  const names = await useDb()
    .select({ logId: measurementLogChannels.logId, name: measurementLogChannels.name })
    .from(measurementLogChannels)
    .where(inArray(measurementLogChannels.logId, rows.map((r) => r.id)))
    .orderBy(measurementLogChannels.logId, measurementLogChannels.position)
  return rows.map((r) => ({
    ...r,
    startedAt: r.startedAt?.toISOString() ?? null,
    uploadedAt: r.uploadedAt.toISOString(),
    channels: names.filter((n) => n.logId === r.id).map((n) => n.name),
  }))
}

/** Logs newest first; `batchId` narrows to one load's. */
export async function listLogs(batchId?: number): Promise<LogSummary[]> {
  const query = summaryQuery()
  const rows = await (batchId === undefined ? query : query.where(eq(measurementLogs.batchId, batchId))).orderBy(desc(measurementLogs.id)).limit(500)
  return await withChannelNames(rows)
}

async function readLogSummary(id: number): Promise<LogSummary> {
  const [summary] = await withChannelNames(await summaryQuery().where(eq(measurementLogs.id, id)))
  if (!summary) throw createError({ statusCode: 404, statusMessage: 'Log not found' })
  return summary
}

/** Every `stride`-th value and the last, so a view never draws more than SHOWN_POINTS rows. */
function thinned(values: number[], stride: number): number[] {
  const kept = values.filter((_, i) => i % stride === 0)
  if ((values.length - 1) % stride !== 0) kept.push(values[values.length - 1])
  return kept
}

/** The full stored series of one log: seconds from its first row and each channel in °C. */
export async function readLogSeries(id: number): Promise<{ row: MeasurementLogRow; t_s: number[]; channels: LogChannelSeries[] }> {
  const db = useDb()
  const [row] = await db.select().from(measurementLogs).where(eq(measurementLogs.id, id))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Log not found' })
  const channels = await db.select().from(measurementLogChannels).where(eq(measurementLogChannels.logId, id)).orderBy(measurementLogChannels.position)
  const series = channels.map((c) => ({ name: c.name, unit: c.unit, min_C: c.min_C, max_C: c.max_C, T_C: fromFloat64Blob(c.T_C) }))
  return { row, t_s: fromFloat64Blob(row.time_s), channels: series }
}

/** One log with its series thinned for display. */
export async function readLogDetail(id: number): Promise<LogDetail> {
  const summary = await readLogSummary(id)
  const { row, t_s, channels } = await readLogSeries(id)
  // The kept rows are 0, stride, 2·stride, … and the last: at most SHOWN_POINTS with this stride.
  const stride = Math.max(1, Math.ceil((t_s.length - 1) / (SHOWN_POINTS - 1)))
  const shown = thinned(t_s, stride)
  return {
    ...summary,
    mapping: row.mapping,
    detected: row.detected,
    shownPoints: shown.length,
    t_s: shown,
    series: channels.map((c) => ({ ...c, T_C: thinned(c.T_C, stride) })),
  }
}

/** The file exactly as received. */
export async function readLogFile(id: number): Promise<{ fileName: string; bytes: Buffer }> {
  const db = useDb()
  const [row] = await db.select({ fileName: measurementLogs.fileName }).from(measurementLogs).where(eq(measurementLogs.id, id))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Log not found' })
  const parts = await db
    .select({ bytes: measurementLogParts.bytes })
    .from(measurementLogParts)
    .where(eq(measurementLogParts.logId, id))
    .orderBy(measurementLogParts.part)
  return { fileName: row.fileName, bytes: Buffer.concat(parts.map((p) => p.bytes)) }
}
