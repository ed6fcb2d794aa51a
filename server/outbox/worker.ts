/**
 * The outbox worker: claims due messages, sends them, records the outcome.
 *
 * Claiming: one short transaction selects due rows `FOR UPDATE SKIP LOCKED` and marks
 * them `sending` with a random claim token and a lease (next_attempt_at = now + lease).
 * Another server process running the same query skips the locked rows and, after the
 * commit, no longer sees them as due, so two processes never send the same row.
 *
 * Delivery is at-least-once, never at-most-once: the row is marked `sent` only after the
 * SMTP server accepted the message. If the process dies between the two, the lease runs
 * out, the row is claimed again and the message goes out a second time. A duplicate
 * sheet is a nuisance; a lost one could mean a load ships unreviewed, so this is the
 * side to err on. Every outcome update checks the claim token, so a worker whose lease
 * was taken over cannot overwrite the newer claimant's result.
 *
 * All times come from the database clock (CURRENT_TIMESTAMP), so processes on machines
 * with different clocks agree on what is due.
 */
import { randomUUID } from 'node:crypto'
import { and, asc, eq, inArray, lte, sql } from 'drizzle-orm'
import type { Transporter } from 'nodemailer'
import type { Database } from '../db/client'
import { outboxMessages, type OutboxMessageRow } from '../db/schema'
import { afterFailure, classifyFailure, type RetrySchedule } from './schedule'

export interface WorkerOptions {
  db: Database
  transport: Pick<Transporter, 'sendMail'>
  from: string
  schedule: RetrySchedule
  batchSize?: number
  /** How long a claim holds before another worker may take the row (longer than any send). */
  leaseMs?: number
}

const later = (ms: number) => sql`CURRENT_TIMESTAMP(3) + INTERVAL ${Math.round(ms) * 1000} MICROSECOND`

async function claim(db: Database, batchSize: number, leaseMs: number): Promise<OutboxMessageRow[]> {
  const token = randomUUID()
  return await db.transaction(async (tx) => {
    const due = await tx
      .select({ id: outboxMessages.id })
      .from(outboxMessages)
      // A `sending` row whose lease ran out belongs to a worker that died mid-send.
      .where(and(inArray(outboxMessages.status, ['queued', 'sending']), lte(outboxMessages.nextAttemptAt, sql`CURRENT_TIMESTAMP(3)`)))
      .orderBy(asc(outboxMessages.nextAttemptAt), asc(outboxMessages.id))
      .limit(batchSize)
      .for('update', { skipLocked: true })
    if (due.length === 0) return []
    const ids = due.map((row) => row.id)
    await tx
      .update(outboxMessages)
      .set({ status: 'sending', claimToken: token, attempts: sql`${outboxMessages.attempts} + 1`, nextAttemptAt: later(leaseMs) })
      .where(inArray(outboxMessages.id, ids))
    return await tx.select().from(outboxMessages).where(inArray(outboxMessages.id, ids)).orderBy(asc(outboxMessages.id))
    // READ COMMITTED: under the default REPEATABLE READ the range scan also locks the index
    // gaps, and a request inserting a new message into that range deadlocks with the claim.
  }, { isolationLevel: 'read committed' })
}

function describeError(error: unknown): string {
  const { code, responseCode, message } = (error ?? {}) as { code?: string; responseCode?: number; message?: string }
  const prefix = [code, responseCode].filter((part) => part !== undefined).join(' ')
  return `${prefix ? `${prefix}: ` : ''}${message ?? String(error)}`.slice(0, 2000)
}

export interface TickResult {
  claimed: number
  sent: number
  failed: number
}

/** One pass: claim up to batchSize due messages and try each once. */
export async function runOutboxOnce(options: WorkerOptions): Promise<TickResult> {
  const { db, transport, from, schedule } = options
  const rows = await claim(db, options.batchSize ?? 20, options.leaseMs ?? 5 * 60_000)
  const result: TickResult = { claimed: rows.length, sent: 0, failed: 0 }
  for (const row of rows) {
    const mine = and(eq(outboxMessages.id, row.id), eq(outboxMessages.claimToken, row.claimToken!))
    let accepted = false
    let failure: unknown
    try {
      await transport.sendMail({
        from,
        to: row.to,
        subject: row.subject,
        html: row.html,
        text: row.text,
        attachments: row.attachments.map((file) => ({ filename: file.filename, contentType: file.contentType, content: Buffer.from(file.contentBase64, 'base64') })),
        // Lets a receiving system drop a duplicate from the at-least-once window above.
        messageId: `<outbox-${row.id}-${row.dedupeKey.replace(/[^A-Za-z0-9.-]/g, '-')}@slakewise>`,
      })
      accepted = true
    } catch (error) {
      failure = error
    }
    // Outside the try: if recording "sent" itself fails, the lease expires and the row is resent, not lost.
    if (accepted) {
      await db.update(outboxMessages).set({ status: 'sent', sentAt: sql`CURRENT_TIMESTAMP(3)`, lastError: null, claimToken: null }).where(mine)
      result.sent += 1
    } else {
      const next = afterFailure(row.attempts, classifyFailure(failure), schedule)
      await db
        .update(outboxMessages)
        .set({ status: next.status, lastError: describeError(failure), claimToken: null, nextAttemptAt: later(next.delayMs) })
        .where(mine)
      result.failed += 1
    }
  }
  return result
}
