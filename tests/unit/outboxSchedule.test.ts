import { describe, expect, it } from 'vitest'
import { DEFAULT_SCHEDULE, afterFailure, classifyFailure, retryDelayMs } from '../../server/outbox/schedule'
import { outboxConfigFromEnv } from '../../server/outbox/config'

describe('retryDelayMs', () => {
  it.each([
    [1, 10_000],
    [2, 20_000],
    [3, 40_000],
    [6, 320_000],
    [7, 600_000], // 640 s capped at 10 min
    [30, 600_000],
  ])('after try %i waits %i ms', (attempt, delay) => {
    expect(retryDelayMs(attempt, DEFAULT_SCHEDULE)).toBe(delay)
  })
})

describe('classifyFailure', () => {
  it.each([
    ['connection refused', { code: 'ECONNECTION', message: 'connect ECONNREFUSED 127.0.0.1:1025' }, 'unreachable'],
    ['greeting never came', { code: 'ETIMEDOUT' }, 'unreachable'],
    ['authentication required', { code: 'EENVELOPE', responseCode: 530 }, 'rejected'],
    ['mailbox unavailable', { code: 'EENVELOPE', responseCode: 550 }, 'rejected'],
    ['greylisted', { code: 'EENVELOPE', responseCode: 451 }, 'temporary'],
    ['anything else', new Error('boom'), 'temporary'],
  ])('%s is %s', (_what, error, kind) => {
    expect(classifyFailure(error)).toBe(kind)
  })
})

describe('afterFailure', () => {
  const schedule = { baseMs: 1000, maxMs: 8000, maxAttempts: 3 }
  it('an unreachable server never exhausts the message: it waits at the capped delay', () => {
    expect(afterFailure(50, 'unreachable', schedule)).toEqual({ status: 'queued', delayMs: 8000 })
  })
  it('a refusal fails at once', () => {
    expect(afterFailure(1, 'rejected', schedule)).toEqual({ status: 'failed', delayMs: 0 })
  })
  it('a temporary error retries until the attempt budget is spent', () => {
    expect(afterFailure(2, 'temporary', schedule)).toEqual({ status: 'queued', delayMs: 2000 })
    expect(afterFailure(3, 'temporary', schedule)).toEqual({ status: 'failed', delayMs: 0 })
  })
})

describe('outboxConfigFromEnv', () => {
  it('uses the production schedule unless told otherwise', () => {
    expect(outboxConfigFromEnv({})).toMatchObject({ pollMs: 5000, leaseMs: 300_000, schedule: DEFAULT_SCHEDULE, smtpUrl: 'smtp://127.0.0.1:1025' })
  })
  it('takes the faster test schedule from the environment and refuses nonsense', () => {
    expect(outboxConfigFromEnv({ OUTBOX_POLL_MS: '300', OUTBOX_RETRY_BASE_MS: '300', OUTBOX_RETRY_MAX_MS: '1500' }).schedule).toEqual({ baseMs: 300, maxMs: 1500, maxAttempts: 10 })
    expect(() => outboxConfigFromEnv({ OUTBOX_POLL_MS: 'soon' })).toThrow('OUTBOX_POLL_MS must be a positive number of milliseconds, not "soon"')
  })
})
