import { createDatabase, type Database } from '../db/client'
import * as tables from '../db/schema'

let instance: ReturnType<typeof createDatabase> | undefined

/** The one database entry point of the server: a lazily created pool shared by all requests. */
export function useDb(): Database {
  instance ??= createDatabase()
  return instance.db
}

export { tables }
