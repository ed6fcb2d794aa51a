import { eq } from 'drizzle-orm'
import type { OutboxAttachment } from '../../shared/types/outbox'
import type { Database, Transaction } from '../db/client'
import { outboxMessages } from '../db/schema'
import { isDuplicateKey } from '../utils/dbErrors'

export interface OutgoingMail {
  /** Same key, same message: a second enqueue with it is a no-op (a retried request, a replayed event). */
  dedupeKey: string
  to: string[]
  subject: string
  html: string
  text: string
  attachments?: { filename: string; contentType: string; content: Buffer | string }[]
}

/**
 * Queues a message inside the caller's transaction, so it is committed together with
 * the change that causes it (a released load, a rejected record) or not at all. The
 * worker (server/outbox/worker.ts) sends it after the commit.
 */
export async function enqueueMail(tx: Database | Transaction, mail: OutgoingMail): Promise<{ id: number; created: boolean }> {
  if (mail.to.length === 0) throw new Error(`Mail "${mail.subject}" has no recipients`)
  const attachments: OutboxAttachment[] = (mail.attachments ?? []).map((file) => ({
    filename: file.filename,
    contentType: file.contentType,
    contentBase64: (typeof file.content === 'string' ? Buffer.from(file.content, 'utf8') : file.content).toString('base64'),
  }))
  try {
    const [inserted] = await tx
      .insert(outboxMessages)
      .values({ dedupeKey: mail.dedupeKey, to: mail.to, subject: mail.subject, html: mail.html, text: mail.text, attachments })
      .$returningId()
    return { id: inserted!.id, created: true }
  } catch (error) {
    // A duplicate key fails only this statement, not the caller's transaction; the first message stays as it was.
    if (!isDuplicateKey(error)) throw error
    const [existing] = await tx.select({ id: outboxMessages.id }).from(outboxMessages).where(eq(outboxMessages.dedupeKey, mail.dedupeKey))
    return { id: existing!.id, created: false }
  }
}
