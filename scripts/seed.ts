// Seeds the demo shop into DATABASE_URL when it has no users yet (npm run db:seed).
import { createDatabase, databaseUrl } from '../server/db/client'
import { seedDemoData } from '../server/db/demo/seed'

const { db, pool } = createDatabase(databaseUrl())
try {
  const seeded = await seedDemoData(db)
  console.log(seeded ? '[seed] demo shop created' : '[seed] users exist already; demo data left alone')
} finally {
  await pool.end()
}
