import { beforeAll, describe, expect, it } from 'vitest'
import { auditFor } from '../support/audit'
import { runCase } from '../../server/thermal/runCase'
import { signInDemo, type Client } from '../support/http'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { PIN_HEAT_UP_CASE, PIN_QUENCH_SLOW_END_CASE, pinSpec, savePlan, type SavedPlan } from '../support/plans'
import { booking, createLine } from '../support/schedule'
import { move } from '../support/records'

let admin: Client
let metallurgist: Client
let operator: Client
let qa: Client
let lib: LibraryFixture
let pin: SavedPlan
const HOUR = 3600_000
// The engine's own answers for the pin plan, called on the same pin written by hand, for comparison with what the server derives.
const heatUp_s = runCase(PIN_HEAT_UP_CASE).targetTime_s!
// Safe to handle is booked at the slow end of the quench band (every medium at its low coefficient) by default.
const quenchToHandling_s = runCase(PIN_QUENCH_SLOW_END_CASE).targetTime_s!
const furnace_ms = (heatUp_s + 1800) * 1000

/** A far-future day per test, so tests never share time on a line. */
let day = 0
const futureDay = () => Date.UTC(2032, 0, 1) + (day += 3) * 24 * HOUR + Math.floor(Math.random() * 1000) * 7 * 24 * HOUR

beforeAll(async () => {
  ;[admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
  lib = await createLibraryFixture(metallurgist)
  pin = await savePlan(metallurgist, pinSpec(lib))
})

describe('booking', () => {
  it('books a revision: load number, slots from the summary (heat-up + 1800 s soak, 60 s transfer, 180 s bath, engine time to handling at the band’s slow end)', async () => {
    const line = await createLine(admin)
    const charge = futureDay()
    const response = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge, 'Customer 7731') })
    expect(response.status).toBe(201)
    const b = response.body
    expect(b.loadNumber).toMatch(new RegExp(`^KB-${new Date(charge).getUTCFullYear()}-\\d{5}$`))
    expect(b).toMatchObject({ state: 'planned', furnaceStart: charge, plannedCharge: charge, reference: 'Customer 7731', partCount: 24, mass_kg: 320, conflictWith: null })
    expect(Math.abs(b.furnaceEnd - (charge + furnace_ms))).toBeLessThanOrEqual(1)
    expect(b.quenchStart - b.furnaceEnd).toBe(60_000)
    expect(b.quenchEnd - b.quenchStart).toBe(180_000)
    expect(Math.abs(b.handlingAt - b.quenchStart - quenchToHandling_s * 1000)).toBeLessThanOrEqual(1)

    const detail = await qa.request(`/api/batches/${b.id}`)
    expect(detail.status).toBe(200)
    expect(detail.body.events).toEqual([expect.objectContaining({ fromState: 'planned', toState: 'planned', actorName: 'Mira Okonkwo' })])
    const week = await qa.request(`/api/batches?from=${new Date(charge - HOUR).toISOString()}&to=${new Date(charge + 24 * HOUR).toISOString()}&furnaceId=${line.furnace.id}`)
    expect(week.body.batches.map((x: { loadNumber: string }) => x.loadNumber)).toEqual([b.loadNumber])
  })

  it('refuses an overlapping booking with 409 naming the colliding load and proposing its end as the next free start', async () => {
    const line = await createLine(admin)
    const charge = futureDay()
    const first = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge) })
    const clash = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge + 20 * 60_000) })
    expect(clash.status).toBe(409)
    expect(clash.body.statusMessage).toBe(`${line.furnace.name} is taken by ${first.body.loadNumber}`)
    expect(clash.body.data.collidesWith).toEqual({ id: first.body.id, loadNumber: first.body.loadNumber, resource: 'furnace' })
    // The furnace frees at a moment with milliseconds; the offer is the next whole second, so it books as typed.
    const offered = clash.body.data.nextFreeStart as string
    expect(Date.parse(offered)).toBe(Math.ceil(first.body.furnaceEnd / 1000) * 1000)
    expect(offered).toMatch(/:\d\d\.000Z$/)
    expect(clash.body.data.problems).toEqual([{ field: 'plannedCharge', message: `${line.furnace.name} is taken by ${first.body.loadNumber}; the next free charge time is ${offered.slice(0, 19).replace('T', ' ')} UTC` }])
    const retry = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, Date.parse(clash.body.data.nextFreeStart)) })
    expect(retry.status).toBe(201)
  })

  it('20 concurrent conflicting bookings on one furnace: exactly one wins, the rest name it', async () => {
    const line = await createLine(admin)
    const charge = futureDay()
    const results = await Promise.all(
      Array.from({ length: 20 }, (_, i) => metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge + i * 60_000, `Race ${i}`) })),
    )
    const winners = results.filter((r) => r.status === 201)
    expect(winners).toHaveLength(1)
    const losers = results.filter((r) => r.status === 409)
    expect(losers).toHaveLength(19)
    for (const loser of losers) expect(loser.body.data.collidesWith.loadNumber).toBe(winners[0]!.body.loadNumber)
    const stored = await qa.request(`/api/batches?from=${new Date(charge - HOUR).toISOString()}&to=${new Date(charge + 48 * HOUR).toISOString()}&furnaceId=${line.furnace.id}`)
    expect(stored.body.batches).toHaveLength(1)
  })

  it('a station shared by two furnaces is also never double-booked', async () => {
    const a = await createLine(admin)
    const b = await admin.request('/api/furnaces', { method: 'POST', body: { name: `Shared ${Date.now().toString(36)}`, kind: 'box', maxTemp_C: 1100, capacity_kg: 1000, zoneWidth_mm: 500, zoneDepth_mm: 500, zoneHeight_mm: 500, stationIds: [a.station.id] } })
    const charge = futureDay()
    const first = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, a, charge) })
    const second = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, { furnace: b.body, station: a.station }, charge + 60_000) })
    expect(second.status).toBe(409)
    expect(second.body.data.collidesWith).toMatchObject({ loadNumber: first.body.loadNumber, resource: 'station' })
    // The bath must start when the first bath ends: start = bath end − (furnace time + transfer).
    const firstFreeCharge = first.body.quenchEnd - (first.body.quenchStart - first.body.furnaceStart)
    expect(Date.parse(second.body.data.nextFreeStart)).toBe(Math.ceil(firstFreeCharge / 1000) * 1000)
  })

  it('400 naming each missing or wrong field, 422 for a station that does not serve the furnace, 403 for operators', async () => {
    const bad = await metallurgist.request('/api/batches', { method: 'POST', body: { furnaceId: 'one', partCount: 0, mass_kg: -1, plannedCharge: 'tomorrow' } })
    expect(bad.status).toBe(400)
    const fields = bad.body.data.problems.map((p: { field: string }) => p.field)
    expect(fields).toEqual(expect.arrayContaining(['planRevisionId', 'furnaceId', 'stationId', 'plannedCharge', 'partCount', 'mass_kg', 'reference']))
    const a = await createLine(admin)
    const other = await createLine(admin)
    const wrong = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, { furnace: a.furnace, station: other.station }, futureDay()) })
    expect(wrong.status).toBe(422)
    expect(wrong.body.data.problems[0].field).toBe('stationId')
    expect((await operator.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, a, futureDay()) })).status).toBe(403)
  })
})

describe('bookings the floor can run', () => {
  it('refuses a station that does not hold the plan\'s quench medium, naming both, and writes nothing', async () => {
    const line = await createLine(admin, 'Kind', 'polymer')
    const oil = (await metallurgist.request(`/api/quenchants/${lib.oilId}`)).body as { name: string }
    const at = futureDay()
    const refused = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, at) })
    expect(refused.status).toBe(422)
    expect(refused.body.statusMessage).toBe('Quench station does not fit the plan')
    expect(refused.body.data.problems).toEqual([{ field: 'stationId', message: `${line.station.name} is a polymer solution station; the plan quenches in ${oil.name} (oil)` }])
    const none = await qa.request(`/api/batches?from=${new Date(at - HOUR).toISOString()}&to=${new Date(at + 24 * HOUR).toISOString()}&furnaceId=${line.furnace.id}`)
    expect(none.body.batches).toEqual([])
  })

  it('the booking form\'s plan list marks each plan\'s latest revision and names its quench medium', async () => {
    const plan = await savePlan(metallurgist, pinSpec(lib))
    const revised = await metallurgist.request(`/api/plans/${plan.planId}/revisions`, { method: 'POST', body: { ...pinSpec(lib), note: 'Longer soak' } })
    expect(revised.status).toBe(201)
    const options = (await metallurgist.request('/api/schedule/plan-revisions')).body as { planRevisionId: number; revision: number; latest: boolean; quenchKind: string }[]
    const mine = options.filter((o) => o.planRevisionId === plan.planRevisionId || o.planRevisionId === revised.body.planRevisionId)
    expect(mine.map((o) => [o.revision, o.latest, o.quenchKind])).toEqual([[2, true, 'oil'], [1, false, 'oil']])
  })

  it('moves a booked load to another time and furnace with the same checks; a charged load no longer moves', async () => {
    const line = await createLine(admin, 'Move')
    const other = await createLine(admin, 'Move')
    const charge = futureDay()
    const a = (await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge, 'Move A') })).body
    const b = (await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge + 6 * HOUR, 'Move B') })).body
    const place = (target: typeof line, at: number) => ({
      furnaceId: target.furnace.id,
      stationId: target.station.id,
      plannedCharge: new Date(at).toISOString(),
    })

    // Onto B's time on the same line: refused like a booking, with a whole-second offer after B.
    const clash = await metallurgist.request(`/api/batches/${a.id}`, { method: 'PATCH', body: place(line, charge + 6 * HOUR + 60_000) })
    expect(clash.status).toBe(409)
    expect(clash.body.data.collidesWith.loadNumber).toBe(b.loadNumber)
    expect(Date.parse(clash.body.data.nextFreeStart)).toBe(Math.ceil(b.furnaceEnd / 1000) * 1000)
    // A move within its own old slot never collides with itself.
    const later = await metallurgist.request(`/api/batches/${a.id}`, { method: 'PATCH', body: place(line, charge + 10 * 60_000) })
    expect(later.status).toBe(200)
    expect(later.body).toMatchObject({ id: a.id, loadNumber: a.loadNumber, plannedCharge: charge + 10 * 60_000, furnaceStart: charge + 10 * 60_000 })
    expect(later.body.furnaceEnd - later.body.furnaceStart).toBe(a.furnaceEnd - a.furnaceStart)

    const moved = await metallurgist.request(`/api/batches/${a.id}`, { method: 'PATCH', body: place(other, charge + HOUR) })
    expect(moved.status).toBe(200)
    expect(moved.body).toMatchObject({ furnaceId: other.furnace.id, stationId: other.station.id, furnaceStart: charge + HOUR })
    const audit = await auditFor(admin, 'batch', a.id)
    expect(audit[0]).toMatchObject({ action: 'batch.move', details: { loadNumber: a.loadNumber, to: { furnace: other.furnace.name, station: other.station.name, plannedCharge: new Date(charge + HOUR).toISOString() } } })

    expect((await operator.request(`/api/batches/${a.id}`, { method: 'PATCH', body: place(line, charge) })).status).toBe(403)
    const bad = await metallurgist.request(`/api/batches/${a.id}`, { method: 'PATCH', body: { furnaceId: other.furnace.id, stationId: other.station.id, plannedCharge: 'soon' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems.map((p: { field: string }) => p.field)).toEqual(['plannedCharge'])
    expect((await move(operator, b.id, 'charged')).status).toBe(201)
    const charged = await metallurgist.request(`/api/batches/${b.id}`, { method: 'PATCH', body: place(other, charge + 9 * HOUR) })
    expect(charged.status).toBe(409)
    expect(charged.body.statusMessage).toBe(`Only a booked load can be moved; ${b.loadNumber} is In furnace`)
    expect((await metallurgist.request('/api/batches/99999999', { method: 'PATCH', body: place(other, charge) })).status).toBe(404)
  })
})

describe('the plan\'s quench-delay allowance', () => {
  it('a plan that sets one books with it (including 0 s); a plan that leaves it unset (null) books with the shop\'s', async () => {
    const shop = (await admin.request('/api/schedule/settings')).body.quenchDelayAllowance_s
    expect(shop).toBeGreaterThan(0)
    for (const [allowance, expected] of [[240, 240], [0, 0], [null, shop]] as const) {
      const plan = await savePlan(metallurgist, { ...pinSpec(lib), quenchDelayAllowance_s: allowance })
      const line = await createLine(admin)
      const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, futureDay()) })
      expect(booked.status).toBe(201)
      const detail = (await qa.request(`/api/batches/${booked.body.id}`)).body
      expect(detail.durations.quenchDelayAllowance_s, `plan allowance ${allowance}`).toBe(expected)
    }
  })
})

describe('state moves on the floor', () => {
  it('only in order, only by the allowed roles; a repeated tap changes nothing; backwards is refused', async () => {
    const line = await createLine(admin)
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, futureDay()) })
    const moveBooked = (client: Client, to: string, acknowledge?: boolean) => move(client, booked.body.id, to, acknowledge)

    const skipped = await moveBooked(operator, 'quenched')
    expect(skipped.status).toBe(409)
    expect(skipped.body.data).toEqual({ currentState: 'planned', requestedState: 'quenched' })
    expect(skipped.body.statusMessage).toBe('The load is Booked; it cannot move to Quenching')
    const watcher = await moveBooked(metallurgist, 'charged')
    expect(watcher.status).toBe(403)
    expect(watcher.body.statusMessage).toBe('The Metallurgist role cannot record In furnace')
    expect((await moveBooked(qa, 'charged')).status).toBe(403)
    expect((await moveBooked(operator, 'cancelled')).status).toBe(403)

    const before = Date.now()
    const charged = await moveBooked(operator, 'charged')
    expect(charged.status).toBe(201)
    expect(charged.body.batch.state).toBe('charged')
    expect(charged.body.batch.chargedAt).toBeGreaterThanOrEqual(before - 1000)
    expect(charged.body.batch.chargedAt).toBeLessThanOrEqual(Date.now() + 1000)
    const again = await moveBooked(operator, 'charged')
    expect(again.status).toBe(200)
    expect(again.body).toMatchObject({ repeated: true, batch: { chargedAt: charged.body.batch.chargedAt } })

    // Core at heat at once is before the predicted heat-up: refused until confirmed a second time.
    const early = await moveBooked(operator, 'soaking')
    expect(early.status).toBe(409)
    expect(early.body.data.shortfall.rule).toBe('early_core_at_heat')
    expect(early.body.data.shortfall.short_s).toBeGreaterThan(heatUp_s - 5)
    expect(early.body.statusMessage).toMatch(/^Core at heat \d+ s after charging, .+ before the predicted heat-up of .+\. Confirm again to record it anyway\.$/)
    expect((await moveBooked(operator, 'soaking', true)).status).toBe(201)
    const back = await moveBooked(operator, 'charged')
    expect(back.status).toBe(409)
    expect(back.body.data).toEqual({ currentState: 'soaking', requestedState: 'charged' })
    expect((await moveBooked(operator, 'planned')).status).toBe(409)
    expect((await moveBooked(admin, 'ready')).status).toBe(409)
    expect((await moveBooked(operator, 'released')).status).toBe(409)

    const detail = await qa.request(`/api/batches/${booked.body.id}`)
    expect(detail.body.events.map((e: { toState: string; actorName: string }) => [e.toState, e.actorName])).toEqual([
      ['planned', 'Mira Okonkwo'],
      ['charged', 'Tomas Vidal'],
      ['soaking', 'Tomas Vidal'],
    ])
    expect(detail.body.events[2].shortfallNote).toMatch(/^Core at heat \d+ s after charging/)
    const audit = await auditFor(admin, 'batch', booked.body.id)
    expect(audit.map((e: { action: string }) => e.action).sort()).toEqual(['batch.book', 'batch.charged', 'batch.soaking'])
    expect(audit.find((e: { action: string }) => e.action === 'batch.soaking').details.shortfall).toBe(detail.body.events[2].shortfallNote)
  })

  it('the door tap: out of the furnace early asks for confirmation; it ends the furnace time and starts the quench allowance', async () => {
    const line = await createLine(admin)
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, futureDay()) })
    const id = booked.body.id
    expect((await move(operator, id, 'charged')).status).toBe(201)
    expect((await move(operator, id, 'soaking', true)).status).toBe(201)
    // The pin's minimum soak is 1800 s: a door tap now is about 30 min early (shown to the whole second).
    const early = await move(operator, id, 'unloaded')
    expect(early.status).toBe(409)
    expect(early.body.data.shortfall).toMatchObject({ rule: 'early_out_of_soak' })
    expect(early.body.data.shortfall.short_s).toBeGreaterThan(1790)
    expect(early.body.data.shortfall.message).toMatch(/^Out of the furnace with (29 min \d\d|30 min 00) s of the 30 min 00 s minimum soak still to run\.$/)
    expect((await qa.request(`/api/batches/${id}`)).body.state).toBe('soaking')
    const out = await move(operator, id, 'unloaded', true)
    expect(out.status).toBe(201)
    expect(out.body.batch).toMatchObject({ state: 'unloaded' })
    expect(out.body.batch.furnaceEnd).toBe(out.body.batch.unloadedAt)
    // Predicted quench start: the door plus the booked 60 s transfer.
    expect(out.body.batch.quenchStart - out.body.batch.unloadedAt).toBe(60_000)
    const quenched = await move(operator, id, 'quenched')
    expect(quenched.status).toBe(201)
    expect(quenched.body.batch.furnaceEnd).toBe(out.body.batch.unloadedAt)
    expect(quenched.body.batch.quenchStart).toBe(quenched.body.batch.quenchedAt)
  })

  it('a quench straight from soak (door tap missed) is still recorded, guarded against the minimum soak', async () => {
    const line = await createLine(admin)
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, futureDay()) })
    const id = booked.body.id
    await move(operator, id, 'charged')
    await move(operator, id, 'soaking', true)
    const early = await move(operator, id, 'quenched')
    expect(early.status).toBe(409)
    expect(early.body.data.shortfall.message).toMatch(/^Quench started with (29 min \d\d|30 min 00) s of the 30 min 00 s minimum soak still to run\.$/)
    const quenched = await move(operator, id, 'quenched', true)
    expect(quenched.status).toBe(201)
    expect(quenched.body.batch.unloadedAt).toBeNull()
  })

  it('acknowledgeShortfall must be a boolean (400 naming the field)', async () => {
    const bad = await operator.request('/api/batches/1/events', { method: 'POST', body: { to: 'charged', acknowledgeShortfall: 'yes' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems).toEqual([{ field: 'acknowledgeShortfall', message: 'acknowledgeShortfall must be true or false' }])
  })

  it('a late charge moves the later slots and flags the next booking on the furnace; withdrawing the late load clears the flag', async () => {
    const line = await createLine(admin)
    const plannedA = Date.now() - 30 * 60_000
    const a = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, plannedA, 'Early') })
    expect(a.status).toBe(201)
    const b = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, a.body.furnaceEnd + 5 * 60_000, 'Next') })
    expect(b.status).toBe(201)

    const charged = await move(operator, a.body.id, 'charged')
    expect(charged.status).toBe(201)
    const moved = charged.body.batch
    expect(moved.furnaceStart).toBe(moved.chargedAt)
    expect(moved.chargedAt - plannedA).toBeGreaterThan(29 * 60_000)
    expect(Math.abs(moved.furnaceEnd - (moved.chargedAt + furnace_ms))).toBeLessThanOrEqual(1)
    expect(moved.quenchStart - moved.furnaceEnd).toBe(60_000)
    expect(Math.abs(moved.handlingAt - moved.quenchStart - quenchToHandling_s * 1000)).toBeLessThanOrEqual(1)

    const next = (await qa.request(`/api/batches/${b.body.id}`)).body
    expect(next.conflictWith).toBe(a.body.loadNumber)
    expect(next.conflictNote).toContain(`Furnace still holds ${a.body.loadNumber}`)
    expect(next.furnaceStart).toBe(b.body.furnaceStart)

    const withdrawn = await move(metallurgist, a.body.id, 'cancelled')
    expect(withdrawn.status).toBe(201)
    expect((await qa.request(`/api/batches/${b.body.id}`)).body.conflictWith).toBeNull()
  })
})
