import { and, asc, count, desc, eq, sql } from 'drizzle-orm'
import { createError } from 'h3'
import type { OutboxEntry, OutboxStatus } from '../../shared/types/outbox'
import { OUTBOX_STATUSES } from '../../shared/types/outbox'
import { outboxMessages, type OutboxMessageRow } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'

function toEntry(row: OutboxMessageRow): OutboxEntry {
  return {
    id: row.id,
    dedupeKey: row.dedupeKey,
    to: row.to,
    subject: row.subject,
    status: row.status,
    attempts: row.attempts,
    nextAttemptAt: row.nextAttemptAt.toISOString(),
    lastError: row.lastError,
    createdAt: row.createdAt.toISOString(),
    sentAt: row.sentAt?.toISOString() ?? null,
    attachments: row.attachments.map((file) => ({
      filename: file.filename,
      contentType: file.contentType,
      bytes: Buffer.byteLength(file.contentBase64, 'base64'),
    })),
  }
}

/** The messages the admin page shows: unsent first (they need attention), then the latest sent. */
export async function listOutbox(filter: { status?: OutboxStatus; limit: number }) {
  const db = useDb()
  const rows = await db
    .select()
    .from(outboxMessages)
    .where(filter.status ? eq(outboxMessages.status, filter.status) : undefined)
    .orderBy(asc(sql`${outboxMessages.status} = 'sent'`), desc(outboxMessages.id))
    .limit(filter.limit)
  const totals = await db.select({ status: outboxMessages.status, n: count() }).from(outboxMessages).groupBy(outboxMessages.status)
  const counts = Object.fromEntries(OUTBOX_STATUSES.map((status) => [status, totals.find((t) => t.status === status)?.n ?? 0])) as Record<OutboxStatus, number>
  return { counts, messages: rows.map(toEntry) }
}

/**
 * Puts a queued or failed message up for sending now, with a fresh attempt budget.
 * A sent message is not resent (that would be a duplicate sheet), and a message being
 * sent right now is left to its worker.
 */
export async function retryOutboxMessage(id: number, actorId: number): Promise<OutboxEntry> {
  return await useDb().transaction(async (tx) => {
    const [row] = await tx.select().from(outboxMessages).where(eq(outboxMessages.id, id)).for('update')
    if (!row) throw createError({ statusCode: 404, statusMessage: 'Message not found' })
    if (row.status === 'sent' || row.status === 'sending') {
      throw createError({
        statusCode: 409,
        statusMessage: row.status === 'sent' ? 'Message already sent' : 'Message is being sent right now',
        data: { status: row.status },
      })
    }
    await tx
      .update(outboxMessages)
      .set({ status: 'queued', attempts: 0, nextAttemptAt: sql`CURRENT_TIMESTAMP(3)` })
      .where(and(eq(outboxMessages.id, id), eq(outboxMessages.status, row.status)))
    await recordAudit(tx, {
      actorId,
      action: 'outbox.retry',
      entityType: 'outbox_message',
      entityId: id,
      details: { from: row.status, attempts: row.attempts, lastError: row.lastError },
    })
    const [after] = await tx.select().from(outboxMessages).where(eq(outboxMessages.id, id))
    return toEntry(after!)
  })
}
