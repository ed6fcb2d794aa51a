/**
 * Slows repeated failed sign-ins per e-mail address: after three failures each
 * further attempt waits longer (0.5 s doubling, at most 8 s); a quiet quarter of an
 * hour forgets them, a successful sign-in clears them. The counts live in the
 * database (sign_in_failures), so a restart or a second server process does not
 * reset the brake. It only has to make guessing slow: every attempt still gets the
 * same answer for an unknown address, a wrong password and an inactive account.
 */
import { eq, sql } from 'drizzle-orm'
import { signInFailures } from '../db/schema'
import { useDb } from '../utils/db'

const FREE_ATTEMPTS = 3
const BASE_DELAY_MS = 500
const MAX_DELAY_MS = 8000
const FORGET_AFTER_MS = 15 * 60 * 1000

/** The wait before the next attempt after `count` failures, the last at `lastAt`. */
export function throttleDelayMs(count: number, lastAt: Date, now: Date): number {
  if (now.getTime() - lastAt.getTime() > FORGET_AFTER_MS) return 0
  const extra = count - FREE_ATTEMPTS
  return extra < 0 ? 0 : Math.min(MAX_DELAY_MS, BASE_DELAY_MS * 2 ** extra)
}

export async function signInDelayMs(email: string): Promise<number> {
  const [entry] = await useDb().select().from(signInFailures).where(eq(signInFailures.email, email))
  return entry ? throttleDelayMs(entry.count, entry.lastAt, new Date()) : 0
}

export async function noteSignInFailure(email: string): Promise<void> {
  const now = new Date()
  const forgotten = new Date(now.getTime() - FORGET_AFTER_MS)
  // MariaDB applies the assignments in order, so the count still sees the old last_at.
  await useDb()
    .insert(signInFailures)
    .values({ email, count: 1, lastAt: now })
    .onDuplicateKeyUpdate({ set: { count: sql`IF(${signInFailures.lastAt} < ${forgotten}, 1, ${signInFailures.count} + 1)`, lastAt: now } })
}

export async function clearSignInFailures(email: string): Promise<void> {
  await useDb().delete(signInFailures).where(eq(signInFailures.email, email))
}
