/**
 * Puts the calling worker thread at the lowest CPU priority (nice 19), so that when a
 * solve and a request want the same core, the request thread (nice 0) gets it: a floor
 * poll no longer waits behind a graded preview for its time slice. The scheduler still
 * hands an idle core to the solve, so a lone preview runs as fast as before.
 *
 * Linux only: there the nice value belongs to each thread (setpriority(2), BUGS: under
 * NPTL it is a per-thread attribute) and os.setPriority without a pid (pid 0) changes the
 * calling thread alone. Elsewhere pid 0 means the whole process, which would slow the
 * request thread too, so nothing is changed. A refusal is logged and the thread runs on
 * at the priority it has.
 */
import { setPriority } from 'node:os'
import { isMainThread } from 'node:worker_threads'

/** The lowest priority setpriority(2) accepts. Lowering needs no privilege. */
export const BACKGROUND_NICE = 19

export function runThisThreadInBackground(): void {
  // Imported on the main thread by mistake, it must not slow the requests down.
  if (isMainThread || process.platform !== 'linux') return
  try {
    setPriority(BACKGROUND_NICE)
  } catch (error) {
    console.warn(`[engine] worker thread keeps its CPU priority: ${(error as Error).message}`)
  }
}
