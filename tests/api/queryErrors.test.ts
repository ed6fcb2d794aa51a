/**
 * The pools skip mysql2's per-query stack capture (server/db/client.ts, trace: false):
 * a failed query must still say which query failed, why, and which code ran it.
 */
import { afterAll, describe, expect, it } from 'vitest'
import { DrizzleQueryError, sql } from 'drizzle-orm'
import { createDatabase } from '../../server/db/client'
import { testDatabaseUrl } from '../support/db'

const { db, pool } = createDatabase(testDatabaseUrl())

afterAll(async () => {
  await pool.end()
})

async function readFromAMissingTable() {
  return await db.execute(sql`SELECT id FROM no_such_table_for_query_errors`)
}

describe('a failed query without mysql2\'s stack capture', () => {
  it('names the SQL, the driver\'s error code and the calling function', async () => {
    const error = await readFromAMissingTable().then(
      () => null,
      (e: unknown) => e as Error & { cause?: { code?: string } },
    )
    expect(error).toBeInstanceOf(DrizzleQueryError)
    expect(error?.message).toContain('no_such_table_for_query_errors')
    expect(error?.cause?.code).toBe('ER_NO_SUCH_TABLE')
    expect(error?.stack).toContain('readFromAMissingTable')
  })
})
