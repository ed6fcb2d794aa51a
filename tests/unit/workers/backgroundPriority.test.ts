import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { Worker } from 'node:worker_threads'
import { describe, expect, it } from 'vitest'
import { BACKGROUND_NICE } from '../../../server/workers/backgroundPriority'

/**
 * The nice value of the calling thread: field 19 of /proc/thread-self/stat (proc(5));
 * the command name in field 2 sits in parentheses and may hold spaces, so count after it.
 */
const threadNice = (): number => Number(readFileSync('/proc/thread-self/stat', 'utf8').split(') ')[1]!.split(' ')[16])

/** Loads a TypeScript worker entry in a fresh worker thread (tsx) and reports that thread's nice value. */
async function niceAfterLoading(entry: string): Promise<number> {
  const path = fileURLToPath(new URL(entry, import.meta.url))
  const code = `
    const { parentPort } = require('node:worker_threads')
    const { readFileSync } = require('node:fs')
    import('tsx/esm/api')
      .then(({ register }) => { register(); return import(${JSON.stringify(path)}) })
      .catch(() => undefined) // the fit entry fits its workerData at load and refuses an empty one: only the priority matters here
      .then(() => parentPort.postMessage(Number(readFileSync('/proc/thread-self/stat', 'utf8').split(') ')[1].split(' ')[16])))`
  const worker = new Worker(code, { eval: true, workerData: {} })
  try {
    return await new Promise<number>((resolve, reject) => {
      worker.on('message', (message) => typeof message === 'number' && resolve(message))
      worker.on('error', reject)
    })
  } finally {
    await worker.terminate()
  }
}

describe('engine threads run in the background', () => {
  // nice(1), GNU coreutils: "-n, --adjustment=N  add integer N to the niceness (default 10)"; setpriority(2) accepts -20..19.
  it('lowers by what nice(1) adds by default', () => {
    expect(BACKGROUND_NICE).toBe(10)
  })

  it('the engine worker entry lowers its own thread and leaves the calling thread at its priority', async () => {
    const before = threadNice()
    expect(await niceAfterLoading('../../../server/workers/engineWorker.ts')).toBe(BACKGROUND_NICE)
    expect(threadNice()).toBe(before)
  })

  it('so does the calibration fit entry', async () => {
    const before = threadNice()
    expect(await niceAfterLoading('../../../server/workers/fitWorker.ts')).toBe(BACKGROUND_NICE)
    expect(threadNice()).toBe(before)
  })
})
