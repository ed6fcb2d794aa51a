/**
 * npm run test:cluster: Slakewise on a three-node Galera cluster (scripts/cluster.sh),
 * two app instances preferring different nodes, a mail catcher on its own ports.
 *
 *  1. 50 concurrent conflicting bookings split across the instances: exactly one wins.
 *  2. 200 queued messages with both outbox workers running: each delivered once.
 *  3. kill -9 the node the first instance uses while bookings and floor taps go on
 *     through both: every acknowledged write is on both surviving nodes, no load number
 *     twice, and the first instance acknowledges writes again within 10 s.
 *  4. The node rejoins, catches up, and holds every acknowledged write too.
 *
 * Prints one summary line; exits non-zero on any loss, duplicate or missed target.
 * Takes several minutes (the cluster alone needs one or two to form on 2 cores).
 * --keep leaves the cluster running afterwards.
 */
import type { ChildProcess } from 'node:child_process'
import mysql from 'mysql2/promise'
import { createDatabase } from '../server/db/client'
import { splitDatabaseUrl } from '../server/db/databaseUrls'
import { enqueueMail } from '../server/outbox/enqueue'
import { DEMO_LOAD_PREFIX, DEMO_SHOP_NAME } from '../server/db/demo/shop'
import { demoUser, sameSessionAt, signInAs, type Client } from '../tests/support/http'
import { createLibraryFixture } from '../tests/support/library'
import { pinSpec, savePlan } from '../tests/support/plans'
import { booking, createLine } from '../tests/support/schedule'
import { cluster, sh, startInstance, startMailCatcher, stop } from './cluster/processes'

const APP_PORT = Number(process.env.SLAKEWISE_CLUSTER_APP_PORT ?? 4650)
const SMTP_PORT = Number(process.env.SLAKEWISE_CLUSTER_SMTP_PORT ?? 4640)
const MAIL_WEB_PORT = Number(process.env.SLAKEWISE_CLUSTER_MAIL_WEB_PORT ?? 4641)
const RECOVERY_TARGET_S = 10
const CHAOS_S = 30
const KILL_AT_S = 8
const keep = process.argv.includes('--keep')

const say = (message: string) => console.log(`[test:cluster] ${message}`)
const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms))
const base = (port: number) => `http://127.0.0.1:${port}`

/** The cluster's URL with its hosts rotated, so each instance prefers another node. */
function preferring(url: string, first: number): string {
  const nodes = splitDatabaseUrl(url).map((nodeUrl) => new URL(nodeUrl).host)
  const order = [...nodes.slice(first), ...nodes.slice(0, first)]
  return url.replace(nodes.join(','), order.join(','))
}

async function caughtSubjects(prefix: string): Promise<string[]> {
  const mail = (await (await fetch(`${base(MAIL_WEB_PORT)}/api/email`)).json()) as { subject: string }[]
  return mail.map((m) => m.subject).filter((subject) => subject.startsWith(prefix))
}

interface Acknowledged {
  bookings: { id: number; loadNumber: string }[]
  taps: { batchId: number; to: string }[]
}

/** What one node holds of the acknowledged writes: missing ones, and load numbers held twice. */
async function audit(nodeUrl: string, acked: Acknowledged): Promise<{ missing: string[]; duplicates: number }> {
  const connection = await mysql.createConnection({ uri: nodeUrl, timezone: 'Z' })
  try {
    const missing: string[] = []
    const [rows] = await connection.query<mysql.RowDataPacket[]>('SELECT id, load_number FROM batches')
    const numbers = new Map(rows.map((row) => [Number(row.id), String(row.load_number)]))
    for (const b of acked.bookings) if (numbers.get(b.id) !== b.loadNumber) missing.push(`booking ${b.loadNumber}`)
    const [events] = await connection.query<mysql.RowDataPacket[]>('SELECT batch_id, to_state FROM batch_events')
    const tapped = new Set(events.map((row) => `${row.batch_id}:${row.to_state}`))
    for (const t of acked.taps) if (!tapped.has(`${t.batchId}:${t.to}`)) missing.push(`tap ${t.to} on batch ${t.batchId}`)
    const [twice] = await connection.query<mysql.RowDataPacket[]>('SELECT load_number FROM batches GROUP BY load_number HAVING COUNT(*) > 1')
    return { missing, duplicates: twice.length }
  } finally {
    await connection.end()
  }
}

async function main(): Promise<number> {
  const children: ChildProcess[] = []
  const serverLog: string[] = []
  const failures: string[] = []
  try {
    say('starting the three-node cluster (scripts/cluster.sh start)…')
    cluster('start')
    cluster('empty-database')
    const url = cluster('url').trim()
    const nodeUrls = splitDatabaseUrl(url)
    sh('npx', ['tsx', 'scripts/migrate.ts'], { ...process.env, DATABASE_URL: url })
    sh('npx', ['tsx', 'scripts/seed.ts'], { ...process.env, DATABASE_URL: url, NUXT_SHOP_NAME: DEMO_SHOP_NAME, NUXT_LOAD_PREFIX: DEMO_LOAD_PREFIX })
    sh('bash', ['-c', 'source scripts/lib.sh && mkdir -p .data && build_if_stale'])
    children.push(await startMailCatcher(SMTP_PORT, MAIL_WEB_PORT))

    const shared = {
      AUTH_ORIGIN: `${base(APP_PORT)}/api/auth`,
      NUXT_AUTH_SECRET: 'slakewise-cluster-test-secret-not-for-production',
      NUXT_RECORD_SEAL_KEY: 'slakewise-cluster-test-record-seal-key-0123456789',
      NUXT_SHOP_NAME: DEMO_SHOP_NAME,
      NUXT_LOAD_PREFIX: DEMO_LOAD_PREFIX,
      SMTP_URL: `smtp://127.0.0.1:${SMTP_PORT}`,
      OUTBOX_POLL_MS: '300',
    }
    // The first instance prefers node 0 (the one killed below), the second node 1.
    children.push(await startInstance(APP_PORT, { ...shared, DATABASE_URL: preferring(url, 0) }, serverLog))
    children.push(await startInstance(APP_PORT + 1, { ...shared, DATABASE_URL: preferring(url, 1) }, serverLog))
    say(`instances on ${base(APP_PORT)} (node 0 first) and ${base(APP_PORT + 1)} (node 1 first)`)

    const signIn = async (role: 'admin' | 'metallurgist' | 'operator') => {
      const client = await signInAs(demoUser(role).email, demoUser(role).password, { baseUrl: base(APP_PORT) })
      if (!client) throw new Error(`demo ${role} could not sign in`)
      return [client, sameSessionAt(client, base(APP_PORT + 1))] as const
    }
    const [[admin], [metallurgistA, metallurgistB], [operatorA, operatorB]] = await Promise.all([signIn('admin'), signIn('metallurgist'), signIn('operator')])
    const pin = await savePlan(metallurgistA, pinSpec(await createLibraryFixture(metallurgistA)))

    // 1. Conflicting bookings across nodes: one wins, Galera certification turns the rest into 409s.
    const raceLine = await createLine(admin, 'Race')
    const raceCharge = Date.UTC(2034, 0, 10)
    const race = await Promise.all(
      Array.from({ length: 50 }, (_, i) => (i % 2 ? metallurgistB : metallurgistA).request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, raceLine, raceCharge + i * 60_000, `Race ${i}`) })),
    )
    const won = race.filter((r) => r.status === 201).length
    const refused = race.filter((r) => r.status === 409).length
    say(`bookings race: ${won} won, ${refused} refused with 409, ${50 - won - refused} other`)
    if (won !== 1 || refused !== 49) failures.push(`bookings race: ${won} won, ${refused} refused (want 1 and 49)`)

    // 2. 200 messages, two workers on two nodes.
    const runTag = `cluster-${Date.now()}`
    const writer = createDatabase(url)
    await writer.db.transaction(async (tx) => {
      for (let n = 0; n < 200; n += 1) await enqueueMail(tx, { dedupeKey: `${runTag}-${n}`, to: ['cluster@kestrelbay.example'], subject: `${runTag} #${n}`, html: '<p>cluster</p>', text: 'cluster' })
    })
    await writer.pool.end()
    const deadline = Date.now() + 90_000
    let subjects = await caughtSubjects(runTag)
    while (subjects.length < 200 && Date.now() < deadline) {
      await pause(500)
      subjects = await caughtSubjects(runTag)
    }
    await pause(3000)
    subjects = await caughtSubjects(runTag)
    const distinct = new Set(subjects).size
    const duplicateMail = subjects.length - distinct
    say(`outbox: ${distinct} of 200 delivered, ${duplicateMail} duplicates`)
    if (distinct !== 200) failures.push(`outbox: ${distinct} of 200 delivered`)
    if (duplicateMail > 0) failures.push(`outbox: ${duplicateMail} duplicate deliveries`)

    // 3. Bookings and floor taps through both instances while node 0 dies.
    const lines = await Promise.all(Array.from({ length: 6 }, () => createLine(admin, 'Chaos')))
    const acked: Acknowledged = { bookings: [], taps: [] }
    const unacknowledged: Record<string, number> = {}
    const successesOfA: number[] = []
    let counter = 0
    const started = Date.now()
    let killedAt = Infinity
    const note = (status: number | string) => void (unacknowledged[status] = (unacknowledged[status] ?? 0) + 1)
    const attempt = async (client: Client, path: string, body: unknown) => {
      try {
        return await client.request(path, { method: 'POST', body })
      } catch (error) {
        return { status: (error as Error).message.slice(0, 40), body: null }
      }
    }
    // Each worker books through one instance and taps "charged" through the other, so a tap also reads another node's write.
    const worker = async (bookViaA: boolean) => {
      const [booker, tapper] = bookViaA ? [metallurgistA, operatorB] : [metallurgistB, operatorA]
      while (Date.now() - started < CHAOS_S * 1000) {
        const k = (counter += 1)
        const charge = Date.UTC(2035, 0, 1) + k * 2 * 24 * 3600_000
        const booked = await attempt(booker, '/api/batches', booking(pin.planRevisionId, lines[k % lines.length]!, charge, `Chaos ${k}`))
        if (booked.status !== 201) {
          note(booked.status)
          continue
        }
        acked.bookings.push({ id: booked.body.id, loadNumber: booked.body.loadNumber })
        if (bookViaA) successesOfA.push(Date.now())
        const tapped = await attempt(tapper, `/api/batches/${booked.body.id}/events`, { to: 'charged' })
        if (tapped.status !== 201) {
          note(tapped.status)
          continue
        }
        acked.taps.push({ batchId: booked.body.id, to: 'charged' })
        if (!bookViaA) successesOfA.push(Date.now())
      }
    }
    const killer = (async () => {
      await pause(KILL_AT_S * 1000)
      killedAt = Date.now()
      cluster('kill-node', '0')
    })()
    await Promise.all([worker(true), worker(true), worker(false), worker(false), killer])
    const recovery_s = (Math.min(...successesOfA.filter((at) => at > killedAt)) - killedAt) / 1000
    say(`failover: ${acked.bookings.length} bookings and ${acked.taps.length} taps acknowledged; not acknowledged: ${JSON.stringify(unacknowledged)}; first write through the first instance ${recovery_s.toFixed(1)} s after the kill`)
    if (!(recovery_s <= RECOVERY_TARGET_S)) failures.push(`recovery ${recovery_s.toFixed(1)} s (target ${RECOVERY_TARGET_S} s)`)

    let lost = 0
    let duplicateLoads = 0
    for (const node of [1, 2]) {
      const result = await audit(nodeUrls[node]!, acked)
      say(`node ${node}: ${result.missing.length} acknowledged writes missing, ${result.duplicates} load numbers held twice`)
      lost = Math.max(lost, result.missing.length)
      duplicateLoads = Math.max(duplicateLoads, result.duplicates)
      if (result.missing.length) failures.push(`node ${node} lacks ${result.missing.slice(0, 5).join(', ')}`)
    }
    if (duplicateLoads) failures.push(`${duplicateLoads} load numbers held twice`)

    // 4. The killed node rejoins and catches up.
    const rejoinStart = Date.now()
    cluster('start-node', '0')
    const rejoin_s = (Date.now() - rejoinStart) / 1000
    const rejoined = await audit(nodeUrls[0]!, acked)
    const rejoinOk = rejoined.missing.length === 0 && rejoined.duplicates === 0
    say(`node 0 rejoined in ${rejoin_s.toFixed(1)} s: ${rejoined.missing.length} acknowledged writes missing`)
    if (!rejoinOk) failures.push('node 0 did not catch up')

    console.log(`cluster: ${lost} lost, ${duplicateMail + duplicateLoads} duplicates, recovery ${recovery_s.toFixed(1)} s, rejoin ${rejoinOk ? 'ok' : 'FAILED'} (race ${won}/50 won, outbox ${distinct}/200, ${acked.bookings.length + acked.taps.length} writes acknowledged during the failover, rejoin ${rejoin_s.toFixed(1)} s)`)
  } catch (error) {
    failures.push(`aborted: ${(error as Error).stack ?? error}`)
  } finally {
    for (const child of children.reverse()) await stop(child)
    if (!keep) cluster('stop')
  }
  if (failures.length) {
    console.error(`[test:cluster] FAILED:\n  ${failures.join('\n  ')}`)
    if (serverLog.length) console.error(`[test:cluster] last server messages:\n  ${serverLog.slice(-15).join('\n  ')}`)
    return 1
  }
  return 0
}

process.exitCode = await main()
