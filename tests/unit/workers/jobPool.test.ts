import { afterEach, describe, expect, it } from 'vitest'
import { JobPoolClosedError, JobQueueFullError, JobTimeoutError, createJobPool, defaultThreadCount, type JobPool } from '../../../server/workers/jobPool'
import { availableParallelism } from 'node:os'

const worker = new URL('../../fixtures/workers/slowWorker.mjs', import.meta.url).href
let pool: JobPool | undefined
afterEach(async () => {
  await pool?.close()
  pool = undefined
})

interface Spun {
  value: number
  threadId: number
}

describe('job pool', () => {
  it('sizes itself to one thread per core but one, and never below one', () => {
    expect(defaultThreadCount()).toBe(Math.max(1, availableParallelism() - 1))
  })

  it('refuses to start without its worker entry, naming the file', () => {
    expect(() => createJobPool({ filename: new URL('../../fixtures/workers/missing.mjs', import.meta.url).href, jobSeconds: 1 })).toThrow(/Worker entry not found: .*missing\.mjs/)
  })

  it('runs a job in a worker thread, not on the calling thread', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 5 })
    const answer = await pool.run<Spun>('spin', { ms: 1, value: 7 })
    expect(answer.value).toBe(7)
    expect(answer.threadId).toBeGreaterThan(0)
    expect(pool.stats()).toMatchObject({ threads: 1, started: 1, shared: 0, timedOut: 0, running: 0, queued: 0 })
  })

  it('stops a job over its cap with JobTimeoutError naming the limit, and keeps serving', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 1 })
    const started = Date.now()
    const error = await pool.run('spin', { ms: 10_000, value: 1 }).catch((e: unknown) => e)
    expect(error).toBeInstanceOf(JobTimeoutError)
    expect((error as JobTimeoutError).limit_s).toBe(1)
    expect((error as Error).message).toContain('1 s limit')
    // Answered at the cap, not after the 10 s loop.
    expect(Date.now() - started).toBeLessThan(4000)
    // The terminated thread is replaced: the next job runs.
    expect((await pool.run<Spun>('spin', { ms: 1, value: 2 })).value).toBe(2)
    expect(pool.stats().timedOut).toBe(1)
  })

  it('times a job from when it starts running, not while it waits for the thread', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 1.5 })
    await pool.run('spin', { ms: 1, value: 0 }) // the thread is up before the clock matters
    // Each takes 0.5 s; the fourth waits 1.5 s in the queue, as long as the cap, and still finishes.
    const answers = await Promise.all([1, 2, 3, 4].map((value) => pool!.run<Spun>('spin', { ms: 500, value })))
    expect(answers.map((a) => a.value)).toEqual([1, 2, 3, 4])
    expect(pool.stats().timedOut).toBe(0)
  })

  it('shares one run between identical concurrent jobs', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 5 })
    const [a, b] = await Promise.all([pool.run<Spun>('spin', { ms: 200, value: 3 }), pool.run<Spun>('spin', { ms: 200, value: 3 })])
    expect(a).toEqual(b)
    expect(pool.stats()).toMatchObject({ started: 1, shared: 1 })
    // Once finished, the same input runs again (nothing is cached after the job ends).
    await pool.run('spin', { ms: 1, value: 3 })
    expect(pool.stats().started).toBe(2)
  })

  it('runs different inputs as separate jobs', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 5 })
    await Promise.all([pool.run('spin', { ms: 50, value: 4 }), pool.run('spin', { ms: 50, value: 5 })])
    expect(pool.stats()).toMatchObject({ started: 2, shared: 0 })
  })

  it('refuses new jobs when the queue is full', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 5, maxQueue: 1 })
    const first = pool.run('spin', { ms: 300, value: 1 })
    const second = pool.run('spin', { ms: 1, value: 2 })
    await expect(pool.run('spin', { ms: 1, value: 3 })).rejects.toBeInstanceOf(JobQueueFullError)
    await Promise.all([first, second])
  })

  it('closing, answers the running and waiting jobs and any new one with JobPoolClosedError', async () => {
    const closing = createJobPool({ filename: worker, threads: 1, jobSeconds: 5 })
    await closing.run('spin', { ms: 1, value: 0 })
    const running = closing.run('spin', { ms: 2000, value: 1 }).catch((e: unknown) => e)
    const waiting = closing.run('spin', { ms: 1, value: 2 }).catch((e: unknown) => e)
    await new Promise((resolve) => setTimeout(resolve, 100))
    await closing.close()
    expect(await running).toBeInstanceOf(JobPoolClosedError)
    expect(await waiting).toBeInstanceOf(JobPoolClosedError)
    await expect(closing.run('spin', { ms: 1, value: 3 })).rejects.toBeInstanceOf(JobPoolClosedError)
  })

  it('passes a job\'s own error through', async () => {
    pool = createJobPool({ filename: worker, threads: 1, jobSeconds: 5 })
    await expect(pool.run('fail', { message: 'no such case' })).rejects.toThrow('no such case')
  })
})
