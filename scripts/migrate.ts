// Applies the committed Drizzle migrations to DATABASE_URL (npm run db:migrate).
import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import { createDatabase, databaseUrl } from '../server/db/client'

const migrationsFolder = fileURLToPath(new URL('../server/db/migrations', import.meta.url))
const { db, pool } = createDatabase(databaseUrl())
try {
  await migrate(db, { migrationsFolder })
  console.log('[migrate] schema is up to date')
} finally {
  await pool.end()
}
