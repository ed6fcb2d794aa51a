import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { runCase } from '../../server/thermal/runCase'
import { pointValue } from '../../shared/pointSeries'
import type { PlanSpecInput } from '../../shared/schemas/plan'
import { signInDemo, type Client } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { PIN_HEAT_UP_CASE, PIN_QUENCH_CASE, THIN_SHEET_QUENCH_CASE, pinSpec, savePlan, thinSheetSpec } from '../support/plans'
import { booking, createLine } from '../support/schedule'

const browser = useBrowser()
let admin: Client
let metallurgist: Client
let lib: LibraryFixture
beforeAll(async () => {
  ;[admin, metallurgist] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist')])
  lib = await createLibraryFixture(metallurgist)
})

async function tapAndConfirm(page: Page, card: ReturnType<Page['getByTestId']>, label: string) {
  await card.getByRole('button', { name: label, exact: true }).click()
  await card.getByRole('button', { name: `Confirm: ${label}` }).click()
}

/** Saves the plan through the planner, then books it on a line of its own, due in ten minutes. */
async function bookOnNewLine(spec: PlanSpecInput = pinSpec(lib), stationKind = 'oil') {
  const plan = await savePlan(metallurgist, spec)
  const line = await createLine(admin, 'Floor', stationKind)
  const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 10 * 60_000, 'Floor run') })
  expect(booked.status).toBe(201)
  return { plan, line, batch: booked.body as { id: number; loadNumber: string } }
}

describe('the floor countdown on a 1280×800 tablet', () => {
  it('an operator charges, marks core at heat, starts the quench and sees the engine time to handling counting down', async () => {
    const { plan, line, batch } = await bookOnNewLine()
    // Source: the engine called directly on the same pin written by hand.
    const engineHeatUp_s = runCase(PIN_HEAT_UP_CASE).targetTime_s!
    const engineToHandling_s = runCase(PIN_QUENCH_CASE).targetTime_s!
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: line.furnace.name }).click()
    const card = page.getByTestId(`card-${batch.loadNumber}`)
    await card.waitFor()
    expect(await card.getAttribute('data-state')).toBe('planned')
    const actionBox = await card.getByTestId('card-action').boundingBox()
    expect(actionBox!.height).toBeGreaterThanOrEqual(56)

    await tapAndConfirm(page, card, 'Load charged')
    await page.waitForFunction((id) => document.querySelector(`[data-testid="card-${id}"]`)?.getAttribute('data-state') === 'charged', batch.loadNumber)
    // In the furnace the count is heat-up + minimum soak from the charge.
    const soakLeft = Number(await card.getByTestId('countdown').getAttribute('data-seconds'))
    expect(Math.abs(soakLeft - (engineHeatUp_s + 1800))).toBeLessThanOrEqual(2)

    await tapAndConfirm(page, card, 'Core at heat')
    await page.waitForFunction((id) => document.querySelector(`[data-testid="card-${id}"]`)?.getAttribute('data-state') === 'soaking', batch.loadNumber)
    await tapAndConfirm(page, card, 'Quench started')
    await page.waitForFunction((id) => document.querySelector(`[data-testid="card-${id}"]`)?.getAttribute('data-state') === 'quenched', batch.loadNumber)

    const detail = (await admin.request(`/api/batches/${batch.id}`)).body
    expect(detail.handlingAt - detail.quenchedAt).toBe(Math.round(plan.summary.quenchToHandling_s * 1000))
    expect(plan.summary.quenchToHandling_s).toBeCloseTo(engineToHandling_s, 6)
    const shown = Number(await card.getByTestId('countdown').getAttribute('data-seconds'))
    const expected = engineToHandling_s - (Date.now() - detail.quenchedAt) / 1000
    expect(Math.abs(shown - expected)).toBeLessThanOrEqual(1)
    const core = Number((await card.getByTestId('core-now').textContent())!.match(/≈\s*(-?\d+)/)![1])
    expect(Math.abs(core - pointValue(plan.summary.handlingPointSeries, (Date.now() - detail.quenchedAt) / 1000))).toBeLessThanOrEqual(15)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-quenched.png` })

    await page.waitForTimeout(2500)
    const later = Number(await card.getByTestId('countdown').getAttribute('data-seconds'))
    expect(shown - later).toBeGreaterThanOrEqual(2)
    expect(shown - later).toBeLessThanOrEqual(4)

    // The furnace filter is remembered on this device.
    await page.reload()
    await card.waitFor()
    expect(await page.getByRole('button', { name: line.furnace.name }).getAttribute('aria-pressed')).toBe('true')
    await page.context().close()
  })

  it('a thin sheet reaches handling temperature within seconds: the card turns safe to handle and is handed on', async () => {
    const { plan, line, batch } = await bookOnNewLine(thinSheetSpec(lib), 'water')
    expect(plan.summary.quenchToHandling_s).toBeCloseTo(runCase(THIN_SHEET_QUENCH_CASE).targetTime_s!, 6)
    expect(plan.summary.quenchToHandling_s).toBeLessThan(10)
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: line.furnace.name }).click()
    const card = page.getByTestId(`card-${batch.loadNumber}`)
    for (const [label, state] of [['Load charged', 'charged'], ['Core at heat', 'soaking'], ['Quench started', 'quenched']] as const) {
      await tapAndConfirm(page, card, label)
      await page.waitForFunction(([id, s]) => document.querySelector(`[data-testid="card-${id}"]`)?.getAttribute('data-state') === s, [batch.loadNumber, state])
    }
    await page.waitForFunction((id) => document.querySelector(`[data-testid="card-${id}"]`)?.getAttribute('data-state') === 'ready', batch.loadNumber, { timeout: 15_000 })
    expect(await card.getByTestId('card-state').textContent()).toContain('Safe to handle')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-ready.png` })
    await tapAndConfirm(page, card, 'Release')
    await card.waitFor({ state: 'detached' })
    const events = (await admin.request(`/api/batches/${batch.id}`)).body.events.map((e: { toState: string; actorName: string | null }) => [e.toState, e.actorName])
    expect(events).toEqual([
      ['planned', 'Mira Okonkwo'],
      ['charged', 'Tomas Vidal'],
      ['soaking', 'Tomas Vidal'],
      ['quenched', 'Tomas Vidal'],
      ['cooling', null],
      ['ready', null],
      ['released', 'Tomas Vidal'],
    ])
    await page.context().close()
  })

  it('shows a lost connection and refuses a tap made offline without recording anything', async () => {
    const { line, batch } = await bookOnNewLine()
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: line.furnace.name }).click()
    const card = page.getByTestId(`card-${batch.loadNumber}`)
    await card.waitFor()
    await page.context().setOffline(true)
    await page.getByTestId('connection').filter({ hasText: 'Connection lost' }).waitFor()
    await tapAndConfirm(page, card, 'Load charged')
    expect(await page.getByTestId('floor-message').textContent()).toContain('nothing was recorded')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-offline.png` })
    expect((await admin.request(`/api/batches/${batch.id}`)).body.state).toBe('planned')
    await page.context().setOffline(false)
    await page.getByTestId('connection').filter({ hasText: 'Live' }).waitFor({ timeout: 10_000 })
    await page.context().close()
  })
})
