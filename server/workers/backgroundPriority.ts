/**
 * Puts the calling worker thread at a lower CPU priority (nice 10), so that when a
 * solve and a request want the same core, the request thread (nice 0) gets it: a floor
 * poll no longer waits behind a graded preview for its time slice. The scheduler still
 * hands an idle core to the solve, so a lone preview runs as fast as before.
 *
 * Why 10 and not the lowest, 19: side by side on a loaded 2-core machine both halved the
 * floor poll's p95 beside graded previews, but at 19 a request thread kept busy left the
 * solve almost nothing (a round at 1 preview/s, p50 4.5 s, near the engine's own time
 * budget), at 10 it still got about a tenth of the core (12 previews/s in the worst round).
 *
 * Linux only: there the nice value belongs to each thread (setpriority(2), BUGS: under
 * NPTL it is a per-thread attribute) and os.setPriority without a pid (pid 0) changes the
 * calling thread alone. Elsewhere pid 0 means the whole process, which would slow the
 * request thread too, so nothing is changed. A refusal is logged and the thread runs on
 * at the priority it has.
 */
import { setPriority } from 'node:os'
import { isMainThread } from 'node:worker_threads'

/** What nice(1) adds by default. Lowering one's own priority needs no privilege. */
export const BACKGROUND_NICE = 10

export function runThisThreadInBackground(): void {
  // Imported on the main thread by mistake, it must not slow the requests down.
  if (isMainThread || process.platform !== 'linux') return
  try {
    setPriority(BACKGROUND_NICE)
  } catch (error) {
    console.warn(`[engine] worker thread keeps its CPU priority: ${(error as Error).message}`)
  }
}
