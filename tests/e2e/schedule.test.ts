import { beforeAll, describe, expect, it } from 'vitest'
import { signInDemo, type Client } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { createLibraryFixture } from '../support/library'
import { pinSpec, savePlan } from '../support/plans'
import { createLine } from '../support/schedule'

const browser = useBrowser()
let admin: Client
let metallurgist: Client
beforeAll(async () => {
  ;[admin, metallurgist] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist')])
})

describe('the schedule timeline', () => {
  it('a metallurgist clicks free time in a furnace lane and books a load there', async () => {
    const plan = await savePlan(metallurgist, pinSpec(await createLibraryFixture(metallurgist)))
    const line = await createLine(admin, 'Timeline')
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist', '/schedule')
    // Show only the new furnace: lanes are then [its furnace, its station].
    const all = (await admin.request('/api/furnaces')).body as { name: string }[]
    for (const furnace of all) if (furnace.name !== line.furnace.name) await page.getByRole('checkbox', { name: furnace.name, exact: true }).uncheck()
    await page.waitForTimeout(300)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/schedule-week.png` })

    const box = (await page.getByTestId('timeline').boundingBox())!
    // grid: left 150, right 24, top 24, bottom 56 (ScheduleTimeline); two lanes.
    const laneHeight = (box.height - 24 - 56) / 2
    await page.mouse.click(box.x + 150 + (box.width - 174) * 0.85, box.y + 24 + laneHeight * 0.5)
    const form = page.getByTestId('booking-form')
    await form.waitFor()
    expect(await form.getByLabel('Furnace').inputValue()).toBe(String(line.furnace.id))
    await form.getByLabel('Plan revision').selectOption(String(plan.planRevisionId))
    await form.getByLabel('Parts').fill('36')
    await form.getByLabel('Load mass (kg)').fill('410')
    const reference = `Timeline ${Date.now()}`
    await form.getByLabel('Customer or work order').fill(reference)
    await form.getByRole('button', { name: 'Book load' }).click()
    const notice = await page.getByTestId('schedule-notice').textContent()
    const loadNumber = notice!.match(/KB-\d{4}-\d{5}/)![0]
    await page.screenshot({ path: `${SCREENSHOT_DIR}/schedule-booked.png` })

    const from = new Date(Date.now() - 8 * 24 * 3600_000).toISOString()
    const to = new Date(Date.now() + 8 * 24 * 3600_000).toISOString()
    const listed = (await admin.request(`/api/batches?from=${from}&to=${to}&furnaceId=${line.furnace.id}`)).body.batches
    expect(listed).toHaveLength(1)
    expect(listed[0]).toMatchObject({ loadNumber, reference, partCount: 36, mass_kg: 410, stationId: line.station.id, state: 'planned' })
    await page.context().close()
  })
})
