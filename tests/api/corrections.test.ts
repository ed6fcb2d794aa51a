/**
 * Correcting a floor tap's time over HTTP: who may (the operator within the shop's
 * window, a metallurgist or QA lead until sign-off), what is refused (future times,
 * times out of order, clock moves, signed records), and what the record of a released
 * load says afterwards: original and correction side by side, re-sealed, audited.
 * Expected seconds are computed here from the event times the batch API reports.
 */
import type { Connection } from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { auditFor } from '../support/audit'
import { connectTestDb } from '../support/db'
import { anonymous, demoUser, signInDemo, type Client } from '../support/http'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { waitForMail } from '../support/mailCatcher'
import type { SavedPlan } from '../support/plans'
import { pause } from '../support/poll'
import { move, quickPlan } from '../support/records'
import { booking, createLine } from '../support/schedule'

let admin: Client
let metallurgist: Client
let operator: Client
let qa: Client
let lib: LibraryFixture
let plan: SavedPlan
let db: Connection

beforeAll(async () => {
  ;[admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
  lib = await createLibraryFixture(metallurgist)
  plan = await quickPlan(metallurgist, lib, 60)
  db = await connectTestDb()
})

afterAll(async () => {
  await db?.end()
})

async function bookNow() {
  const line = await createLine(admin, 'Cor', 'water')
  const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 1000, 'PO-COR') })
  expect(booked.status).toBe(201)
  return booked.body.id as number
}

async function eventsOf(batchId: number) {
  return (await qa.request(`/api/batches/${batchId}`)).body.events as { id: number; toState: string; at: string; originalAt: string | null; corrections: { reason: string; by: string; at: string }[] }[]
}

const correct = (client: Client, batchId: number, eventId: number, body: unknown) => client.request(`/api/batches/${batchId}/events/${eventId}/corrections`, { method: 'POST', body })

describe('correcting a tap on the floor', () => {
  it('the operator corrects core at heat with a reason: the original stays, the soak end is re-planned, the audit keeps both', async () => {
    const id = await bookNow()
    await move(operator, id, 'charged')
    await pause(Math.ceil(plan.summary.soak!.heatUp_s * 1000) + 50)
    await move(operator, id, 'soaking')
    const [, charged, soaking] = await eventsOf(id)
    const corrected = Date.parse(soaking!.at) - 500
    const response = await correct(operator, id, soaking!.id, { at: new Date(corrected).toISOString(), reason: 'Thermocouple read at heat before I tapped' })
    expect(response.status).toBe(201)
    expect(response.body.event).toMatchObject({ id: soaking!.id, at: new Date(corrected).toISOString(), originalAt: soaking!.at })
    expect(response.body.event.corrections).toEqual([{ at: new Date(corrected).toISOString(), reason: 'Thermocouple read at heat before I tapped', by: demoUser('operator').displayName, madeAt: expect.any(String) }])
    expect(response.body.recordId).toBeNull()

    const batch = (await qa.request(`/api/batches/${id}`)).body
    expect(batch.soakingAt).toBe(corrected)
    // Soak end = corrected core at heat + the 2 s minimum soak.
    expect(batch.furnaceEnd).toBe(corrected + 2000)
    expect(Date.parse(charged!.at)).toBeLessThan(corrected)

    const audit = await auditFor(admin, 'batch', id)
    const row = audit.find((entry: { action: string }) => entry.action === 'batch.event_corrected')
    expect(row.details).toMatchObject({ event: 'soaking', tapped: soaking!.at, from: soaking!.at, to: new Date(corrected).toISOString(), reason: 'Thermocouple read at heat before I tapped' })
  })

  it('refuses a future time, a time before the previous tap (422 naming at), a missing reason (400), and a stranger (401/403)', async () => {
    const id = await bookNow()
    await move(operator, id, 'charged')
    await move(operator, id, 'soaking', true)
    const [, charged, soaking] = await eventsOf(id)
    const future = await correct(operator, id, soaking!.id, { at: new Date(Date.now() + 60_000).toISOString(), reason: 'Wrong card' })
    expect(future.status).toBe(422)
    expect(future.body.data.problems).toEqual([{ field: 'at', message: 'The corrected time cannot be in the future' }])
    const before = await correct(operator, id, soaking!.id, { at: new Date(Date.parse(charged!.at) - 1000).toISOString(), reason: 'Wrong card' })
    expect(before.status).toBe(422)
    expect(before.body.data.problems[0].message).toBe(`The corrected time must not come before In furnace at ${new Date(Date.parse(charged!.at)).toISOString().slice(0, 19).replace('T', ' ')} UTC`)
    const noReason = await correct(operator, id, soaking!.id, { at: charged!.at })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.problems[0].field).toBe('reason')
    expect((await correct(anonymous(), id, soaking!.id, { at: charged!.at, reason: 'Wrong card' })).status).toBe(401)
    expect((await correct(operator, id, 999_999, { at: charged!.at, reason: 'Wrong card' })).status).toBe(404)
    // Nothing half-written: the tap still has no correction.
    expect((await eventsOf(id))[2]!.corrections).toEqual([])
  })

  it('after the shop window the operator is refused (403); a metallurgist and a QA lead still correct', async () => {
    const id = await bookNow()
    await move(operator, id, 'charged')
    const [, charged] = await eventsOf(id)
    // The tap as if made 11 minutes ago: past the default 10 min window.
    await db.query('UPDATE batch_events SET at = at - INTERVAL 11 MINUTE WHERE id = ?', [charged!.id])
    await db.query('UPDATE batches SET charged_at = charged_at - INTERVAL 11 MINUTE WHERE id = ?', [id])
    const tapped = Date.parse(charged!.at) - 11 * 60_000
    const late = await correct(operator, id, charged!.id, { at: new Date(tapped + 1000).toISOString(), reason: 'Tapped a second late' })
    expect(late.status).toBe(403)
    expect(late.body.statusMessage).toMatch(/^The 10 min 00 s window for correcting this tap closed 1 min 0\d s ago; a metallurgist or QA lead can still correct it$/)
    expect((await correct(metallurgist, id, charged!.id, { at: new Date(tapped + 1000).toISOString(), reason: 'Tapped a second late' })).status).toBe(201)
    expect((await correct(qa, id, charged!.id, { at: new Date(tapped + 2000).toISOString(), reason: 'Furnace log says 2 s' })).status).toBe(201)
    const after = (await eventsOf(id)).find((e) => e.toState === 'charged')
    expect(after!.corrections.map((c) => c.reason)).toEqual(['Tapped a second late', 'Furnace log says 2 s'])
    expect(after!.at).toBe(new Date(tapped + 2000).toISOString())
    expect(after!.originalAt).toBe(new Date(tapped).toISOString())
  })
})

describe('the record of a load with an early tap, a correction and no door tap', () => {
  let batchId: number
  let recordId: number
  let firstHash: string

  beforeAll(async () => {
    batchId = await bookNow()
    await move(operator, batchId, 'charged')
    // Core at heat tapped at once: before the predicted heat-up, confirmed a second time.
    expect((await move(operator, batchId, 'soaking')).status).toBe(409)
    expect((await move(operator, batchId, 'soaking', true)).status).toBe(201)
    await pause(2500)
    // The door tap is missed: the quench is recorded straight from soak.
    expect((await move(operator, batchId, 'quenched')).status).toBe(201)
    let release = await move(operator, batchId, 'released')
    const deadline = Date.now() + 20_000
    while (release.status === 409 && Date.now() < deadline) {
      await pause(400)
      release = await move(operator, batchId, 'released')
    }
    expect(release.status).toBe(201)
    const list = (await qa.request('/api/records?limit=500')).body as { id: number; batchId: number }[]
    recordId = list.find((r) => r.batchId === batchId)!.id
    firstHash = (await qa.request(`/api/records/${recordId}`)).body.hash
  }, 60_000)

  it('a metallurgist corrects core at heat after release: the record is re-issued, re-sealed, and tells the truth', async () => {
    const events = await eventsOf(batchId)
    const charged = events.find((e) => e.toState === 'charged')!
    const soaking = events.find((e) => e.toState === 'soaking')!
    const quenched = events.find((e) => e.toState === 'quenched')!
    // The chart recorder's 1 s after charge: still sooner than the predicted heat-up.
    const correctedAt = Date.parse(charged.at) + 1000
    const response = await correct(metallurgist, batchId, soaking.id, { at: new Date(correctedAt).toISOString(), reason: 'Chart recorder shows core at heat 1 s after charge' })
    expect(response.status).toBe(201)
    expect(response.body.recordId).toBe(recordId)

    const record = (await qa.request(`/api/records/${recordId}`)).body
    expect(record.integrity).toBe('intact')
    expect(record.hash).not.toBe(firstHash)
    const s = record.snapshot
    expect(s.format).toBe(2)
    const core = s.events.find((e: { type: string }) => e.type === 'soaking')
    expect(core).toMatchObject({ at: new Date(correctedAt).toISOString(), originalAt: soaking.at, source: 'recorded' })
    expect(core.shortfall).toMatch(/^Core at heat \d+ s after charging, \d+ s before the predicted heat-up of \d+ s\.$/)
    expect(core.corrections).toEqual([expect.objectContaining({ from: soaking.at, to: new Date(correctedAt).toISOString(), reason: 'Chart recorder shows core at heat 1 s after charge', by: demoUser('metallurgist').displayName })])
    // No door tap: said, not derived; no quench delay measured or judged.
    expect(s.notRecorded).toEqual(['furnace_opened'])
    expect(s.events.map((e: { type: string }) => e.type)).not.toContain('furnace_opened')
    expect(s.measured.heatUp_s).toBe(1)
    expect(s.measured.soak_s).toBe((Date.parse(quenched.at) - correctedAt) / 1000)
    expect(s.measured.quenchDelay_s).toBeNull()
    const heatUp_s = s.predicted.heatUp_s
    expect(s.deviations[0]).toMatchObject({ rule: 'short_heat_up', planned_s: heatUp_s, actual_s: 1, excess_s: heatUp_s - 1 })
    expect(s.deviations.map((d: { rule: string }) => d.rule)).not.toContain('quench_delay')
    expect(record.deviationCount).toBe(s.deviations.length)
    // Predicted moments are marked as such.
    expect(s.events.filter((e: { source: string }) => e.source === 'predicted').map((e: { type: string }) => e.type)).toEqual(['cooling', 'ready_to_handle'])

    const audit = await auditFor(admin, 'batch', batchId)
    const row = audit.find((entry: { action: string }) => entry.action === 'batch.event_corrected')
    expect(row.details).toMatchObject({ recordId, recordHash: record.hash, previousRecordHash: firstHash })

    // The corrected sheet goes to the same recipients, and says what happened.
    const mails = await waitForMail((m) => m.subject.includes(record.loadNumber), 2)
    const sheet = mails.find((m) => m.html.includes('Corrected from'))!
    expect(sheet.html).toContain('Chart recorder shows core at heat 1 s after charge')
    expect(sheet.html).toContain('Out of the furnace (door open): not recorded on the floor; the record does not derive it, so the quench delay is not measured.')
    expect(sheet.html).toContain('data-rule="short_heat_up"')
    expect(sheet.html).toContain('data-source="predicted"')
    expect(sheet.text).toContain('Confirmed early: Core at heat')
  })

  it('clock moves cannot be corrected (409); once the record is signed, no correction (409)', async () => {
    const events = await eventsOf(batchId)
    const cooling = events.find((e) => e.toState === 'cooling')!
    const clock = await correct(metallurgist, batchId, cooling.id, { at: cooling.at, reason: 'Try the clock' })
    expect(clock.status).toBe(409)
    expect(clock.body.statusMessage).toBe('Cooling to handling comes from the plan\'s clock, not a floor tap; only taps can be corrected')

    const approved = await qa.request(`/api/records/${recordId}/approve`, { method: 'POST', body: {} })
    expect(approved.status).toBe(200)
    const charged = events.find((e) => e.toState === 'charged')!
    const refused = await correct(metallurgist, batchId, charged.id, { at: charged.at, reason: 'After sign-off' })
    expect(refused.status).toBe(409)
    expect(refused.body.statusMessage).toBe('The cooldown record of this load is approved; the load takes no more events')
  })
})
