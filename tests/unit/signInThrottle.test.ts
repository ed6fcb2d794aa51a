import { describe, expect, it } from 'vitest'
import { clearSignInFailures, noteSignInFailure, signInDelayMs } from '../../server/utils/signInThrottle'

describe('sign-in throttle', () => {
  it('lets three failures pass, then doubles the wait from 0.5 s up to 8 s', () => {
    const key = 'throttle@test.example'
    const now = 1_000_000
    const delays: number[] = []
    for (let failure = 0; failure < 10; failure++) {
      delays.push(signInDelayMs(key, now))
      noteSignInFailure(key, now)
    }
    expect(delays).toEqual([0, 0, 0, 500, 1000, 2000, 4000, 8000, 8000, 8000])
    expect(signInDelayMs(key, now + 16 * 60 * 1000)).toBe(0)
    clearSignInFailures(key)
    expect(signInDelayMs(key, now)).toBe(0)
  })
})
