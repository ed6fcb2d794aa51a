/**
 * Cooldown records over HTTP: a plan booked through the API, driven through the floor
 * moves by the operator, the record written on release (snapshot, seal, deviations),
 * QA sign-off and its refusals, tampering in SQL, the mails (sheet, rejection, digest).
 * Expected seconds are computed here by hand from the event times the batch API reports.
 */
import { createHash, createHmac } from 'node:crypto'
import type { Connection } from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { canonicalJson } from '../../server/records/canonical'
import { CURVE_CSV_HEADER } from '../../server/records/sheetCsv'
import { connectTestDb } from '../support/db'
import { anonymous, demoUser, signInAs, signInDemo, type Client } from '../support/http'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { caughtAttachment, caughtMail, waitForMail } from '../support/mailCatcher'
import type { SavedPlan } from '../support/plans'
import { move, quickPlan, releaseLoad, type Released } from '../support/records'
import { BASE_URL, RECORD_SEAL_KEY } from '../support/stackConfig'
import { pause } from '../support/poll'

/** HMAC-SHA-256 under the test stack's seal key, from node:crypto directly. */
const sealOf = (value: unknown) => createHmac('sha256', RECORD_SEAL_KEY).update(canonicalJson(value), 'utf8').digest('hex')

let admin: Client
let metallurgist: Client
let operator: Client
let qa: Client
let lib: LibraryFixture
let db: Connection
const ids: Record<string, number> = {}
async function recordOf(batchId: number, client: Client = qa) {
  const list = await client.request('/api/records?limit=500')
  expect(list.status).toBe(200)
  const item = list.body.find((r: { batchId: number }) => r.batchId === batchId)
  expect(item, `record of batch ${batchId}`).toBeDefined()
  return (await client.request(`/api/records/${item.id}`)).body
}

let clean: Released
let cleanRecord: any
let shortSoak: Released
let shortRecord: any
let late: Released
let lateRecord: any
let cleanPlan: SavedPlan
let latePlan: SavedPlan
let switcher: { id: number; email: string; password: string }

beforeAll(async () => {
  ;[admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
  const people = (await admin.request('/api/users')).body as { id: number; email: string }[]
  for (const role of ['operator', 'qa', 'metallurgist', 'admin'] as const) ids[role] = people.find((p) => p.email === demoUser(role).email)!.id
  lib = await createLibraryFixture(metallurgist)
  cleanPlan = await quickPlan(metallurgist, lib, 60)
  latePlan = await quickPlan(metallurgist, lib, 0)
  db = await connectTestDb()

  // A user who works the floor as an operator and is later made a QA lead.
  switcher = { id: 0, email: `switcher-${Date.now()}@kestrelbay.example`, password: 'Pewter-anvil-71-cascade' }
  const created = await admin.request('/api/users', { method: 'POST', body: { email: switcher.email, displayName: 'Ana Switcher', role: 'operator', password: switcher.password } })
  expect(created.status).toBe(201)
  switcher.id = created.body.id
  const switcherClient = (await signInAs(switcher.email, switcher.password))!

  // Out of the furnace 2.5 s after core at heat (2 s soak planned), quenched at once, within the 60 s allowance.
  clean = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, cleanPlan, 2500)
  cleanRecord = await recordOf(clean.batchId)
  // Out of the furnace at once, confirmed early: the soak is cut short.
  shortSoak = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, cleanPlan, 0)
  shortRecord = await recordOf(shortSoak.batchId)
  // 1 s from the furnace door to the quench against a 0 s allowance; recorded by the future QA lead.
  late = await releaseLoad({ admin, metallurgist, recorder: switcherClient, reader: qa }, latePlan, 3000, { transferWait_ms: 1000 })
  lateRecord = await recordOf(late.batchId)
  expect((await admin.request(`/api/users/${switcher.id}`, { method: 'PATCH', body: { role: 'qa' } })).status).toBe(200)
}, 120_000)

afterAll(async () => {
  await db?.end()
})

describe('the record written on release', () => {
  it('freezes the plan revision with its copied library values, the batch, and the events with who and when', () => {
    const s = cleanRecord.snapshot
    expect(cleanRecord).toMatchObject({ state: 'unsigned', loadNumber: clean.loadNumber, deviationCount: 0, integrity: 'intact', integrityProblems: [] })
    expect(s.batch).toMatchObject({ id: clean.batchId, loadNumber: clean.loadNumber, reference: 'PO-REC', partCount: 24, mass_kg: 320 })
    expect(s.plan).toMatchObject({ planId: cleanPlan.planId, revisionId: cleanPlan.planRevisionId, revision: 1 })
    // tests/support/library.ts: steel k 40, ρ 7850, cₚ 475; water h 3000 (2500–3500) at 30 °C.
    expect(s.plan.spec.library.material).toMatchObject({ k_W_mK: 40, density_kg_m3: 7850, specificHeat_J_kgK: 475 })
    expect(s.plan.spec.library.quenchants).toEqual([
      expect.objectContaining({ id: lib.waterId, hTypical_W_m2K: 3000, hLow_W_m2K: 2500, hHigh_W_m2K: 3500, bath_C: 30 }),
    ])
    expect(s.plan.spec.soak).toMatchObject({ furnace_C: 860, minimumSoak_s: 2 })
    expect(s.predicted).toMatchObject({
      handling_C: 60,
      furnace_C: 860,
      minimumSoak_s: 2,
      quenchDelayAllowance_s: 60,
      // Booked, and so predicted, at the slow end of the quench band; the headline beside it.
      quenchToHandling_s: cleanPlan.summary.slowEndToHandling_s,
      headlineToHandling_s: cleanPlan.summary.quenchToHandling_s,
      handlingBasis: 'safe-to-handle at the slow end of the quench band',
      heatUp_s: cleanPlan.summary.soak!.heatUp_s,
    })
    // 121 points over 1.25 × the booked time to handling: point 96 is that time, by which the headline curve is below
    // the plan's 60 °C; the first is the 850 °C start within the series' truncation at the quench instant.
    const qth = cleanPlan.summary.slowEndToHandling_s!
    expect(qth).toBeGreaterThan(cleanPlan.summary.quenchToHandling_s)
    expect(s.predicted.curve).toHaveLength(121)
    expect(s.predicted.curve[96].t_s).toBeCloseTo(qth, 3)
    expect(s.predicted.curve[96].T_C).toBeLessThan(60)
    expect(Math.abs(s.predicted.curve[0].T_C - 850)).toBeLessThan(1)
    expect(s.predicted.curve.at(-1).T_C).toBeLessThan(60)
    expect(s.predicted.soakEnd).toBe(new Date(clean.at.soaking! + 2000).toISOString())
    expect(s.predicted.handlingAt).toBe(new Date(clean.at.quenched! + Math.round(qth * 1000)).toISOString())

    const operatorName = demoUser('operator').displayName
    const iso = (state: string) => new Date(clean.at[state]!).toISOString()
    const tapped = (type: string, state: string) => ({ type, at: iso(state), by: operatorName, actorId: ids.operator, source: 'recorded' })
    // Out of the quench and ready to handle are the plan's predictions from the recorded quench, marked so.
    const predicted = (type: string, at: number) => ({ type, at: new Date(at).toISOString(), by: 'Slakewise (plan clock)', actorId: null, source: 'predicted', note: 'predicted from the recorded quench and the plan, not recorded on the floor' })
    expect(s.events).toEqual([
      tapped('charged', 'charged'),
      tapped('soaking', 'soaking'),
      tapped('furnace_opened', 'unloaded'),
      tapped('quenched', 'quenched'),
      predicted('cooling', clean.at.quenched! + Math.round(s.predicted.quench_s * 1000)),
      // Ready to handle at the booked, safe moment: the band's slow end, the one the release guard waits for.
      predicted('ready_to_handle', clean.at.quenched! + Math.round(qth * 1000)),
      tapped('released', 'released'),
    ])
    expect(s.notRecorded).toEqual([])
    expect(s.releasedAt).toBe(iso('released'))
    expect(s.releasedBy).toEqual({ id: ids.operator, name: operatorName })
    // Every span from two recorded moments: the door tap starts the quench delay.
    expect(s.measured).toEqual({
      heatUp_s: (clean.at.soaking! - clean.at.charged!) / 1000,
      soak_s: (clean.at.unloaded! - clean.at.soaking!) / 1000,
      quenchDelay_s: (clean.at.quenched! - clean.at.unloaded!) / 1000,
      quenchToRelease_s: (clean.at.released! - clean.at.quenched!) / 1000,
    })
    expect(s.measured.heatUp_s).toBeGreaterThanOrEqual(cleanPlan.summary.soak!.heatUp_s)
    expect(s.deviations).toEqual([])
  })

  it('stores the seal of the snapshot beside it: HMAC-SHA-256 of its canonical JSON under the server key', () => {
    expect(cleanRecord.hash).toMatch(/^[0-9a-f]{64}$/)
    expect(sealOf(cleanRecord.snapshot)).toBe(cleanRecord.hash)
  })

  it('a soak cut short by an early door tap: one short_soak deviation from core at heat to the door, and the tap carries its confirmed shortfall', () => {
    const soak_s = (shortSoak.at.unloaded! - shortSoak.at.soaking!) / 1000
    expect(soak_s).toBeLessThan(2)
    expect(shortRecord.deviationCount).toBe(1)
    expect(shortRecord.snapshot.deviations).toEqual([expect.objectContaining({ rule: 'short_soak', planned_s: 2, actual_s: soak_s, excess_s: 2 - soak_s })])
    expect(shortRecord.snapshot.deviations[0].message).toContain('from core at heat to the load out of the furnace')
    const door = shortRecord.snapshot.events.find((e: { type: string }) => e.type === 'furnace_opened')
    expect(door.shortfall).toMatch(/^Out of the furnace with \d+(\.\d+)? s of the 2 s minimum soak still to run\.$/)
    expect(shortRecord.snapshot.measured.quenchDelay_s).toBe((shortSoak.at.quenched! - shortSoak.at.unloaded!) / 1000)
  })

  it('a slow transfer with a 0 s allowance: one quench_delay deviation of quench − door opening, as the trade means it', () => {
    const delay_s = (late.at.quenched! - late.at.unloaded!) / 1000
    expect(delay_s).toBeGreaterThan(0.9)
    expect(lateRecord.snapshot.deviations).toEqual([expect.objectContaining({ rule: 'quench_delay', planned_s: 0, actual_s: delay_s, excess_s: delay_s })])
    expect(lateRecord.snapshot.measured.soak_s).toBe((late.at.unloaded! - late.at.soaking!) / 1000)
  })

  it('release before the safe-to-handle time (the band’s slow end) is refused (409) and writes no record; the release after it did', async () => {
    // releaseLoad() asserted the early 409; here: exactly one record per released batch.
    const list = (await qa.request('/api/records?limit=500')).body as { batchId: number }[]
    for (const batchId of [clean.batchId, shortSoak.batchId, late.batchId]) expect(list.filter((r) => r.batchId === batchId)).toHaveLength(1)
    expect(clean.at.released! - clean.at.quenched!).toBeGreaterThanOrEqual(Math.round(cleanPlan.summary.slowEndToHandling_s! * 1000))
  })
})

describe('the demo shop', () => {
  it('arrives with sealed records of its released loads (work orders WO-…), intact, one or more with the late quench it seeded', async () => {
    const list = (await qa.request('/api/records?limit=500')).body as { id: number; deviationCount: number }[]
    const demo = []
    for (const item of list) {
      const detail = (await qa.request(`/api/records/${item.id}`)).body
      if (detail.snapshot.batch.reference.startsWith('WO-')) demo.push(detail)
    }
    expect(demo.length).toBeGreaterThan(0)
    for (const record of demo) {
      expect(record.integrity).toBe('intact')
      expect(sealOf(record.snapshot)).toBe(record.hash)
    }
    const late = demo.filter((record) => record.deviationCount > 0)
    expect(late.length).toBeGreaterThan(0)
    for (const record of late) expect(record.snapshot.deviations.map((d: { rule: string }) => d.rule)).toEqual(['quench_delay'])
  })
})

describe('lists and filters', () => {
  it('filters by state, furnace and deviation; sorts by release time', async () => {
    const withDeviation = (await qa.request('/api/records?deviation=yes&limit=500')).body as { batchId: number; deviationCount: number }[]
    expect(withDeviation.every((r) => r.deviationCount > 0)).toBe(true)
    expect(withDeviation.map((r) => r.batchId)).toEqual(expect.arrayContaining([shortSoak.batchId, late.batchId]))
    expect(withDeviation.map((r) => r.batchId)).not.toContain(clean.batchId)
    const byFurnace = (await qa.request(`/api/records?furnaceId=${cleanRecord.furnaceId}`)).body
    expect(byFurnace.map((r: { batchId: number }) => r.batchId)).toEqual([clean.batchId])
    const ascending = (await qa.request('/api/records?sort=releasedAt&dir=asc&limit=500')).body as { releasedAt: string }[]
    expect(ascending.map((r) => r.releasedAt)).toEqual([...ascending.map((r) => r.releasedAt)].sort())
    const bad = await qa.request('/api/records?state=maybe')
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems[0].field).toBe('state')
  })

  it('401 signed out, 403 for operators', async () => {
    expect((await anonymous().request('/api/records')).status).toBe(401)
    expect((await operator.request('/api/records')).status).toBe(403)
    expect((await operator.request(`/api/records/${cleanRecord.id}`)).status).toBe(403)
    expect((await metallurgist.request(`/api/records/${cleanRecord.id}`)).status).toBe(200)
  })
})

describe('the hold-time sheet by e-mail on release', () => {
  it('reaches the QA leads with the load number, the sign-off link, the PDF and the curve CSV', async () => {
    const [mail] = await waitForMail((m) => m.subject.includes(clean.loadNumber), 1)
    expect(mail!.subject).toBe(`Hold-time sheet · Load ${clean.loadNumber} · ${cleanRecord.planName}`)
    expect(mail!.to.map((t) => t.address)).toContain('qa@kestrelbay.example')
    expect(mail!.html).toContain(`Load ${clean.loadNumber}`)
    expect(mail!.html).toContain(`href="${BASE_URL}/records/${cleanRecord.id}"`)
    expect(mail!.text).toContain(`Review and sign the record: ${BASE_URL}/records/${cleanRecord.id}`)
    const files = Object.fromEntries((mail!.attachments ?? []).map((file) => [file.filename, file]))
    expect(Object.keys(files).sort()).toEqual([`cooldown-curve-${clean.loadNumber}.csv`, `hold-time-sheet-${clean.loadNumber}.pdf`])
    const pdf = await caughtAttachment(mail!, files[`hold-time-sheet-${clean.loadNumber}.pdf`]!.generatedFileName)
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(pdf.toString('latin1')).toContain(`(Hold-time sheet, load ${clean.loadNumber})`)
    const csv = (await caughtAttachment(mail!, files[`cooldown-curve-${clean.loadNumber}.csv`]!.generatedFileName)).toString('utf8')
    expect(csv.split('\r\n')[0]).toBe(CURVE_CSV_HEADER)
    const first = cleanRecord.snapshot.predicted.curve[0]
    expect(csv.split('\r\n')[1]).toBe(`0.0,0.00,${first.T_C.toFixed(1)}`)
    expect(csv.trimEnd().split('\r\n')).toHaveLength(1 + cleanRecord.snapshot.predicted.curve.length)

    const [deviating] = await waitForMail((m) => m.subject.includes(late.loadNumber), 1)
    expect(deviating!.subject).toBe(`Hold-time sheet · Load ${late.loadNumber} · ${lateRecord.planName} · 1 deviation`)
    expect(deviating!.html).toContain('data-rule="quench_delay"')
  })
})

describe('sign-off', () => {
  it('operators and metallurgists cannot sign (403); a QA lead who recorded events on the load cannot either, with the reason', async () => {
    for (const client of [operator, metallurgist, admin]) {
      const response = await client.request(`/api/records/${lateRecord.id}/approve`, { method: 'POST', body: {} })
      expect(response.status).toBe(403)
      expect(response.body.statusMessage).toBe('Not allowed for your role')
    }
    const former = (await signInAs(switcher.email, switcher.password))!
    const refused = await former.request(`/api/records/${lateRecord.id}/approve`, { method: 'POST', body: {} })
    expect(refused.status).toBe(403)
    expect(refused.body.statusMessage).toBe('You recorded events on this load (In furnace, Holding at heat, Out of the furnace, Quenching, Released); another QA lead must sign its record')
    const view = (await former.request(`/api/records/${lateRecord.id}`)).body
    expect(view.canSign).toEqual({ ok: false, reason: refused.body.statusMessage })
    expect((await qa.request(`/api/records/${lateRecord.id}`)).body.canSign).toEqual({ ok: true, reason: null })
  })

  it('reject without a comment is 400 naming comment', async () => {
    const response = await qa.request(`/api/records/${lateRecord.id}/reject`, { method: 'POST', body: {} })
    expect(response.status).toBe(400)
    expect(response.body.data.problems).toEqual([{ field: 'comment', message: 'A rejection needs a comment saying why' }])
  })

  it('approve by QA: who, when and the signature sealed over record seal, decision, signer and time; then every change is 409', async () => {
    const approved = await qa.request(`/api/records/${cleanRecord.id}/approve`, { method: 'POST', body: { comment: 'Soak and quench as planned' } })
    expect(approved.status).toBe(200)
    expect(approved.body).toMatchObject({ state: 'approved', signedBy: demoUser('qa').displayName, signComment: 'Soak and quench as planned', integrity: 'intact', hash: cleanRecord.hash })
    expect(approved.body.signatureHash).toBe(sealOf({ decision: 'approved', recordHash: cleanRecord.hash, signedAt: approved.body.signedAt, signerId: ids.qa }))
    expect(Math.abs(Date.parse(approved.body.signedAt) - Date.now())).toBeLessThan(10_000)

    const again = await qa.request(`/api/records/${cleanRecord.id}/approve`, { method: 'POST', body: {} })
    expect(again.status).toBe(409)
    expect(again.body.statusMessage).toBe('This record is already approved; a signed record cannot be changed')
    expect((await qa.request(`/api/records/${cleanRecord.id}/reject`, { method: 'POST', body: { comment: 'Second thoughts' } })).status).toBe(409)
    // The batch of a signed record takes no more events, not even a repeated tap.
    const tap = await move(operator, clean.batchId, 'released')
    expect(tap.status).toBe(409)
    expect(tap.body.statusMessage).toBe('The cooldown record of this load is approved; the load takes no more events')
    expect((await metallurgist.request(`/api/batches/${clean.batchId}/events`, { method: 'POST', body: { to: 'cancelled' } })).status).toBe(409)
  })

  it('reject by QA mails the metallurgist recipients with the comment', async () => {
    const comment = 'Quench delay over the allowance; re-temper and re-test hardness'
    const rejected = await qa.request(`/api/records/${lateRecord.id}/reject`, { method: 'POST', body: { comment } })
    expect(rejected.status).toBe(200)
    expect(rejected.body).toMatchObject({ state: 'rejected', signComment: comment })
    const [mail] = await waitForMail((m) => m.subject === `Cooldown record rejected · Load ${late.loadNumber} · ${lateRecord.planName}`, 1)
    expect(mail!.to.map((t) => t.address)).toContain('metallurgist@kestrelbay.example')
    expect(mail!.html).toContain(comment)
    expect(mail!.text).toContain(`Comment: ${comment}`)
    expect(mail!.text).toContain(`${BASE_URL}/records/${lateRecord.id}`)
  })

  it('a snapshot altered in SQL shows as altered and can no longer be signed; so does a sign-off altered in SQL', async () => {
    await db.query('UPDATE cooldown_records SET snapshot = JSON_SET(snapshot, \'$.batch.partCount\', 23) WHERE id = ?', [shortRecord.id])
    const altered = (await qa.request(`/api/records/${shortRecord.id}`)).body
    expect(altered.integrity).toBe('altered')
    expect(altered.integrityProblems).toEqual(['The snapshot no longer matches the seal written at release'])
    expect(altered.snapshot.batch.partCount).toBe(23)
    // Re-hashing the altered snapshot in SQL without the key does not make it intact.
    const rehashed = createHash('sha256').update(canonicalJson(altered.snapshot), 'utf8').digest('hex')
    await db.query('UPDATE cooldown_records SET hash = ? WHERE id = ?', [rehashed, shortRecord.id])
    const stillAltered = (await qa.request(`/api/records/${shortRecord.id}`)).body
    expect(stillAltered).toMatchObject({ hash: rehashed, integrity: 'altered', integrityProblems: ['The snapshot no longer matches the seal written at release'] })
    const sign = await qa.request(`/api/records/${shortRecord.id}/approve`, { method: 'POST', body: {} })
    expect(sign.status).toBe(409)
    expect(sign.body.statusMessage).toBe('This record was altered after it was written; it cannot be signed')

    await db.query('UPDATE cooldown_records SET sign_comment = \'fine\', state = \'approved\' WHERE id = ?', [lateRecord.id])
    const forged = (await qa.request(`/api/records/${lateRecord.id}`)).body
    expect(forged.integrity).toBe('altered')
    expect(forged.integrityProblems).toEqual(['The sign-off no longer matches its signature'])
    const listed = (await qa.request('/api/records?limit=500')).body.find((r: { id: number }) => r.id === lateRecord.id)
    expect(listed.state).toBe('approved')
  })

  it('every sign-off action is in the audit trail', async () => {
    const audit = (await admin.request('/api/audit?entityType=cooldown_record&limit=500')).body as { action: string; entityId: string; actorId: number; details: any }[]
    const of = (id: number) => audit.filter((row) => row.entityId === String(id)).map((row) => [row.action, row.actorId]).reverse()
    expect(of(cleanRecord.id)).toEqual([
      ['record.create', ids.operator],
      ['record.approve', ids.qa],
      ['record.approve_refused', ids.qa],
      ['record.reject_refused', ids.qa],
    ])
    expect(of(lateRecord.id)).toEqual([
      ['record.create', switcher.id],
      ['record.approve_refused', switcher.id],
      ['record.reject', ids.qa],
    ])
    expect(of(shortRecord.id)).toEqual([['record.create', ids.operator], ['record.approve_refused', ids.qa]])
    const create = audit.find((row) => row.entityId === String(cleanRecord.id) && row.action === 'record.create')!
    expect(create.details).toMatchObject({ loadNumber: clean.loadNumber, hash: cleanRecord.hash, deviations: [] })
  })
})

describe('the daily digest', () => {
  it('lists an unsigned record older than a day, once per day', async () => {
    await db.query('UPDATE cooldown_records SET created_at = NOW(3) - INTERVAL 2 DAY WHERE id = ?', [shortRecord.id])
    const day = new Date().toISOString().slice(0, 10)
    expect((await qa.request('/api/records/digest', { method: 'POST' })).status).toBe(403)
    const first = await admin.request('/api/records/digest', { method: 'POST' })
    expect(first.status).toBe(201)
    expect(first.body).toMatchObject({ dedupeKey: `digest:${day}`, queued: true, created: true })
    expect(first.body.records).toEqual([{ id: shortRecord.id, loadNumber: shortSoak.loadNumber, releasedAt: shortRecord.releasedAt }])
    expect(first.body.to).toContain('qa@kestrelbay.example')
    const second = await admin.request('/api/records/digest', { method: 'POST' })
    expect(second.status).toBe(200)
    expect(second.body).toMatchObject({ created: false, outboxId: first.body.outboxId })

    const subject = `Records waiting for sign-off · ${day} · 1`
    const [mail] = await waitForMail((m) => m.subject === subject, 1)
    expect(mail!.html).toContain(`data-load="${shortSoak.loadNumber}"`)
    expect(mail!.text.split(shortSoak.loadNumber)).toHaveLength(2)
    await pause(1500)
    expect((await caughtMail()).filter((m) => m.subject.startsWith(`Records waiting for sign-off · ${day}`))).toHaveLength(1)
  })
})
