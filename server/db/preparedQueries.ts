import type { Database } from './client'

/**
 * A query built once per database handle and then only run. Drizzle turns its query tree
 * into SQL text on every call, 60–190 µs for the reads behind a floor poll (more than the
 * database takes to answer them); a prepared query keeps the text and fills in its
 * placeholders (`sql.placeholder`). Keyed by handle so a second database (tests, benches,
 * scripts) gets its own.
 */
export function preparedPerDatabase<Query>(build: (db: Database) => Query): (db: Database) => Query {
  const built = new WeakMap<Database, Query>()
  return (db) => {
    let query = built.get(db)
    if (!query) {
      query = build(db)
      built.set(db, query)
    }
    return query
  }
}
