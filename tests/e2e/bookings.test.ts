import { beforeAll, describe, expect, it } from 'vitest'
import { signInDemo, type Client } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser, type ViewportName } from '../support/browser'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { pinSpec, savePlan, type SavedPlan } from '../support/plans'
import { booking, createLine } from '../support/schedule'

const browser = useBrowser()
const HOUR = 3600_000
let admin: Client
let metallurgist: Client
let lib: LibraryFixture
let plan: SavedPlan
beforeAll(async () => {
  ;[admin, metallurgist] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist')])
  lib = await createLibraryFixture(metallurgist)
  plan = await savePlan(metallurgist, pinSpec(lib))
})

describe('moving a booked load', () => {
  it.each(['tablet', 'desktop'] as ViewportName[])('at the %s size: a clash offers the next free start in local time to the second, which then books; a furnace without stations says why', async (viewport) => {
    const line = await createLine(admin, 'Move page')
    const bare = await admin.request('/api/furnaces', { method: 'POST', body: { name: `Bare ${Date.now().toString(36)}`, kind: 'box', maxTemp_C: 1100, capacity_kg: 1000, zoneWidth_mm: 600, zoneDepth_mm: 900, zoneHeight_mm: 600, stationIds: [] } })
    const charge = Date.UTC(2034, 0, 1) + Math.floor(Math.random() * 5000) * 24 * HOUR
    const a = (await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, charge, 'Move me') })).body
    const b = (await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, charge + 6 * HOUR, 'In the way') })).body

    const page = await browser.pageAt(viewport)
    await signInThroughPage(page, 'metallurgist', `/schedule/${a.id}`)
    await page.getByTestId('move-load').click()
    const form = page.getByTestId('booking-form')
    await form.getByLabel('Furnace').selectOption(String(bare.body.id))
    expect(await form.getByTestId('no-station-reason').textContent()).toBe(`${bare.body.name} serves no quench station: an administrator links stations to it under Furnaces.`)
    await form.getByLabel('Furnace').selectOption(String(line.furnace.id))

    // Onto B's charge time: refused, with B's end (rounded up to the second) offered in the reader's own time.
    const localInput = (ms: number) => page.evaluate((t) => new Date(t - new Date(t).getTimezoneOffset() * 60_000).toISOString().slice(0, 19), ms)
    await form.getByLabel('Charge time').fill(await localInput(b.plannedCharge))
    await form.getByRole('button', { name: 'Move load' }).click()
    const offered = Math.ceil(b.furnaceEnd / 1000) * 1000
    const offeredText = await page.evaluate((t) => new Date(t).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'medium' }), offered)
    await expect(form.getByTestId('charge-problem').textContent()).resolves.toBe(`${line.furnace.name} is taken by ${b.loadNumber}; the next free charge time is ${offeredText}.`)
    expect(await form.getByTestId('booking-problem').count()).toBe(0)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/move-clash-${viewport}.png` })
    await form.getByTestId('use-next-free').click()
    expect(await form.getByLabel('Charge time').inputValue()).toBe(await localInput(offered))
    await form.getByRole('button', { name: 'Move load' }).click()
    await form.waitFor({ state: 'detached' })

    const moved = (await metallurgist.request(`/api/batches/${a.id}`)).body
    expect(moved).toMatchObject({ plannedCharge: offered, furnaceStart: offered, furnaceId: line.furnace.id, state: 'planned' })
    await page.context().close()
  })
})
