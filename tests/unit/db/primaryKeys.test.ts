import { describe, expect, it } from 'vitest'
import { is } from 'drizzle-orm'
import { MySqlTable, getTableConfig } from 'drizzle-orm/mysql-core'
import * as schema from '../../../server/db/schema'

// Galera replicates row changes by primary key; a table without one cannot be replicated safely
// (MariaDB's Galera documentation: "all tables should have a primary key").
const tables = Object.values(schema).filter((value) => is(value, MySqlTable)).map((table) => getTableConfig(table))

describe('schema for a Galera cluster', () => {
  it('has the tables it should', () => {
    expect(tables.length).toBeGreaterThanOrEqual(15)
  })

  it.each(tables.map((config) => [config.name, config] as const))('%s has a primary key', (_name, config) => {
    const hasKey = config.primaryKeys.length > 0 || config.columns.some((column) => column.primary)
    expect(hasKey).toBe(true)
  })
})
