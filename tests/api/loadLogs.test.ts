/**
 * A load's thermocouple log over HTTP: an operator attaches it to a released load, the
 * unsigned record is re-issued with the measured trace (aligned on the quench tap), the
 * band and the trace deviations, still intact under its new seal, and the corrected
 * sheet is mailed with the trace; after sign-off attaching is refused and nothing is
 * stored. The expected reading at the release is the closed form of the synthetic log
 * (T = 850 − 4·t) at the release's log time, worked out here from the tapped instants.
 */
import type { Connection } from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CURVE_CSV_HEADER } from '../../server/records/sheetCsv'
import { auditFor, latestAuditId } from '../support/audit'
import { connectTestDb } from '../support/db'
import { signInDemo, type Client } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { mappingField, postLog } from '../support/logs'
import { caughtAttachment, waitForMail } from '../support/mailCatcher'
import type { SavedPlan } from '../support/plans'
import { quickPlan, releaseLoad, type Released } from '../support/records'

let admin: Client
let metallurgist: Client
let operator: Client
let qa: Client
let plan: SavedPlan
let db: Connection
let load: Released
let before: any

const QUENCH_AT_LOG_S = 10
/** 1 s rows for 2 min, cooling 4 K a second from 850 °C: far slower than the 2 mm sheet's plan. */
const SLOW_LOG = ['time_s,Core (°C)', ...Array.from({ length: 121 }, (_, t) => `${t},${850 - 4 * t}`)].join('\n') + '\n'
const MAPPING = { time: 'time_s', channels: [{ column: 'Core (°C)', unit: 'C' }] }

async function recordOf(batchId: number) {
  const list = await qa.request('/api/records?limit=500')
  const item = list.body.find((r: { batchId: number }) => r.batchId === batchId)
  expect(item, `record of batch ${batchId}`).toBeDefined()
  return (await qa.request(`/api/records/${item.id}`)).body
}

async function storedLogs() {
  const [[row]] = (await db.query('SELECT COUNT(*) AS logs FROM measurement_logs')) as any
  return Number(row.logs)
}

beforeAll(async () => {
  ;[admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
  plan = await quickPlan(metallurgist, await createLibraryFixture(metallurgist), 60)
  db = await connectTestDb()
  load = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, plan, 2500)
  before = await recordOf(load.batchId)
}, 120_000)

afterAll(async () => {
  await db?.end()
})

describe('attaching a log to a released load', () => {
  it('refuses an alignment given twice, or without a load, naming the field; nothing stored', async () => {
    const count = await storedLogs()
    const both = await postLog(operator, '/api/logs', { name: 'load-log.csv', bytes: SLOW_LOG }, {
      ...mappingField(MAPPING),
      batchId: String(load.batchId),
      quenchAtLog_s: '10',
      startedAt: '2026-03-04T06:00:00Z',
    })
    expect(both.status).toBe(400)
    expect(both.body.data.problems).toContainEqual({ field: 'quenchAtLog_s', message: 'give the log\'s start time or the quench\'s time into the log, not both' })
    const loose = await postLog(metallurgist, '/api/logs', { name: 'load-log.csv', bytes: SLOW_LOG }, { ...mappingField(MAPPING), quenchAtLog_s: '10' })
    expect(loose.status).toBe(400)
    expect(loose.body.data.problems).toContainEqual({ field: 'batchId', message: 'a log lines up with a load\'s quench: name the load' })
    const badTime = await postLog(operator, '/api/logs', { name: 'load-log.csv', bytes: SLOW_LOG }, { ...mappingField(MAPPING), batchId: String(load.batchId), startedAt: 'at nine' })
    expect(badTime.status).toBe(400)
    expect(badTime.body.data.problems[0].field).toBe('startedAt')
    expect(await storedLogs()).toBe(count)
  })

  it('an operator attaches it; the record is re-issued with the trace, the band and both trace deviations, intact', async () => {
    expect(before.snapshot.measuredTraces).toBeUndefined()
    expect(before.deviationCount).toBe(0)
    const attached = await postLog(operator, '/api/logs', { name: 'load-log.csv', bytes: SLOW_LOG }, {
      ...mappingField(MAPPING),
      batchId: String(load.batchId),
      quenchAtLog_s: String(QUENCH_AT_LOG_S),
    })
    expect(attached.status).toBe(201)
    expect(attached.body).toMatchObject({ batchId: load.batchId, quenchAtLog_s: QUENCH_AT_LOG_S, startedAt: null })

    const after = await recordOf(load.batchId)
    expect(after.integrity).toBe('intact')
    expect(after.hash).not.toBe(before.hash)
    const [trace] = after.snapshot.measuredTraces
    expect(trace).toMatchObject({ logId: attached.body.id, fileName: 'load-log.csv', channel: 'Core (°C)', quenchAtLog_s: QUENCH_AT_LOG_S })
    expect(trace.alignment).toBe('the quench tap is 10 s into the log, as the uploader gave it')
    expect(trace.points[0]).toEqual({ t_s: -10, T_C: 850 })
    // The release's log time: the offset plus quench → release from the tapped instants; the log reads 850 − 4·t there.
    const releaseLog_s = QUENCH_AT_LOG_S + (load.at.released! - load.at.quenched!) / 1000
    expect(trace.comparison.atRelease_C).toBeCloseTo(850 - 4 * releaseLog_s, 6)
    expect(trace.comparison.reachedHandling_s).toBeNull()
    expect(trace.comparison.logEnd_s).toBe(110)
    expect(after.snapshot.predicted.band.slow.length).toBe(121)
    expect(trace.comparison.slowEndAtRelease_C).toBeLessThan(trace.comparison.atRelease_C)

    const rules = after.snapshot.deviations.map((d: { rule: string }) => d.rule)
    expect(rules).toEqual(['above_band_at_release', 'slow_cooling'])
    expect(after.deviationCount).toBe(2)
    const slow = after.snapshot.deviations[1]
    expect(slow).toMatchObject({ rule: 'slow_cooling', actual_s: 110, trace: 'load-log.csv · Core (°C)' })
    expect(slow.planned_s).toBe(after.snapshot.predicted.quenchToHandling_s)

    const [audit] = await auditFor(admin, 'measurement_log', attached.body.id)
    expect(audit.action).toBe('log.upload')
    expect(audit.details.record).toMatchObject({ id: after.id, previousHash: before.hash, hash: after.hash })
  })

  it('mails the re-issued sheet with the trace beside the predicted curve', async () => {
    const [mail] = await waitForMail((m) => m.subject.includes(load.loadNumber) && m.subject.includes('2 deviations'), 1)
    expect(mail!.html).toContain('Measured cooling')
    expect(mail!.html).toContain('data-rule="slow_cooling"')
    expect(mail!.text).toContain('load-log.csv · Core (°C): ')
    const csvFile = mail!.attachments!.find((file) => file.filename.endsWith('.csv'))!
    const csv = (await caughtAttachment(mail!, csvFile.generatedFileName)).toString('utf8').trimEnd().split('\r\n')
    expect(csv[0]).toBe(`${CURVE_CSV_HEADER},band_slow_end_C,band_fast_end_C,measured_load_log_csv_Core_C_C`)
    // The first row is the quench: the log reads 850 − 4·10 = 810 °C at its 10th second.
    expect(csv[1]!.split(',').at(-1)).toBe('810.0')
  })

  it('after sign-off attaching is refused with the reason, nothing stored and the record unchanged', async () => {
    const record = await recordOf(load.batchId)
    const approved = await qa.request(`/api/records/${record.id}/approve`, { method: 'POST', body: {} })
    expect(approved.status).toBe(200)
    const count = await storedLogs()
    const audit = await latestAuditId(admin)
    const refused = await postLog(operator, '/api/logs', { name: 'late.csv', bytes: SLOW_LOG }, { ...mappingField(MAPPING), batchId: String(load.batchId) })
    expect(refused.status).toBe(409)
    expect(refused.body.data.problems).toEqual([{ field: 'batchId', message: `the record of load ${load.loadNumber} is signed and sealed; no log can be added` }])
    expect(await storedLogs()).toBe(count)
    expect(await latestAuditId(admin)).toBe(audit)
    const still = await recordOf(load.batchId)
    expect(still).toMatchObject({ hash: record.hash, integrity: 'intact', state: 'approved' })
  })
})

describe('a log attached while the load cools', () => {
  it('is in the record written at release, lined up by the start time the uploader gave', async () => {
    let logId = 0
    const cooling = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, plan, 2500, {
      beforeRelease: async (batchId) => {
        const detail = await qa.request(`/api/batches/${batchId}`)
        const quenched = Date.parse(detail.body.events.find((e: { toState: string }) => e.toState === 'quenched').at)
        // The logger was started 20 s before the quench tap.
        const startedAt = new Date(quenched - 20_000).toISOString()
        const attached = await postLog(operator, '/api/logs', { name: 'cooling.csv', bytes: SLOW_LOG }, { ...mappingField(MAPPING), batchId: String(batchId), startedAt })
        expect(attached.status).toBe(201)
        expect(attached.body.startedAt).toBe(startedAt)
        logId = attached.body.id
      },
    })
    const record = await recordOf(cooling.batchId)
    expect(record.integrity).toBe('intact')
    const [trace] = record.snapshot.measuredTraces
    expect(trace).toMatchObject({ logId, quenchAtLog_s: 20 })
    expect(trace.alignment).toMatch(/^the log started at \d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2} UTC, so the quench tap is 20 s into the log$/)
    const releaseLog_s = 20 + (cooling.at.released! - cooling.at.quenched!) / 1000
    expect(trace.comparison.atRelease_C).toBeCloseTo(850 - 4 * releaseLog_s, 6)
    expect(trace.comparison.logEnd_s).toBe(100)
    expect(record.snapshot.deviations.map((d: { rule: string }) => d.rule)).toEqual(['above_band_at_release', 'slow_cooling'])
    const [audit] = await auditFor(admin, 'measurement_log', logId)
    expect(audit.details.record).toBeUndefined()
  })
})
