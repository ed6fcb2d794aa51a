/**
 * The retry wrapper on db.transaction against MariaDB itself: two transactions that take
 * the same two rows in opposite order deadlock (MariaDB aborts one with 1213, as Galera
 * does with a transaction that loses certification); the loser runs again and both commit.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { sql } from 'drizzle-orm'
import { createDatabase } from '../../server/db/client'
import { testDatabaseUrl } from '../support/db'

const { db, pool } = createDatabase(testDatabaseUrl())
const table = sql.raw(`retry_probe_${process.pid}`)

beforeAll(async () => {
  await db.execute(sql`CREATE TABLE ${table} (id INT PRIMARY KEY, n INT NOT NULL) ENGINE=InnoDB`)
  await db.execute(sql`INSERT INTO ${table} VALUES (1, 0), (2, 0)`)
})

afterAll(async () => {
  await db.execute(sql`DROP TABLE IF EXISTS ${table}`)
  await pool.end()
})

describe('db.transaction under a real deadlock', () => {
  it('runs the aborted transaction again, so both increments land', async () => {
    let runs = 0
    let bothHoldFirstRow!: () => void
    const barrier = new Promise<void>((resolve) => (bothHoldFirstRow = resolve))
    let holding = 0
    const incrementBoth = (first: number, second: number) =>
      db.transaction(async (tx) => {
        runs += 1
        await tx.execute(sql`UPDATE ${table} SET n = n + 1 WHERE id = ${first}`)
        // The first run of each waits until the other holds its first row: then the second updates cross.
        if ((holding += 1) === 2) bothHoldFirstRow()
        await Promise.race([barrier, new Promise((resolve) => setTimeout(resolve, 2000))])
        await tx.execute(sql`UPDATE ${table} SET n = n + 1 WHERE id = ${second}`)
      })
    await Promise.all([incrementBoth(1, 2), incrementBoth(2, 1)])
    const [rows] = (await db.execute(sql`SELECT id, n FROM ${table} ORDER BY id`)) as unknown as [{ id: number; n: number }[]]
    expect(rows.map((row) => [row.id, row.n])).toEqual([[1, 2], [2, 2]])
    // Two transactions, one of them run twice after MariaDB chose it as the deadlock victim.
    expect(runs).toBe(3)
  })
})
