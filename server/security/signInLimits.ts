/**
 * Sign-in limits per account and per client address. Every attempt is counted when it
 * starts, so thirty guesses sent at once count as thirty, and a blocked attempt is
 * answered 429 with Retry-After at once instead of being slowed down (a sleeping
 * server only makes parallel guessing cheaper). A successful sign-in clears its
 * account's count and takes itself back off its address's count. The counts live in
 * the database (sign_in_attempts), shared by restarts and server processes.
 */
import { eq, inArray, sql } from 'drizzle-orm'
import { signInAttempts } from '../db/schema'
import type { Database } from '../db/client'

export interface LimitPolicy {
  /** Attempts allowed before waits begin. */
  free: number
  /** The first wait; each further attempt doubles it up to `maxWaitS`. */
  baseWaitS: number
  maxWaitS: number
  /** A subject quiet for this long starts again from zero. */
  forgetAfterS: number
}

/** One person's account: five tries, then 30 s doubling to 15 min. */
export const ACCOUNT_POLICY: LimitPolicy = { free: 5, baseWaitS: 30, maxWaitS: 900, forgetAfterS: 3600 }
/** One address may be a whole shop behind one router: a shift's sign-ins, then the same waits. */
export const ADDRESS_POLICY: LimitPolicy = { free: 40, baseWaitS: 30, maxWaitS: 900, forgetAfterS: 3600 }

/** Seconds until the next attempt may start after `count` counted attempts, the last at `lastAt`; 0 = now. */
export function retryAfterSeconds(count: number, lastAt: Date, now: Date, policy: LimitPolicy): number {
  const sinceS = (now.getTime() - lastAt.getTime()) / 1000
  if (sinceS > policy.forgetAfterS || count < policy.free) return 0
  const waitS = Math.min(policy.maxWaitS, policy.baseWaitS * 2 ** (count - policy.free))
  return Math.max(0, Math.ceil(waitS - sinceS))
}

export interface SignInSubjects {
  account: string
  address: string
}

export function signInSubjects(email: string, address: string): SignInSubjects {
  return { account: `account:${email.trim().toLowerCase()}`, address: `address:${address}` }
}

/**
 * Counts an attempt for both subjects, or answers how many seconds to wait when either
 * is over its limit (then nothing is counted). The rows are locked in a fixed order so
 * parallel attempts queue instead of reading the same count.
 */
export async function startSignInAttempt(db: Database, subjects: SignInSubjects, now = new Date()): Promise<number> {
  const entries: [string, LimitPolicy][] = [
    [subjects.account, ACCOUNT_POLICY],
    [subjects.address, ADDRESS_POLICY],
  ]
  const keys = entries.map(([key]) => key).sort()
  await db.insert(signInAttempts).ignore().values(keys.map((subject) => ({ subject, count: 0, lastAt: new Date(0) })))
  return await db.transaction(async (tx) => {
    const rows = await tx.select().from(signInAttempts).where(inArray(signInAttempts.subject, keys)).orderBy(signInAttempts.subject).for('update')
    const bySubject = new Map(rows.map((row) => [row.subject, row]))
    let wait = 0
    for (const [key, policy] of entries) {
      const row = bySubject.get(key)
      if (row) wait = Math.max(wait, retryAfterSeconds(row.count, row.lastAt, now, policy))
    }
    if (wait > 0) return wait
    for (const [key, policy] of entries) {
      const row = bySubject.get(key)
      const forgotten = !row || (now.getTime() - row.lastAt.getTime()) / 1000 > policy.forgetAfterS
      await tx
        .update(signInAttempts)
        .set({ count: forgotten ? 1 : sql`${signInAttempts.count} + 1`, lastAt: now })
        .where(eq(signInAttempts.subject, key))
    }
    return 0
  })
}

/** A successful sign-in: the account starts afresh, the address forgets this one attempt. */
export async function finishSuccessfulSignIn(db: Database, subjects: SignInSubjects): Promise<void> {
  await db.delete(signInAttempts).where(eq(signInAttempts.subject, subjects.account))
  await db
    .update(signInAttempts)
    .set({ count: sql`GREATEST(${signInAttempts.count} - 1, 0)` })
    .where(eq(signInAttempts.subject, subjects.address))
}
