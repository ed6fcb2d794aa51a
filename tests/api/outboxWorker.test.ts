/**
 * Several workers on one outbox: two workers in this process (each with its own pool,
 * like two server processes) race the running server's worker over the same rows. The
 * claim must hand every row to exactly one of them.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inArray, like } from 'drizzle-orm'
import { createDatabase } from '../../server/db/client'
import { outboxMessages } from '../../server/db/schema'
import { enqueueMail } from '../../server/outbox/enqueue'
import { runOutboxOnce } from '../../server/outbox/worker'
import { testDatabaseUrl } from '../support/db'
import { caughtMail, waitForMail } from '../support/mailCatcher'

const a = createDatabase(testDatabaseUrl())
const b = createDatabase(testDatabaseUrl())
const schedule = { baseMs: 300, maxMs: 1500, maxAttempts: 10 }

afterAll(async () => {
  await a.pool.end()
  await b.pool.end()
})

function countingTransport(log: string[]) {
  return {
    async sendMail(message: { subject?: string }) {
      // A slow server widens the window in which a second worker could grab the same row.
      await new Promise((resolve) => setTimeout(resolve, 5))
      log.push(message.subject!)
      // What an SMTP server reports for an accepted message (the worker does not read it).
      return { envelope: { from: 'test@slakewise.localhost', to: [] }, messageId: `<${log.length}@test>`, accepted: [], rejected: [], pending: [], response: '250 Accepted' }
    },
  }
}

describe('concurrent workers', () => {
  const run = `race-${Date.now()}`
  let ids: number[] = []

  beforeAll(async () => {
    ids = await a.db.transaction(async (tx) => {
      const created: number[] = []
      for (let n = 0; n < 40; n += 1) {
        const { id } = await enqueueMail(tx, { dedupeKey: `${run}-${n}`, to: ['race@kestrelbay.example'], subject: `${run} #${n}`, html: '<p>race</p>', text: 'race' })
        created.push(id)
      }
      return created
    })
  })

  it('send each of 40 rows exactly once between them and the server', { timeout: 60_000 }, async () => {
    const sentByA: string[] = []
    const sentByB: string[] = []
    const drain = async (db: typeof a.db, log: string[]) => {
      for (let pass = 0; pass < 20; pass += 1) {
        await runOutboxOnce({ db, transport: countingTransport(log), from: 'test@slakewise.localhost', schedule, batchSize: 5 })
      }
    }
    await Promise.all([drain(a.db, sentByA), drain(b.db, sentByB)])

    // The server may still be sending the rows it claimed.
    let rows = await a.db.select().from(outboxMessages).where(inArray(outboxMessages.id, ids))
    for (let wait = 0; wait < 100 && rows.some((row) => row.status !== 'sent'); wait += 1) {
      await new Promise((resolve) => setTimeout(resolve, 200))
      rows = await a.db.select().from(outboxMessages).where(inArray(outboxMessages.id, ids))
    }
    expect(rows.map((row) => row.status)).toEqual(Array(40).fill('sent'))
    expect(rows.every((row) => row.attempts === 1)).toBe(true)

    await waitForMail((mail) => mail.subject.startsWith(run), 40 - sentByA.length - sentByB.length)
    const byServer = (await caughtMail()).filter((mail) => mail.subject.startsWith(run)).map((mail) => mail.subject)
    const all = [...sentByA, ...sentByB, ...byServer].sort()
    expect(all).toEqual(Array.from({ length: 40 }, (_, n) => `${run} #${n}`).sort())
    // All three took part, or the race proved little.
    expect(sentByA.length).toBeGreaterThan(0)
    expect(sentByB.length).toBeGreaterThan(0)
  })

  it('a row left "sending" by a worker that died is sent again once its lease runs out', async () => {
    const { id } = await enqueueMail(a.db, { dedupeKey: `${run}-orphan`, to: ['orphan@kestrelbay.example'], subject: `${run} orphan`, html: '<p>o</p>', text: 'o' })
    // What a crash after the claim leaves behind: sending, a claim token, a lease that has expired.
    await a.db.update(outboxMessages).set({ status: 'sending', claimToken: 'dead-worker', attempts: 1, nextAttemptAt: new Date(Date.now() - 1000) }).where(inArray(outboxMessages.id, [id]))
    await waitForMail((mail) => mail.subject === `${run} orphan`, 1)
    const [row] = await a.db.select().from(outboxMessages).where(like(outboxMessages.dedupeKey, `${run}-orphan`))
    expect(row).toMatchObject({ status: 'sent', attempts: 2, claimToken: null })
  })
})
