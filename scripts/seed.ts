// Seeds the demo shop into DATABASE_URL, each table only when it is empty (npm run db:seed).
import { createDatabase, databaseUrl } from '../server/db/client'
import { seedDemoData } from '../server/db/demo/seed'
import { seedDemoSchedule } from '../server/db/demo/schedule'

const { db, pool } = createDatabase(databaseUrl())
try {
  const seeded = await seedDemoData(db)
  const parts = Object.entries(seeded).filter(([, total]) => total > 0).map(([table, total]) => `${total} ${table}`)
  console.log(parts.length ? `[seed] demo shop: added ${parts.join(', ')}` : '[seed] every demo table has rows already; left alone')
  if (await seedDemoSchedule(db)) console.log('[seed] demo furnaces, quench stations and two days of loads created')
} finally {
  await pool.end()
}
