import { execFileSync } from 'node:child_process'
import { describe, expect, it } from 'vitest'
import { anonymous } from '../support/http'
import pkg from '../../package.json' with { type: 'json' }

const db = (command: 'start' | 'stop') => execFileSync('bash', ['scripts/db.sh', command, 'test'], { stdio: 'ignore' })

describe('/api/health', () => {
  it('is 200 with the app version while MariaDB runs, 503 with a clear message when it is down', async () => {
    const up = await anonymous().request('/api/health')
    expect(up).toEqual({ status: 200, body: { status: 'ok', database: 'reachable', version: pkg.version, engine: expect.objectContaining({ mode: 'worker' }) } })

    db('stop')
    try {
      const down = await anonymous().request('/api/health')
      expect(down.status).toBe(503)
      expect(down.body.database).toBe('unreachable')
      expect(down.body.message).toMatch(/MariaDB/)
    } finally {
      db('start')
    }
    const again = await anonymous().request('/api/health')
    expect(again.status).toBe(200)
  })
})
