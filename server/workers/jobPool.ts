/**
 * A pool of worker threads (piscina) for CPU-heavy jobs, so a long solve never holds
 * the request thread. Framework-free: the Nitro plugin builds one for the engine,
 * tests build one around a fixture worker.
 *
 * - The pool admits at most `threads` jobs at once and queues the rest itself, so the
 *   per-job cap starts when a job starts running, not while it waits its turn.
 * - A job over its cap is aborted: piscina terminates that thread (a pure loop cannot
 *   be interrupted any other way) and starts a fresh one.
 * - Identical jobs in flight at the same moment share one run (key: a hash of the job
 *   name and its input as JSON; inputs come out of zod, so equal inputs serialise equally).
 */
import { createHash } from 'node:crypto'
import { once } from 'node:events'
import { existsSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import { fileURLToPath } from 'node:url'
import { Piscina } from 'piscina'

export class JobTimeoutError extends Error {
  constructor(readonly limit_s: number) {
    super(`The job ran longer than its ${limit_s} s limit and was stopped`)
    this.name = 'JobTimeoutError'
  }
}

export class JobQueueFullError extends Error {
  constructor(readonly limit: number) {
    super(`${limit} jobs are already waiting for a worker thread`)
    this.name = 'JobQueueFullError'
  }
}

/** The pool is closing (the server is stopping): the job did not run to its end. */
export class JobPoolClosedError extends Error {
  constructor() {
    super('The server is stopping; the job was not finished')
    this.name = 'JobPoolClosedError'
  }
}

export interface JobPoolOptions {
  /** Worker entry: absolute path or file:// URL of an ES module whose named exports are the jobs. */
  filename: string
  /** Worker threads; 0 or absent means one per core but one (the request thread keeps a core). */
  threads?: number
  /** Wall-clock limit of one running job. */
  jobSeconds: number
  /** Jobs allowed to wait for a thread before new ones are refused. */
  maxQueue?: number
}

export interface JobPoolStats {
  threads: number
  jobSeconds: number
  running: number
  queued: number
  /** Jobs handed to a thread since start. */
  started: number
  /** Requests answered by a job another request had already started. */
  shared: number
  timedOut: number
}

export interface JobPool {
  run<T>(name: string, input: unknown): Promise<T>
  stats(): JobPoolStats
  close(): Promise<void>
}

/** How long a slot waits for the thread that replaces a terminated one. */
const REPLACEMENT_WAIT_MS = 10_000

export const defaultThreadCount = (): number => Math.max(1, availableParallelism() - 1)

export function createJobPool(options: JobPoolOptions): JobPool {
  // A missing entry would leave every job waiting for a thread that never loads: fail at start instead.
  const entry = options.filename.startsWith('file:') ? fileURLToPath(options.filename) : options.filename
  if (!existsSync(entry)) throw new Error(`Worker entry not found: ${entry}`)
  const threads = options.threads && options.threads > 0 ? Math.floor(options.threads) : defaultThreadCount()
  const maxQueue = options.maxQueue ?? 64
  const piscina = new Piscina({ filename: options.filename, minThreads: threads, maxThreads: threads })
  const waiting: (() => void)[] = []
  const inFlight = new Map<string, Promise<unknown>>()
  let running = 0
  let closing = false
  const counts = { started: 0, shared: 0, timedOut: 0 }

  async function takeThread(): Promise<void> {
    if (running < threads) {
      running += 1
      return
    }
    if (waiting.length >= maxQueue) throw new JobQueueFullError(maxQueue)
    // The finishing job hands its thread over without decrementing `running`.
    await new Promise<void>((resolve) => waiting.push(resolve))
  }

  function releaseThread(): void {
    const next = waiting.shift()
    if (next) next()
    else running -= 1
  }

  async function execute(name: string, input: unknown): Promise<unknown> {
    await takeThread()
    if (closing) {
      releaseThread()
      throw new JobPoolClosedError()
    }
    counts.started += 1
    const controller = new AbortController()
    let replaced: Promise<unknown> | undefined
    const timer = setTimeout(() => {
      replaced = once(piscina, 'workerCreate', { signal: AbortSignal.timeout(REPLACEMENT_WAIT_MS) }).catch(() => undefined)
      controller.abort()
    }, options.jobSeconds * 1000)
    try {
      return await piscina.run(input, { name, signal: controller.signal })
    } catch (error) {
      // piscina aborts the jobs of a pool being destroyed with its own error: say what happened instead.
      if (closing) throw new JobPoolClosedError()
      if (!controller.signal.aborted) throw error
      counts.timedOut += 1
      // Keep the slot until the replacement thread is up, so its start-up is not charged to the next job's cap.
      await replaced
      throw new JobTimeoutError(options.jobSeconds)
    } finally {
      clearTimeout(timer)
      releaseThread()
    }
  }

  return {
    run<T>(name: string, input: unknown): Promise<T> {
      if (closing) return Promise.reject(new JobPoolClosedError())
      const key = createHash('sha256').update(name).update('\0').update(JSON.stringify(input)).digest('hex')
      const current = inFlight.get(key)
      if (current) {
        counts.shared += 1
        return current as Promise<T>
      }
      const job = execute(name, input).finally(() => inFlight.delete(key))
      inFlight.set(key, job)
      return job as Promise<T>
    },
    stats: () => ({ threads, jobSeconds: options.jobSeconds, running, queued: waiting.length, ...counts }),
    close: () => {
      closing = true
      return piscina.destroy()
    },
  }
}
