import { createTransport } from 'nodemailer'
import { DEFAULT_SCHEDULE, type RetrySchedule } from './schedule'

export interface OutboxConfig {
  smtpUrl: string
  from: string
  pollMs: number
  leaseMs: number
  schedule: RetrySchedule
}

function positive(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === '') return fallback
  const parsed = Number(value)
  if (!Number.isFinite(parsed) || parsed <= 0) throw new Error(`${name} must be a positive number of milliseconds, not "${value}"`)
  return parsed
}

/**
 * SMTP_URL          where mail goes (default: a local mail catcher on 127.0.0.1:1025)
 * MAIL_FROM         sender shown on every message
 * OUTBOX_POLL_MS    how often the worker looks for due messages (5 s)
 * OUTBOX_RETRY_BASE_MS / OUTBOX_RETRY_MAX_MS / OUTBOX_MAX_ATTEMPTS  the retry schedule (10 s doubling to 10 min; 10 tries)
 * OUTBOX_LEASE_MS   how long a claimed message is held before another worker may retry it (5 min)
 */
// Plain string variables: NodeJS.ProcessEnv would also demand NODE_ENV (declared by a dependency's typings).
export function outboxConfigFromEnv(env: Readonly<Record<string, string | undefined>> = process.env): OutboxConfig {
  return {
    smtpUrl: env.SMTP_URL || 'smtp://127.0.0.1:1025',
    from: env.MAIL_FROM || 'Slakewise records <records@slakewise.localhost>',
    pollMs: positive(env.OUTBOX_POLL_MS, 5000, 'OUTBOX_POLL_MS'),
    leaseMs: positive(env.OUTBOX_LEASE_MS, 5 * 60_000, 'OUTBOX_LEASE_MS'),
    schedule: {
      baseMs: positive(env.OUTBOX_RETRY_BASE_MS, DEFAULT_SCHEDULE.baseMs, 'OUTBOX_RETRY_BASE_MS'),
      maxMs: positive(env.OUTBOX_RETRY_MAX_MS, DEFAULT_SCHEDULE.maxMs, 'OUTBOX_RETRY_MAX_MS'),
      maxAttempts: positive(env.OUTBOX_MAX_ATTEMPTS, DEFAULT_SCHEDULE.maxAttempts, 'OUTBOX_MAX_ATTEMPTS'),
    },
  }
}

export function createMailTransport(smtpUrl: string) {
  const loopback = ['127.0.0.1', 'localhost', '[::1]'].includes(new URL(smtpUrl).hostname)
  return createTransport({
    url: smtpUrl,
    // Fail fast while the mail server is away: the row simply waits for the next try.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 60_000,
    // A mail catcher on this machine offers STARTTLS with a self-signed certificate;
    // the mail never leaves the host, so plain SMTP is the honest choice there.
    ignoreTLS: loopback,
  })
}
