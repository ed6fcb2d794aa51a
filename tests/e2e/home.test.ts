import { beforeAll, describe, expect, it } from 'vitest'
import type { FloorPoll } from '../../shared/types/schedule'
import { signInDemo, type Client } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { createLibraryFixture } from '../support/library'
import { pinSpec, savePlan } from '../support/plans'
import { booking, createLine } from '../support/schedule'
import { quickPlan, releaseLoad } from '../support/records'

const browser = useBrowser()
let admin: Client
let metallurgist: Client
beforeAll(async () => {
  ;[admin, metallurgist] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist')])
})

const HOUR = 3600_000

describe('the shift overview per role', () => {
  it('a metallurgist sees a plan just saved at the top of recent plans and a load booked for later today with its plan and furnace', async () => {
    const plan = await savePlan(metallurgist, pinSpec(await createLibraryFixture(metallurgist)))
    const saved = (await metallurgist.request(`/api/plans/${plan.planId}`)).body
    const line = await createLine(admin, 'Shift')
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 2 * HOUR, 'Shift overview') })
    expect(booked.status).toBe(201)

    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist')
    const recent = page.getByTestId('shift-recent-plans').getByRole('listitem')
    expect((await recent.first().textContent())!).toContain(saved.name)
    const row = page.getByTestId('shift-bookings').locator(`tr[data-load="${booked.body.loadNumber}"]`)
    const cells = (await row.getByRole('cell').allTextContents()).map((text) => text.trim())
    expect(cells.slice(0, 3)).toEqual([booked.body.loadNumber, `${saved.name} (rev. 1)`, line.furnace.name])
    await page.screenshot({ path: `${SCREENSHOT_DIR}/home-metallurgist.png` })
    await page.context().close()
  })

  it('an operator sees the floor counts the floor API gives and a big link to the floor', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator')
    const floor = (await admin.request('/api/floor')).body as FloorPoll
    const count = (states: string[]) => String(floor.batches.filter((b) => states.includes(b.state)).length)
    expect(await page.getByTestId('shift-active').textContent()).toBe(count(['charged', 'soaking', 'quenched', 'cooling', 'ready']))
    expect(await page.getByTestId('shift-ready').textContent()).toBe(count(['ready']))
    expect(await page.getByTestId('shift-due').textContent()).toBe(count(['planned']))
    const link = page.getByTestId('shift-floor-link')
    expect((await link.boundingBox())!.height).toBeGreaterThanOrEqual(56)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/home-operator.png` })
    await link.click()
    await page.waitForURL((url) => url.pathname === '/floor')
    await page.context().close()
  })

  it('QA sees the unsigned records waiting, oldest first, as the records API lists them', async () => {
    const lib = await createLibraryFixture(metallurgist)
    const plan = await quickPlan(metallurgist, lib, 60)
    const [operator, qa] = await Promise.all([signInDemo('operator'), signInDemo('qa')])
    const released = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, plan, 2500)

    const page = await browser.tabletPage()
    await signInThroughPage(page, 'qa')
    const waiting = (await qa.request('/api/records?state=unsigned&sort=releasedAt&dir=asc&limit=50')).body as { loadNumber: string; releasedAt: string }[]
    expect(waiting.at(-1)!.loadNumber).toBe(released.loadNumber)
    expect(waiting.map((r) => r.releasedAt)).toEqual(waiting.map((r) => r.releasedAt).sort())
    // The panel fetches after the client-side move from the sign-in page.
    await page.getByTestId('shift-unsigned').locator(`tr[data-load="${released.loadNumber}"]`).waitFor()
    const shown = await page.getByTestId('shift-unsigned').locator('tbody tr').evaluateAll((rows) => rows.map((row) => row.getAttribute('data-load')))
    expect(shown).toEqual(waiting.map((r) => r.loadNumber))
    await page.screenshot({ path: `${SCREENSHOT_DIR}/home-qa.png` })
    await page.context().close()
  })

  it('an administrator sees active people per role and every furnace', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'admin')
    const users = (await admin.request('/api/users')).body as { role: string; active: boolean }[]
    const active = users.filter((u) => u.active)
    expect(await page.getByTestId('shift-active-users').textContent()).toBe(String(active.length))
    for (const role of ['admin', 'metallurgist', 'operator', 'qa']) {
      expect(await page.getByTestId(`shift-role-${role}`).textContent()).toBe(String(active.filter((u) => u.role === role).length))
    }
    const furnaces = (await admin.request('/api/furnaces')).body as { name: string }[]
    const listed = await page.getByTestId('shift-furnaces').locator('li[data-furnace]').evaluateAll((items) => items.map((item) => item.getAttribute('data-furnace')))
    expect(listed).toEqual(furnaces.map((f) => f.name))
    await page.screenshot({ path: `${SCREENSHOT_DIR}/home-admin.png` })
    await page.context().close()
  })
})
