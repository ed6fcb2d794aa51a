import { isNodeFailure, isWriteConflict } from './dbFailures'

export interface RetryPolicy {
  /** Runs in all, the first included. */
  attempts: number
  /** Wait before the second run; doubles each time, with full jitter so racing writers spread out. */
  baseDelayMs: number
  random?: () => number
  sleep?: (ms: number) => Promise<void>
}

export const DEFAULT_RETRY: RetryPolicy = { attempts: 5, baseDelayMs: 20 }

const pause = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms))

/**
 * Runs a whole transaction again when it lost a lock or Galera certification race, or
 * when its node failed (the failover pool then hands out another node). The function
 * must be safe to run twice: it may only change the database inside the transaction,
 * and state it builds up must start afresh on each run. Anything else is thrown at once.
 */
export async function retryTransient<T>(run: () => Promise<T>, policy: RetryPolicy = DEFAULT_RETRY): Promise<T> {
  const random = policy.random ?? Math.random
  const sleep = policy.sleep ?? pause
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await run()
    } catch (error) {
      if (attempt >= policy.attempts || !(isWriteConflict(error) || isNodeFailure(error))) throw error
      await sleep(random() * policy.baseDelayMs * 2 ** (attempt - 1))
    }
  }
}
