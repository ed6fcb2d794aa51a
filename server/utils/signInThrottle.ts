/**
 * Slows repeated failed sign-ins per e-mail address: after three failures each
 * further attempt waits longer (0.5 s doubling, at most 8 s). Kept in memory: a
 * restart forgets, which is acceptable for a brake that only has to make guessing slow.
 */
const FREE_ATTEMPTS = 3
const BASE_DELAY_MS = 500
const MAX_DELAY_MS = 8000
const FORGET_AFTER_MS = 15 * 60 * 1000

const failures = new Map<string, { count: number; last: number }>()

export function signInDelayMs(key: string, now = Date.now()): number {
  const entry = failures.get(key)
  if (!entry || now - entry.last > FORGET_AFTER_MS) return 0
  const extra = entry.count - FREE_ATTEMPTS
  return extra < 0 ? 0 : Math.min(MAX_DELAY_MS, BASE_DELAY_MS * 2 ** extra)
}

export function noteSignInFailure(key: string, now = Date.now()): void {
  const entry = failures.get(key)
  const count = entry && now - entry.last <= FORGET_AFTER_MS ? entry.count + 1 : 1
  failures.set(key, { count, last: now })
}

export function clearSignInFailures(key: string): void {
  failures.delete(key)
}
