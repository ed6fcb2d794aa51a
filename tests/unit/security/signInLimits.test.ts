import { describe, expect, it } from 'vitest'
import { ACCOUNT_POLICY, ADDRESS_POLICY, retryAfterSeconds } from '../../../server/security/signInLimits'

describe('sign-in limits: Retry-After from the counted attempts', () => {
  const last = new Date('2026-12-02T08:00:00Z')
  const after = (s: number) => new Date(last.getTime() + s * 1000)

  it('an account gets five attempts, then waits 30 s doubling up to 15 min (from the last attempt)', () => {
    const waits = Array.from({ length: 12 }, (_, count) => retryAfterSeconds(count, last, last, ACCOUNT_POLICY))
    expect(waits).toEqual([0, 0, 0, 0, 0, 30, 60, 120, 240, 480, 900, 900])
  })

  it('counts the wait down from the last attempt, rounding up to whole seconds', () => {
    expect(retryAfterSeconds(6, last, after(59.2), ACCOUNT_POLICY)).toBe(1)
    expect(retryAfterSeconds(6, last, after(60), ACCOUNT_POLICY)).toBe(0)
  })

  it('forgets a subject after a quiet hour', () => {
    expect(retryAfterSeconds(40, last, after(3600), ACCOUNT_POLICY)).toBe(0)
    expect(retryAfterSeconds(40, last, after(3601), ACCOUNT_POLICY)).toBe(0)
    expect(retryAfterSeconds(40, last, after(10), ACCOUNT_POLICY)).toBe(890)
  })

  it('an address (a whole shop behind one router) gets forty before waiting', () => {
    expect(retryAfterSeconds(39, last, last, ADDRESS_POLICY)).toBe(0)
    expect(retryAfterSeconds(40, last, last, ADDRESS_POLICY)).toBe(30)
  })
})
