import { beforeAll, describe, expect, it } from 'vitest'
import { signInDemo, type Client } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser, type ViewportName } from '../support/browser'
import { FLOOR_STATES } from '../../shared/schedule'
import type { FloorPoll } from '../../shared/types/schedule'

const browser = useBrowser()
let admin: Client
beforeAll(async () => {
  admin = await signInDemo('admin')
})

describe('finding loads on the floor', () => {
  it.each(['tablet', 'desktop', 'phone'] as ViewportName[])('at the %s size: search by load number or work order; nothing scrolls sideways; the legend and the alert switch are there', async (viewport) => {
    const floor = (await admin.request('/api/floor')).body as FloorPoll
    const target = floor.batches[0]!
    const page = await browser.pageAt(viewport)
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByTestId(`card-${target.loadNumber}`).waitFor()
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)

    await page.getByTestId('floor-search').fill(target.reference.toLowerCase())
    const shown = await page.locator('[data-testid^="card-"][data-state]').evaluateAll((cards) => cards.map((c) => c.getAttribute('data-testid')))
    const expected = floor.batches.filter((b) => b.reference.toLowerCase().includes(target.reference.toLowerCase())).map((b) => `card-${b.loadNumber}`)
    expect(shown.sort()).toEqual(expected.sort())
    await page.getByTestId('floor-search').fill(target.loadNumber.slice(-5))
    await expect(page.locator('[data-testid^="card-"][data-state]').first().getAttribute('data-testid')).resolves.toBe(`card-${target.loadNumber}`)
    await page.getByTestId('floor-search').fill('no such load 404')
    await page.getByTestId('floor-no-match').waitFor()

    await page.getByTestId('floor-legend').locator('summary').click()
    expect(await page.getByTestId('floor-legend').locator('li[data-state]').count()).toBe(FLOOR_STATES.length)
    await page.getByTestId('floor-alert').check()
    expect(await page.evaluate(() => localStorage.getItem('slakewise.floor.alert'))).toBe('on')
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-search-${viewport}.png`, fullPage: true })
    await page.context().close()
  })
})

describe('print layouts', () => {
  it.each(['tablet', 'desktop'] as ViewportName[])('at the %s size: a plan and a record print without the navigation or the controls', async (viewport) => {
    const plans = (await admin.request('/api/plans')).body as { id: number }[]
    const records = (await admin.request('/api/records?limit=1')).body as { id: number }[]
    const page = await browser.pageAt(viewport)
    await signInThroughPage(page, 'admin', `/plans/${plans[0]!.id}`)
    await page.emulateMedia({ media: 'print' })
    for (const path of [`/plans/${plans[0]!.id}`, `/records/${records[0]!.id}`]) {
      await page.goto(path)
      await page.getByTestId('print').waitFor({ state: 'attached' })
      expect(await page.getByRole('navigation', { name: 'Main' }).isVisible(), `${path}: navigation`).toBe(false)
      expect(await page.getByTestId('print').isVisible(), `${path}: print button`).toBe(false)
      expect(await page.locator('h1').isVisible()).toBe(true)
    }
    await page.context().close()
  })
})
