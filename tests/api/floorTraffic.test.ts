import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BASE_URL } from '../support/stackConfig'
import { anonymous, signInDemo, type Client } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { pinSpec, savePlan, type SavedPlan } from '../support/plans'
import { booking, createLine } from '../support/schedule'
import { pointValue } from '../../shared/pointSeries'

let admin: Client
let metallurgist: Client
let operator: Client
let pin: SavedPlan
const booked: number[] = []
const lines: Awaited<ReturnType<typeof createLine>>[] = []
const CARDS = 40

/** A raw GET with the operator's session, so headers and bytes can be read as sent. */
const get = (path: string, headers: Record<string, string> = {}) => fetch(`${BASE_URL}${path}`, { headers: { cookie: operator.cookie, accept: 'application/json', ...headers } })

beforeAll(async () => {
  ;[admin, metallurgist, operator] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator')])
  pin = await savePlan(metallurgist, pinSpec(await createLibraryFixture(metallurgist)))
  // 40 loads due within the floor's 12 hours: eight lines, five loads each back to back.
  for (let l = 0; l < CARDS / 5; l++) {
    const line = await createLine(admin, 'Floor')
    lines.push(line)
    let charge = Date.now() + 10 * 60_000
    for (let k = 0; k < 5; k++) {
      const response = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, charge, `WO-FLOOR-${l}-${k}`) })
      if (response.status !== 201) throw new Error(`booking: ${response.status} ${JSON.stringify(response.body)}`)
      booked.push(response.body.id)
      charge = response.body.furnaceEnd + 5 * 60_000
    }
  }
}, 120_000)

afterAll(async () => {
  // Withdrawn loads leave the floor, so the browser tests see the floor they expect.
  for (const id of booked) await metallurgist.request(`/api/batches/${id}/events`, { method: 'POST', body: { to: 'cancelled' } })
})

describe('the floor poll', () => {
  it(`sends card data only: under 20 kB for ${CARDS} cards, no curves`, async () => {
    const response = await get('/api/floor')
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toBe('application/json')
    const text = await response.text()
    const floor = JSON.parse(text)
    // The route writes this JSON itself, clock first, the same clock as in the header.
    expect(Object.keys(floor)).toEqual(['serverNow', 'settings', 'plans', 'batches'])
    expect(floor.serverNow).toBe(Number(response.headers.get('x-server-now')))
    const ours = floor.batches.filter((b: { id: number }) => booked.includes(b.id))
    expect(ours).toHaveLength(CARDS)
    expect(text).not.toContain('handlingPointSeries')
    expect(floor.plans[pin.planRevisionId].handling_C).toBe(pin.summary.handling_C)
    expect(ours[0]).not.toHaveProperty('planName')
    expect(ours[0]).not.toHaveProperty('flags')
    // Other tests' loads may share the floor: the figure is per card, scaled to 40.
    const perCard = Buffer.byteLength(text) / floor.batches.length
    expect(perCard * CARDS).toBeLessThan(20_000)
  })

  it('a tablet at one furnace gets that furnace\'s five loads alone, in charge order', async () => {
    const line = lines[3]!
    const response = await get(`/api/floor?furnaceId=${line.furnace.id}`)
    expect(response.status).toBe(200)
    const floor = (await response.json()) as { batches: { id: number; furnaceName: string; furnaceStart: number }[] }
    expect(floor.batches.map((b) => b.id)).toEqual(booked.slice(15, 20))
    expect(new Set(floor.batches.map((b) => b.furnaceName))).toEqual(new Set([line.furnace.name]))
    const starts = floor.batches.map((b) => b.furnaceStart)
    expect(starts).toEqual([...starts].sort((a, b) => a - b))
  })

  it('leaves off a load charged more than 12 hours ahead', async () => {
    const line = await createLine(admin, 'Floor later')
    const later = await metallurgist.request('/api/batches', { method: 'POST', body: booking(pin.planRevisionId, line, Date.now() + 13 * 3600_000, 'WO-FLOOR-LATER') })
    expect(later.status).toBe(201)
    const floor = (await (await get(`/api/floor?furnaceId=${line.furnace.id}`)).json()) as { batches: unknown[] }
    expect(floor.batches).toEqual([])
    expect((await metallurgist.request(`/api/batches/${later.body.id}/events`, { method: 'POST', body: { to: 'cancelled' } })).status).toBe(201)
  })

  it('answers 304 with no body while nothing changed, with the server clock in a header; a change gives a new ETag', async () => {
    const first = await get('/api/floor')
    const tag = first.headers.get('etag')
    expect(tag).toMatch(/^W\/".+"$/)
    expect(first.headers.get('cache-control')).toContain('no-cache')
    const before = Date.now()
    const again = await get('/api/floor', { 'if-none-match': tag! })
    expect(again.status).toBe(304)
    expect(await again.text()).toBe('')
    expect(Math.abs(Number(again.headers.get('x-server-now')) - before)).toBeLessThan(5000)

    // Withdrawing one of our loads changes the cards.
    const last = booked.pop()!
    expect((await metallurgist.request(`/api/batches/${last}/events`, { method: 'POST', body: { to: 'cancelled' } })).status).toBe(201)
    const changed = await get('/api/floor', { 'if-none-match': tag! })
    expect(changed.status).toBe(200)
    expect(changed.headers.get('etag')).not.toBe(tag)
  })

  it('sends the curves once per plan revision: the same series the plan saved', async () => {
    const response = await get(`/api/floor/curves?ids=${pin.planRevisionId}`)
    expect(response.status).toBe(200)
    expect(response.headers.get('cache-control')).toContain('immutable')
    const curves = await response.json()
    expect(curves).toHaveLength(1)
    expect(curves[0].planRevisionId).toBe(pin.planRevisionId)
    // The saved series crosses the handling temperature at the saved quench-to-handling time.
    expect(pointValue(curves[0].handlingPointSeries, pin.summary.quenchToHandling_s)).toBeCloseTo(pin.summary.handling_C, 6)
  })

  it('400 naming ids for a bad list; 401 without a session; 403 for a role without the floor', async () => {
    const bad = await operator.request('/api/floor/curves?ids=3,x')
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems).toEqual([{ field: 'ids', message: 'ids must list plan revision ids separated by commas' }])
    expect((await operator.request('/api/floor/curves')).status).toBe(400)
    expect((await anonymous().request('/api/floor/curves?ids=1')).status).toBe(401)
    const qa = await signInDemo('qa')
    expect((await qa.request('/api/floor/curves?ids=1')).status).toBe(403)
  })
})
