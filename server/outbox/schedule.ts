/**
 * When the outbox tries again. Delays double from `baseMs` up to `maxMs`
 * (10 s, 20 s, 40 s … 10 min in production); tests shorten them through the
 * OUTBOX_* environment settings read in server/plugins/outbox.ts.
 */
export interface RetrySchedule {
  baseMs: number
  maxMs: number
  /** Attempts after which a message that the server refused is given up as failed. */
  maxAttempts: number
}

export const DEFAULT_SCHEDULE: RetrySchedule = { baseMs: 10_000, maxMs: 600_000, maxAttempts: 10 }

/** Delay after the `attempt`-th failed try (1-based). */
export function retryDelayMs(attempt: number, schedule: RetrySchedule): number {
  return Math.min(schedule.maxMs, schedule.baseMs * 2 ** Math.max(0, attempt - 1))
}

export type FailureKind = 'unreachable' | 'rejected' | 'temporary'

/**
 * Sorts a Nodemailer error: `unreachable` (no connection: nothing is wrong with the
 * message, so it waits however long the outage lasts), `rejected` (an SMTP 5xx: the
 * server will not take this message, retrying cannot help), `temporary` (4xx and
 * anything else: retried up to maxAttempts).
 */
export function classifyFailure(error: unknown): FailureKind {
  const { code, responseCode } = (error ?? {}) as { code?: string; responseCode?: number }
  if (typeof responseCode === 'number' && responseCode >= 500) return 'rejected'
  if (typeof responseCode === 'number' && responseCode >= 400) return 'temporary'
  if (code && ['ECONNECTION', 'ESOCKET', 'ETIMEDOUT', 'EDNS', 'ECONNREFUSED', 'ECONNRESET', 'EGREETING'].includes(code)) return 'unreachable'
  return 'temporary'
}

/** What a failed attempt leads to: back in the queue at a later time, or given up. */
export function afterFailure(attempts: number, kind: FailureKind, schedule: RetrySchedule): { status: 'queued' | 'failed'; delayMs: number } {
  if (kind === 'rejected' || (kind === 'temporary' && attempts >= schedule.maxAttempts)) return { status: 'failed', delayMs: 0 }
  return { status: 'queued', delayMs: retryDelayMs(attempts, schedule) }
}
