// npm run bench:schedule — seeds 5,000 batches over a quarter into a scratch database
// of its own on the dev MariaDB (dropped afterwards), then times the schedule's week
// query and bookings made by 10 concurrent bookers through the real booking code.
import { execFileSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import { createDatabase } from '../server/db/client'
import { batches, furnaceStations, furnaces, quenchStations, users } from '../server/db/schema'
import { seedDemoData } from '../server/db/demo/seed'
import { demoPlanRevisions } from '../server/db/demo/schedule'
import { bookBatch, listBatches } from '../server/utils/batches'
import { DEFAULT_SHOP_SETTINGS, deriveSlots, loadNumber, slotDurations } from '../shared/schedule'

const root = fileURLToPath(new URL('..', import.meta.url))
const BATCHES = 5000
const FURNACES = 8
const BOOKERS = 10
const BOOKINGS_PER_BOOKER = 10
const DAY = 24 * 3600_000

const sh = (args: string[]) => execFileSync('bash', args, { cwd: root, encoding: 'utf8' }).trim()
sh(['scripts/db.sh', 'start', 'dev'])
const scratch = `slakewise_bench_${process.pid}`
const rootSql = (statement: string) => execFileSync('mariadb', ['--no-defaults', `--socket=${root}.data/dev.sock`, '-u', 'root', '-e', statement], { env: { ...process.env, PATH: `${process.env.PATH}:/usr/sbin:/usr/bin` } })
rootSql(`CREATE DATABASE \`${scratch}\`; GRANT ALL PRIVILEGES ON \`${scratch}\`.* TO 'slakewise'@'127.0.0.1';`)
const url = sh(['scripts/db.sh', 'url', 'dev']).replace(/\/slakewise$/, `/${scratch}`)
const { db, pool } = createDatabase(url)

const stats = (samples: number[]) => {
  const sorted = [...samples].sort((a, b) => a - b)
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!
  return `median ${at(0.5).toFixed(1)} ms, p95 ${at(0.95).toFixed(1)} ms, max ${sorted.at(-1)!.toFixed(1)} ms`
}

try {
  await migrate(db, { migrationsFolder: `${root}server/db/migrations` })
  // Demo people, library and plans (created by the planner's service); the bench books the pin and the plate.
  await seedDemoData(db)
  const [metallurgist] = (await db.select().from(users)).filter((u) => u.role === 'metallurgist')
  const plans = (await demoPlanRevisions(db)).slice(0, 2)
  const lines: { furnaceId: number; stationId: number }[] = []
  for (let i = 0; i < FURNACES; i++) {
    const [{ id: furnaceId }] = await db.insert(furnaces).values({ name: `Bench furnace ${i + 1}`, kind: 'box', maxTemp_C: 1100, capacity_kg: 2000, zoneWidth_mm: 900, zoneDepth_mm: 900, zoneHeight_mm: 900 }).$returningId()
    const [{ id: stationId }] = await db.insert(quenchStations).values({ name: `Bench tank ${i + 1}`, kind: 'oil', maxTemp_C: 90, capacity_kg: 2000 }).$returningId()
    await db.insert(furnaceStations).values({ furnaceId, stationId })
    lines.push({ furnaceId, stationId })
  }

  // A quarter of back-to-back loads per furnace, each line with its own station so nothing overlaps.
  const start = Date.UTC(2031, 0, 5)
  const quarter = 91 * DAY
  const perFurnace = BATCHES / FURNACES
  const spacing = Math.floor(quarter / perFurnace)
  const rows = []
  for (let i = 0; i < BATCHES; i++) {
    const line = lines[i % FURNACES]!
    const plan = plans[i % plans.length]!
    const d = slotDurations(plan.summary, DEFAULT_SHOP_SETTINGS)
    const charge = start + Math.floor(i / FURNACES) * spacing
    const slots = deriveSlots(charge, d)
    rows.push({
      loadNumber: loadNumber('BN', 2031, i + 1), planRevisionId: plan.planRevisionId, ...line, partCount: 20, mass_kg: 400, reference: `Bench ${i}`,
      plannedCharge: new Date(charge), furnace_s: d.furnace_s, furnaceIsDefault: d.furnaceIsDefault, minimumSoak_s: d.minimumSoak_s, transfer_s: d.transfer_s,
      quench_s: d.quench_s, quenchToHandling_s: d.quenchToHandling_s, quenchDelayAllowance_s: DEFAULT_SHOP_SETTINGS.quenchDelayAllowance_s,
      furnaceStart: new Date(slots.furnaceStart), furnaceEnd: new Date(slots.furnaceEnd), quenchStart: new Date(slots.quenchStart), quenchEnd: new Date(slots.quenchEnd), handlingAt: new Date(slots.handlingAt),
    })
  }
  const seedStart = performance.now()
  for (let i = 0; i < rows.length; i += 500) await db.insert(batches).values(rows.slice(i, i + 500))
  console.log(`[bench] seeded ${BATCHES} batches on ${FURNACES} furnaces over 91 days in ${(performance.now() - seedStart).toFixed(0)} ms (scratch database ${scratch})`)

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
            await bookBatch({ planRevisionId: plans[0]!.planRevisionId, ...line, plannedCharge: new Date(charge).toISOString(), partCount: 10, mass_kg: 200, reference: `Booker ${booker}` }, metallurgist!, db)
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
  await pool.end()
  rootSql(`DROP DATABASE IF EXISTS \`${scratch}\`;`)
  console.log(`[bench] scratch database ${scratch} dropped`)
}
