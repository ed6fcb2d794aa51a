import { describe, expect, it } from 'vitest'
import { throttleDelayMs } from '../../server/accounts/signInThrottle'

describe('sign-in throttle', () => {
  const last = new Date('2026-12-02T08:00:00Z')
  const after = (ms: number) => new Date(last.getTime() + ms)

  it('lets three failures pass, then doubles the wait from 0.5 s up to 8 s', () => {
    const delays = Array.from({ length: 10 }, (_, count) => throttleDelayMs(count, last, after(1000)))
    expect(delays).toEqual([0, 0, 0, 500, 1000, 2000, 4000, 8000, 8000, 8000])
  })

  it('forgets failures after a quiet quarter of an hour', () => {
    expect(throttleDelayMs(6, last, after(15 * 60 * 1000))).toBe(4000)
    expect(throttleDelayMs(6, last, after(15 * 60 * 1000 + 1))).toBe(0)
  })
})
