import { sql } from 'drizzle-orm'
import { planEngine } from '../planning/planEngine'

// Open to everyone (no sign-in): monitoring and the start scripts poll it.
export default defineEventHandler(async (event) => {
  const version = useRuntimeConfig().public.appVersion
  // Where plan computations run and how busy that is: the tests and bench:api read it.
  const engine = planEngine().stats()
  try {
    await useDb().execute(sql`SELECT 1`)
    return { status: 'ok', database: 'reachable', version, engine }
  } catch {
    setResponseStatus(event, 503, 'Database unreachable')
    return { status: 'degraded', database: 'unreachable', message: 'The database (MariaDB) is not answering. Check that it is running.', version, engine }
  }
})
