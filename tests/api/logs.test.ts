/**
 * Uploading thermocouple logs over HTTP: the preview (nothing stored), storing under a
 * confirmed mapping (bytes, SHA-256, series in °C, audit), the 10 MB and 200,000-row
 * limits, bad files refused with their reason and nothing stored, and who may upload.
 * SHA-256 is checked against node:crypto; °F → °C against the closed form (T − 32)·5/9.
 */
import { createHash } from 'node:crypto'
import type { Connection } from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { auditFor } from '../support/audit'
import { connectTestDb } from '../support/db'
import { anonymous, signInDemo, type Client } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { mappingField, postLog } from '../support/logs'
import type { SavedPlan } from '../support/plans'
import { move, quickPlan } from '../support/records'
import { booking, createLine } from '../support/schedule'
import { BASE_URL } from '../support/stackConfig'

let admin: Client
let metallurgist: Client
let operator: Client
let qa: Client
let plan: SavedPlan
let db: Connection

beforeAll(async () => {
  ;[admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
  plan = await quickPlan(metallurgist, await createLibraryFixture(metallurgist), 60)
  db = await connectTestDb()
})

afterAll(async () => {
  await db?.end()
})

async function storedCounts() {
  const [[logs]] = (await db.query('SELECT (SELECT COUNT(*) FROM measurement_logs) AS logs, (SELECT COUNT(*) FROM measurement_log_channels) AS channels, (SELECT COUNT(*) FROM measurement_log_parts) AS parts')) as any
  return { logs: Number(logs.logs), channels: Number(logs.channels), parts: Number(logs.parts) }
}

// A logger export in the continental style: semicolons, decimal commas, clock times, °F.
const FAHRENHEIT_LOG = 'Time;Probe centre (°F);Bath (°F)\n00:00:00;1562,0;140,0\n00:00:00,5;1292,0;141,8\n00:00:01;932,0;143,6\n00:00:02;212,0;145,4\n00:00:03;32,0;147,2\n'
const FAHRENHEIT_MAPPING = { time: 'Time', channels: [{ column: 'Probe centre (°F)', unit: 'F' }, { column: 'Bath (°F)', unit: 'F' }] }
const SIMPLE_MAPPING = { time: 'time_s', channels: [{ column: 'T (°C)', unit: 'C' }] }

describe('previewing a log', () => {
  it('shows the detected delimiter, decimal comma, clock times, °F columns and first rows, and stores nothing', async () => {
    const before = await storedCounts()
    const response = await postLog(metallurgist, '/api/logs/preview', { name: 'probe.csv', bytes: FAHRENHEIT_LOG })
    expect(response.status).toBe(200)
    expect(response.body).toMatchObject({
      delimiter: ';',
      decimalComma: true,
      timeFormat: 'clock',
      rows: 5,
      columns: [
        { name: 'Time', role: 'time', unit: null },
        { name: 'Probe centre (°F)', role: 'temperature', unit: 'F' },
        { name: 'Bath (°F)', role: 'temperature', unit: 'F' },
      ],
    })
    expect(response.body.firstRows[1]).toEqual(['00:00:00', '1562,0', '140,0'])
    expect(await storedCounts()).toEqual(before)
  })
})

describe('storing a log', () => {
  it('keeps the bytes with their SHA-256, the mapping and the series in °C, audited', async () => {
    const bytes = new TextEncoder().encode(FAHRENHEIT_LOG)
    const stored = await postLog(metallurgist, '/api/logs', { name: 'probe.csv', bytes }, mappingField(FAHRENHEIT_MAPPING))
    expect(stored.status).toBe(201)
    expect(stored.body).toMatchObject({
      fileName: 'probe.csv',
      size_bytes: bytes.length,
      sha256: createHash('sha256').update(bytes).digest('hex'),
      rows: 5,
      duration_s: 3,
      channels: ['Probe centre (°F)', 'Bath (°F)'],
      batchId: null,
    })
    const detail = (await qa.request(`/api/logs/${stored.body.id}`)).body
    expect(detail.t_s).toEqual([0, 0.5, 1, 2, 3])
    // (T − 32)·5/9: 1562 °F = 850 °C, 1292 °F = 700 °C, 932 °F = 500 °C, 212 °F = 100 °C, 32 °F = 0 °C.
    detail.series[0].T_C.forEach((T: number, i: number) => expect(T).toBeCloseTo([850, 700, 500, 100, 0][i]!, 9))
    expect(detail.series[1]).toMatchObject({ name: 'Bath (°F)', unit: 'F', min_C: 60, max_C: 64 })
    expect(detail.mapping).toEqual(FAHRENHEIT_MAPPING)
    const file = await fetch(`${BASE_URL}/api/logs/${stored.body.id}/file`, { headers: { cookie: qa.cookie } })
    expect(Buffer.from(await file.arrayBuffer()).equals(Buffer.from(bytes))).toBe(true)
    const [audit] = await auditFor(admin, 'measurement_log', stored.body.id)
    expect(audit).toMatchObject({ action: 'log.upload', details: { sha256: stored.body.sha256, rows: 5 } })
    const list = (await operator.request('/api/logs')).body
    expect(list[0]).toMatchObject({ id: stored.body.id, uploadedBy: expect.any(String) })
  })

  it('a 2.5 MB log of 200,000 rows is stored in parts and comes back byte for byte, thinned to 1982 rows for display', async () => {
    const lines = ['time_s,T (°C)']
    for (let i = 0; i < 200_000; i++) lines.push(`${(i * 0.05).toFixed(2)},${(850 - i * 0.004).toFixed(3)}`)
    const bytes = new TextEncoder().encode(lines.join('\n'))
    const stored = await postLog(qa, '/api/logs', { name: 'long.csv', bytes }, mappingField(SIMPLE_MAPPING))
    expect(stored.status).toBe(201)
    expect(stored.body.rows).toBe(200_000)
    const [[{ parts }]] = (await db.query('SELECT COUNT(*) AS parts FROM measurement_log_parts WHERE log_id = ?', [stored.body.id])) as any
    expect(Number(parts)).toBe(Math.ceil(bytes.length / 1048576))
    const detail = (await qa.request(`/api/logs/${stored.body.id}`)).body
    // 199,999 steps over at most 1999 gaps: every 101st row (1981 rows) and the last.
    expect(detail.shownPoints).toBe(1982)
    expect(detail.t_s[1]).toBeCloseTo(5.05, 9)
    expect(detail.t_s.at(-1)).toBeCloseTo(9999.95, 6)
    expect(detail.series[0]).toMatchObject({ min_C: 50.004, max_C: 850 })
    const file = await fetch(`${BASE_URL}/api/logs/${stored.body.id}/file`, { headers: { cookie: qa.cookie } })
    expect(createHash('sha256').update(Buffer.from(await file.arrayBuffer())).digest('hex')).toBe(stored.body.sha256)
  })
})

const UTF8 = (text: string) => new TextEncoder().encode(text)

describe('refusing bad files: the reason named, nothing stored', () => {
  it.each([
    ['an empty file', new Uint8Array(0), SIMPLE_MAPPING, 422, 'file', 'is empty'],
    ['a binary file', Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08, 0x00]), SIMPLE_MAPPING, 422, 'file', 'is not text'],
    ['Latin-1 text', Uint8Array.from([...UTF8('time_s,T (°C)\n0,850\n1,8'), 0xb0, 0x0a]), SIMPLE_MAPPING, 422, 'file', 'unknown text encoding'],
    ['no numeric time', UTF8('time_s,T (°C)\nstart,850\nlater,800\n'), SIMPLE_MAPPING, 422, 'mapping.time', 'does not hold seconds'],
    ['time going backwards', UTF8('time_s,T (°C)\n0,850\n2,800\n1,790\n'), SIMPLE_MAPPING, 422, 'file', 'time goes backwards'],
    ['text in a number column', UTF8('time_s,T (°C)\n0,850\n1,open\n'), SIMPLE_MAPPING, 422, 'file', '"open" is not a number'],
    ['a formula cell', UTF8('time_s,T (°C)\n0,850\n1,=SUM(B2:B3)\n'), SIMPLE_MAPPING, 422, 'file', 'looks like a spreadsheet formula'],
    ['a mapping naming a missing column', UTF8('time_s,T (°C)\n0,850\n1,800\n'), { time: 'time_s', channels: [{ column: 'Core', unit: 'C' }] }, 422, 'mapping.channels.0.column', 'no column named "Core"'],
    ['a mapping with a unit that is neither C nor F', UTF8('time_s,T (°C)\n0,850\n1,800\n'), { time: 'time_s', channels: [{ column: 'T (°C)', unit: 'K' }] }, 400, 'mapping.channels.0.unit', 'unit must be C or F'],
    ['a mapping without channels', UTF8('time_s,T (°C)\n0,850\n1,800\n'), { time: 'time_s', channels: [] }, 400, 'mapping.channels', 'map at least one temperature column'],
  ] as const)('%s', async (_label, bytes, mapping, status, field, reason) => {
    const before = await storedCounts()
    const response = await postLog(metallurgist, '/api/logs', { name: 'bad.csv', bytes }, mappingField(mapping))
    expect(response.status).toBe(status)
    expect(response.body.data.problems[0].field).toBe(field)
    expect(response.body.data.problems[0].message).toContain(reason)
    expect(await storedCounts()).toEqual(before)
  })

  it('a missing mapping and a mapping that is not JSON are 400s naming mapping', async () => {
    const bytes = UTF8('time_s,T (°C)\n0,850\n1,800\n')
    const missing = await postLog(metallurgist, '/api/logs', { name: 'a.csv', bytes })
    expect(missing.status).toBe(400)
    expect(missing.body.data.problems[0]).toEqual({ field: 'mapping', message: 'required' })
    const garbled = await postLog(metallurgist, '/api/logs', { name: 'a.csv', bytes }, { mapping: '{time:' })
    expect(garbled.body.data.problems[0]).toEqual({ field: 'mapping', message: 'is not JSON' })
  })

  it('over 10 MB is refused with 413 saying the limit; 200,001 rows with 422 saying the row limit', async () => {
    const before = await storedCounts()
    const big = new Uint8Array(10 * 1024 * 1024 + 1).fill(0x31)
    const tooBig = await postLog(metallurgist, '/api/logs', { name: 'big.csv', bytes: big }, mappingField(SIMPLE_MAPPING))
    expect(tooBig.status).toBe(413)
    expect(tooBig.body.data.problems[0]).toEqual({ field: 'file', message: '10.0 MB is over the 10 MB limit' })
    const lines = ['time_s,T (°C)']
    for (let i = 0; i <= 200_000; i++) lines.push(`${i},20`)
    const tooLong = await postLog(metallurgist, '/api/logs', { name: 'long.csv', bytes: lines.join('\n') }, mappingField(SIMPLE_MAPPING))
    expect(tooLong.status).toBe(422)
    expect(tooLong.body.data.problems[0]).toEqual({ field: 'file', message: 'has more than the 200,000-row limit' })
    expect(await storedCounts()).toEqual(before)
  })

  it('a body that is not multipart is 415 naming Content-Type', async () => {
    const response = await metallurgist.request('/api/logs', { method: 'POST', body: { mapping: SIMPLE_MAPPING } })
    expect(response.status).toBe(415)
    expect(response.body.data.problems[0].field).toBe('Content-Type')
  })
})

describe('who may upload', () => {
  const ok = UTF8('time_s,T (°C)\n0,850\n1,800\n2,760\n')

  async function bookedLoad() {
    const line = await createLine(admin, 'Log', 'water')
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 1000, 'PO-LOG') })
    expect(booked.status).toBe(201)
    return booked.body as { id: number; loadNumber: string }
  }

  it('signed out 401; an operator needs a load, and a charged one', async () => {
    expect((await postLog(anonymous(), '/api/logs', { name: 'a.csv', bytes: ok }, mappingField(SIMPLE_MAPPING))).status).toBe(401)
    expect((await anonymous().request('/api/logs')).status).toBe(401)
    const before = await storedCounts()
    const alone = await postLog(operator, '/api/logs', { name: 'a.csv', bytes: ok }, mappingField(SIMPLE_MAPPING))
    expect(alone.status).toBe(403)
    expect(alone.body.data.problems[0].field).toBe('batchId')
    const load = await bookedLoad()
    const planned = await postLog(operator, '/api/logs', { name: 'a.csv', bytes: ok }, { ...mappingField(SIMPLE_MAPPING), batchId: String(load.id) })
    expect(planned.status).toBe(409)
    expect(planned.body.data.problems[0].message).toContain('has been charged')
    expect(await storedCounts()).toEqual(before)
    expect((await move(operator, load.id, 'charged')).status).toBe(201)
    const attached = await postLog(operator, '/api/logs', { name: 'load.csv', bytes: ok }, { ...mappingField(SIMPLE_MAPPING), batchId: String(load.id) })
    expect(attached.status).toBe(201)
    expect(attached.body).toMatchObject({ batchId: load.id, loadNumber: load.loadNumber })
    expect((await operator.request(`/api/logs?batchId=${load.id}`)).body.map((l: { id: number }) => l.id)).toEqual([attached.body.id])
  })

  it('an unknown log is 404, a bad id 400 naming id', async () => {
    expect((await qa.request('/api/logs/999999')).status).toBe(404)
    const bad = await qa.request('/api/logs/abc')
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems[0].field).toBe('id')
  })
})
