/**
 * Two server instances on one database, as `SLAKEWISE_INSTANCES=2 npm start` runs them
 * behind a proxy without sticky sessions: a second built server joins the stack's on
 * another port. What must happen once happens once across them.
 */
import type { ChildProcess } from 'node:child_process'
import { once } from 'node:events'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { like } from 'drizzle-orm'
import { createDatabase } from '../../server/db/client'
import { outboxMessages } from '../../server/db/schema'
import { enqueueMail } from '../../server/outbox/enqueue'
import { testDatabaseUrl } from '../support/db'
import { sameSessionAt, signInDemo, type Client } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { caughtMail, waitForMail } from '../support/mailCatcher'
import { pinSpec, savePlan, type SavedPlan } from '../support/plans'
import { pause } from '../support/poll'
import { booking, createLine } from '../support/schedule'
import { startServer } from '../support/server'
import { SECOND_APP_PORT } from '../support/stackConfig'

const database = createDatabase(testDatabaseUrl())
let second: ChildProcess
let admin: Client
let metallurgist: Client
let metallurgistOnSecond: Client
let pin: SavedPlan

beforeAll(async () => {
  second = await startServer(testDatabaseUrl(), SECOND_APP_PORT)
  ;[admin, metallurgist] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist')])
  metallurgistOnSecond = sameSessionAt(metallurgist, `http://127.0.0.1:${SECOND_APP_PORT}`)
  pin = await savePlan(metallurgist, pinSpec(await createLibraryFixture(metallurgist)))
}, 90_000)

afterAll(async () => {
  await database.pool.end()
  if (second && second.exitCode === null) {
    second.kill('SIGTERM')
    await once(second, 'exit')
  }
})

describe('two instances on one database', () => {
  it('the second instance honours a session signed in on the first', async () => {
    const me = await metallurgistOnSecond.request('/api/auth/session')
    expect(me.status).toBe(200)
    expect(me.body.user.role).toBe('metallurgist')
  })

  it('20 concurrent conflicting bookings split across both: exactly one wins, the rest name it', async () => {
    const line = await createLine(admin)
    const charge = Date.UTC(2033, 5, 1) + Math.floor(Math.random() * 1000) * 24 * 3600_000
    const results = await Promise.all(
      Array.from({ length: 20 }, (_, i) => (i % 2 ? metallurgistOnSecond : metallurgist).request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge + i * 60_000, `Two instances ${i}`) })),
    )
    const winners = results.filter((r) => r.status === 201)
    const losers = results.filter((r) => r.status === 409)
    expect(winners).toHaveLength(1)
    expect(losers).toHaveLength(19)
    for (const loser of losers) expect(loser.body.data.collidesWith.loadNumber).toBe(winners[0]!.body.loadNumber)
  })

  it('30 queued messages with both outbox workers running: each delivered exactly once', { timeout: 30_000 }, async () => {
    const run = `instances-${Date.now()}`
    await database.db.transaction(async (tx) => {
      for (let n = 0; n < 30; n += 1) await enqueueMail(tx, { dedupeKey: `${run}-${n}`, to: ['instances@kestrelbay.example'], subject: `${run} #${n}`, html: '<p>two workers</p>', text: 'two workers' })
    })
    await waitForMail((mail) => mail.subject.startsWith(run), 30)
    // Both workers poll every 0.3 s: a second copy would have arrived by now.
    await pause(1500)
    const subjects = (await caughtMail()).filter((mail) => mail.subject.startsWith(run)).map((mail) => mail.subject)
    expect(subjects).toHaveLength(30)
    expect(new Set(subjects).size).toBe(30)
    const rows = await database.db.select({ status: outboxMessages.status, attempts: outboxMessages.attempts }).from(outboxMessages).where(like(outboxMessages.dedupeKey, `${run}-%`))
    expect(rows.map((row) => `${row.status}/${row.attempts}`)).toEqual(Array(30).fill('sent/1'))
  })
})
