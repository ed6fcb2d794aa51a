import { engineWorkerUrl } from '#engine-worker'
import { useWorkerPool } from '../planning/planEngine'
import { createJobPool, type JobPool } from '../workers/jobPool'

/**
 * Moves plan computations onto worker threads for this server process, so a graded
 * solve of a quarter second never delays the floor's poll. NUXT_ENGINE_WORKERS sets
 * the thread count (0: one per core but one), NUXT_ENGINE_JOB_SECONDS the cap of one job.
 */
export default defineNitroPlugin((nitro) => {
  const config = useRuntimeConfig()
  let pool: JobPool | undefined
  // Plugins run while the server's modules load, before the entry knows its own URL,
  // which the worker's URL is resolved against: start the pool on the next turn.
  setImmediate(() => {
    pool = createJobPool({ filename: engineWorkerUrl(), threads: Number(config.engineWorkers), jobSeconds: Number(config.engineJobSeconds) })
    useWorkerPool(pool)
  })
  nitro.hooks.hook('close', () => pool?.close())
})
