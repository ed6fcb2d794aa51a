import { execFileSync } from 'node:child_process'
import mysql from 'mysql2/promise'

/**
 * Library rows for planner tests, inserted straight into the test database (the
 * library API is built on another branch). Names carry a suffix so runs never collide.
 */
export interface LibraryFixture {
  steelId: number
  oilId: number
  oil25Id: number
  airId: number
  values: {
    steel: { k: number; rho: number; cp: number }
    oil: { hLow: number; h: number; hHigh: number; bath_C: number }
    air: { hLow: number; h: number; hHigh: number; bath_C: number }
  }
}

export function testDatabaseUrl(): string {
  return execFileSync('bash', ['scripts/db.sh', 'url', 'test'], { encoding: 'utf8' }).trim()
}

export async function withTestDb<T>(run: (db: mysql.Connection) => Promise<T>): Promise<T> {
  const db = await mysql.createConnection({ uri: testDatabaseUrl(), timezone: 'Z' })
  try {
    return await run(db)
  } finally {
    await db.end()
  }
}

// Steel values: a medium-carbon steel near 500 °C, rounded; the coefficients are typical
// shop ranges for a moderately agitated quench oil and for still air.
const VALUES: LibraryFixture['values'] = {
  steel: { k: 40, rho: 7850, cp: 475 },
  oil: { hLow: 500, h: 800, hHigh: 1200, bath_C: 60 },
  air: { hLow: 10, h: 15, hHigh: 25, bath_C: 25 },
}

export async function createLibraryFixture(): Promise<LibraryFixture> {
  const suffix = `${Date.now()}-${Math.floor(Math.random() * 1e6)}`
  return await withTestDb(async (db) => {
    const material = await db.execute<mysql.ResultSetHeader>(
      'INSERT INTO materials (name, k_w_mk, density_kg_m3, specific_heat_j_kgk, source) VALUES (?, ?, ?, ?, ?)',
      [`Test steel ${suffix}`, VALUES.steel.k, VALUES.steel.rho, VALUES.steel.cp, 'planner test fixture'],
    )
    const quenchant = async (name: string, kind: string, q: LibraryFixture['values']['oil']) =>
      (
        await db.execute<mysql.ResultSetHeader>(
          'INSERT INTO quenchants (name, kind, h_typical_w_m2k, h_low_w_m2k, h_high_w_m2k, bath_c, source) VALUES (?, ?, ?, ?, ?, ?, ?)',
          [`${name} ${suffix}`, kind, q.h, q.hLow, q.hHigh, q.bath_C, 'planner test fixture'],
        )
      )[0].insertId
    return {
      steelId: material[0].insertId,
      oilId: await quenchant('Test oil', 'oil', VALUES.oil),
      oil25Id: await quenchant('Test cold oil', 'oil', { ...VALUES.oil, bath_C: 25 }),
      airId: await quenchant('Test still air', 'still-air', VALUES.air),
      values: VALUES,
    }
  })
}
