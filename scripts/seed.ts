// Seeds the demo shop into DATABASE_URL, each table only when it is empty (npm run db:seed).
// With NUXT_RECORD_SEAL_KEY set (npm start and npm test set it) the loads already
// released get their sealed cooldown records too, under the demo shop's name and linked
// at NUXT_SITE_ORIGIN (else AUTH_ORIGIN without /api/auth), as the server would.
import { createDatabase, databaseUrl } from '../server/db/client'
import { seedDemoData } from '../server/db/demo/seed'
import { seedDemoSchedule } from '../server/db/demo/schedule'
import { DEMO_SHOP_NAME } from '../server/db/demo/shop'
import { isSealKey } from '../server/records/canonical'
import { publicOriginOf } from '../server/records/config'

const { db, pool } = createDatabase(databaseUrl())
try {
  const seeded = await seedDemoData(db)
  const parts = Object.entries(seeded).filter(([, total]) => total > 0).map(([table, total]) => `${total} ${table}`)
  console.log(parts.length ? `[seed] demo shop: added ${parts.join(', ')}` : '[seed] every demo table has rows already; left alone')
  const key = process.env.NUXT_RECORD_SEAL_KEY
  const publicOrigin = publicOriginOf(process.env.NUXT_SITE_ORIGIN, process.env.AUTH_ORIGIN)
  const recordConfig = isSealKey(key) ? { sealKey: key, shopName: DEMO_SHOP_NAME, publicOrigin } : null
  const schedule = await seedDemoSchedule(db, recordConfig)
  if (schedule) {
    console.log(`[seed] demo furnaces, quench stations and ${schedule.loads} loads over two days created, ${schedule.records} released loads with their cooldown records`)
    if (!isSealKey(key)) console.log('[seed] NUXT_RECORD_SEAL_KEY is not set: released demo loads have no records')
  }
} finally {
  await pool.end()
}
