import { execFileSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import mysql from 'mysql2/promise'

const root = fileURLToPath(new URL('../..', import.meta.url))

/** The test MariaDB's URL, as scripts/db.sh gives it (the stack's global setup has started it). */
export function testDatabaseUrl(): string {
  return execFileSync('bash', ['scripts/db.sh', 'url', 'test'], { cwd: root, encoding: 'utf8' }).trim()
}

/** A plain mysql2 connection to the test database, for reading or tampering with rows directly. */
export function connectTestDb(): Promise<mysql.Connection> {
  return mysql.createConnection({ uri: testDatabaseUrl(), timezone: 'Z' })
}
