// npm run bench:schedule — seeds 5,000 batches over a quarter into a scratch database
// of its own on the dev MariaDB (dropped afterwards), then times the schedule's week
// query and bookings made by 10 concurrent bookers through the real booking code.
import { users } from '../server/db/schema'
import { demoPlanRevisions } from '../server/db/demo/schedule'
import { DEMO_LOAD_PREFIX } from '../server/db/demo/shop'
import { bookBatch } from '../server/schedule/booking'
import { listBatches } from '../server/schedule/batchReads'
import { quantiles } from './bench/quantiles'
import { benchBatch, benchLines, insertBatches, scratchDatabase } from './bench/scratchDatabase'

const BATCHES = 5000
const FURNACES = 8
const BOOKERS = 10
const BOOKINGS_PER_BOOKER = 10
const DAY = 24 * 3600_000

const scratch = await scratchDatabase('bench')
const { db } = scratch

const stats = (samples: number[]) => {
  const { median, p95, max } = quantiles(samples)
  return `median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, max ${max.toFixed(1)} ms`
}

try {
  // The bench books the demo pin and plate.
  const [metallurgist] = (await db.select().from(users)).filter((u) => u.role === 'metallurgist')
  const plans = (await demoPlanRevisions(db)).slice(0, 2)
  const lines = await benchLines(db, FURNACES)

  // A quarter of back-to-back loads per furnace, each line with its own station so nothing overlaps.
  const start = Date.UTC(2031, 0, 5)
  const quarter = 91 * DAY
  const spacing = Math.floor(quarter / (BATCHES / FURNACES))
  const rows = Array.from({ length: BATCHES }, (_, i) =>
    benchBatch(i + 1, plans[i % plans.length]!, lines[i % FURNACES]!, start + Math.floor(i / FURNACES) * spacing))
  const seedStart = performance.now()
  await insertBatches(db, rows)
  console.log(`[bench] seeded ${BATCHES} batches on ${FURNACES} furnaces over 91 days in ${(performance.now() - seedStart).toFixed(0)} ms (scratch database ${scratch.name})`)

  const weekFrom = new Date(start + 42 * DAY)
  const weekTo = new Date(weekFrom.getTime() + 7 * DAY)
  const weekTimes: number[] = []
  let weekCount = 0
  for (let run = 0; run < 30; run++) {
    const t0 = performance.now()
    const week = await listBatches(weekFrom, weekTo, undefined, db)
    weekTimes.push(performance.now() - t0)
    weekCount = week.batches.length
  }
  console.log(`[bench] week query (${weekCount} batches, all furnaces), 30 runs: ${stats(weekTimes)}`)

  // Bookers aim at the same few days after the quarter, so they collide; a refused booking retries at the proposed start.
  const bookingTimes: number[] = []
  let refused = 0
  const target = start + quarter + 2 * DAY
  const t0 = performance.now()
  await Promise.all(
    Array.from({ length: BOOKERS }, async (_, booker) => {
      for (let k = 0; k < BOOKINGS_PER_BOOKER; k++) {
        const line = lines[(booker + k) % FURNACES]!
        let charge = target + k * 3600_000
        for (;;) {
          const t = performance.now()
          try {
            await bookBatch({ planRevisionId: plans[0]!.planRevisionId, ...line, plannedCharge: new Date(charge).toISOString(), partCount: 10, mass_kg: 200, reference: `Booker ${booker}` }, metallurgist!, { loadPrefix: DEMO_LOAD_PREFIX }, db)
            bookingTimes.push(performance.now() - t)
            break
          } catch (error) {
            bookingTimes.push(performance.now() - t)
            const next = (error as { data?: { nextFreeStart?: string } }).data?.nextFreeStart
            if (!next) throw error
            refused += 1
            charge = Date.parse(next)
          }
        }
      }
    }),
  )
  const total = performance.now() - t0
  console.log(`[bench] ${BOOKERS} concurrent bookers, ${BOOKERS * BOOKINGS_PER_BOOKER} bookings (${refused} refused with a proposal and retried) in ${total.toFixed(0)} ms: per request ${stats(bookingTimes)}`)
} finally {
  await scratch.drop()
}
