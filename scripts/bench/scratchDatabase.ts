// A scratch database for a benchmark: created on the dev MariaDB (started if needed),
// migrated and seeded with the demo people, library and plans; drop() removes it.
import { execFileSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import { createDatabase } from '../../server/db/client'
import { seedDemoData } from '../../server/db/demo/seed'
import { batches, furnaceStations, furnaces, quenchStations } from '../../server/db/schema'
import type { DemoPlanRevision } from '../../server/db/demo/schedule'
import { DEFAULT_SHOP_SETTINGS, deriveSlots, loadNumber, slotDurations } from '../../shared/schedule'

export const root = fileURLToPath(new URL('../..', import.meta.url))

export const sh = (args: string[], env: NodeJS.ProcessEnv = process.env) => execFileSync('bash', args, { cwd: root, encoding: 'utf8', env }).trim()

export async function scratchDatabase(tag: string) {
  sh(['scripts/db.sh', 'start', 'dev'])
  const name = `slakewise_${tag}_${process.pid}`
  const rootSql = (statement: string) =>
    execFileSync('mariadb', ['--no-defaults', `--socket=${root}.data/dev.sock`, '-u', 'root', '-e', statement], { env: { ...process.env, PATH: `${process.env.PATH}:/usr/sbin:/usr/bin` } })
  rootSql(`CREATE DATABASE \`${name}\`; GRANT ALL PRIVILEGES ON \`${name}\`.* TO 'slakewise'@'127.0.0.1';`)
  const url = sh(['scripts/db.sh', 'url', 'dev']).replace(/\/slakewise$/, `/${name}`)
  const { db, pool } = createDatabase(url)
  const drop = async () => {
    await pool.end()
    rootSql(`DROP DATABASE IF EXISTS \`${name}\`;`)
    console.log(`[bench] scratch database ${name} dropped`)
  }
  try {
    await migrate(db, { migrationsFolder: `${root}server/db/migrations` })
    await seedDemoData(db)
  } catch (error) {
    await drop()
    throw error
  }
  return { name, url, db, drop }
}

export type ScratchDatabase = Awaited<ReturnType<typeof scratchDatabase>>

/** `count` furnaces, each with a quench station of its own, so loads on different lines never collide. */
export async function benchLines(db: ScratchDatabase['db'], count: number): Promise<{ furnaceId: number; stationId: number }[]> {
  const lines = []
  for (let i = 0; i < count; i++) {
    const [{ id: furnaceId }] = await db.insert(furnaces).values({ name: `Bench furnace ${i + 1}`, kind: 'box', maxTemp_C: 1100, capacity_kg: 2000, zoneWidth_mm: 900, zoneDepth_mm: 900, zoneHeight_mm: 900 }).$returningId()
    const [{ id: stationId }] = await db.insert(quenchStations).values({ name: `Bench tank ${i + 1}`, kind: 'oil', maxTemp_C: 90, capacity_kg: 2000 }).$returningId()
    await db.insert(furnaceStations).values({ furnaceId, stationId })
    lines.push({ furnaceId, stationId })
  }
  return lines
}

/** A batch row as a booking of `plan` at `charge` would write it (slots from the plan summary, the shop's default settings). */
export function benchBatch(sequence: number, plan: DemoPlanRevision, line: { furnaceId: number; stationId: number }, charge: number) {
  const d = slotDurations(plan.summary, DEFAULT_SHOP_SETTINGS)
  const slots = deriveSlots(charge, d)
  return {
    loadNumber: loadNumber('BN', new Date(charge).getUTCFullYear(), sequence), planRevisionId: plan.planRevisionId, ...line, partCount: 20, mass_kg: 400, reference: `Bench ${sequence}`,
    plannedCharge: new Date(charge), furnace_s: d.furnace_s, furnaceIsDefault: d.furnaceIsDefault, minimumSoak_s: d.minimumSoak_s, transfer_s: d.transfer_s,
    quench_s: d.quench_s, quenchToHandling_s: d.quenchToHandling_s, quenchDelayAllowance_s: DEFAULT_SHOP_SETTINGS.quenchDelayAllowance_s,
    furnaceStart: new Date(slots.furnaceStart),
    furnaceEnd: new Date(slots.furnaceEnd),
    quenchStart: new Date(slots.quenchStart),
    quenchEnd: new Date(slots.quenchEnd),
    handlingAt: new Date(slots.handlingAt),
  }
}

/** Inserts rows in chunks of 500. */
export async function insertBatches(db: ScratchDatabase['db'], rows: ReturnType<typeof benchBatch>[]): Promise<void> {
  for (let i = 0; i < rows.length; i += 500) await db.insert(batches).values(rows.slice(i, i + 500))
}
