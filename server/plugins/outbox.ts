import { outboxConfigFromEnv, createMailTransport } from '../outbox/config'
import { runOutboxOnce } from '../outbox/worker'
import { queueDailyDigest } from '../records/service'

/**
 * Runs the outbox worker in every server process (several may run side by side; the
 * claim in server/outbox/worker.ts keeps them from sending the same row). Ticks are
 * chained, never overlapping; a full batch is followed at once by the next, so a
 * backlog drains quickly after an outage. OUTBOX_WORKER=off disables it, e.g. for a
 * process that should only serve pages.
 *
 * The same loop queues the daily digest of unsigned records on its first pass of each
 * UTC day; the digest's dedupe key is the date, so several processes queue it once.
 */
export default defineNitroPlugin((nitro) => {
  if (process.env.OUTBOX_WORKER === 'off') return
  const config = outboxConfigFromEnv()
  const transport = createMailTransport(config.smtpUrl)
  const batchSize = 20
  let timer: ReturnType<typeof setTimeout> | undefined
  let stopped = false
  let lastProblem = ''
  let digestDay = ''

  async function tick() {
    let again = false
    try {
      const result = await runOutboxOnce({ db: useDb(), transport, from: config.from, schedule: config.schedule, leaseMs: config.leaseMs, batchSize })
      again = result.claimed === batchSize
      const today = new Date().toISOString().slice(0, 10)
      if (today !== digestDay) {
        await queueDailyDigest(useDb(), new Date(), useShopConfig())
        digestDay = today
      }
      lastProblem = ''
    } catch (error) {
      // The database is away (the rows are safe in it); say so once per distinct problem, not every tick.
      const problem = String((error as Error)?.message ?? error)
      if (problem !== lastProblem) console.error(`[outbox] worker pass failed, will retry: ${problem}`)
      lastProblem = problem
    }
    if (!stopped) timer = setTimeout(tick, again ? 0 : config.pollMs)
  }

  timer = setTimeout(tick, config.pollMs)
  nitro.hooks.hook('close', () => {
    stopped = true
    clearTimeout(timer)
    transport.close()
  })
})
