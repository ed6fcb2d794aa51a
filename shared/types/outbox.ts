export const OUTBOX_STATUSES = ['queued', 'sending', 'sent', 'failed'] as const
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number]

/**
 * One file carried by an outbox message. The content travels inside the row (base64),
 * not as a pointer to data that could change: a mailed record must be the snapshot
 * that was current when it was queued, and the row alone is enough to resend it.
 */
export interface OutboxAttachment {
  filename: string
  contentType: string
  contentBase64: string
}

/** An outbox row as the admin page sees it: no bodies or attachment content. */
export interface OutboxEntry {
  id: number
  dedupeKey: string
  to: string[]
  subject: string
  status: OutboxStatus
  attempts: number
  nextAttemptAt: string
  lastError: string | null
  createdAt: string
  sentAt: string | null
  attachments: { filename: string; contentType: string; bytes: number }[]
}
