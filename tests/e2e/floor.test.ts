import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { runCase } from '../../server/thermal/runCase'
import { pointValue } from '../../shared/pointSeries'
import type { PlanSpecInput } from '../../shared/schemas/plan'
import { signInDemo, type Client } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import {
  PIN_HEAT_UP_CASE,
  PIN_QUENCH_CASE,
  PIN_QUENCH_SLOW_END_CASE,
  THIN_SHEET_QUENCH_CASE,
  THIN_SHEET_SLOW_END_CASE,
  pinSpec,
  savePlan,
  thinSheetSpec,
} from '../support/plans'
import { booking, createLine } from '../support/schedule'
import { move } from '../support/records'

const browser = useBrowser()
let admin: Client
let metallurgist: Client
let lib: LibraryFixture
beforeAll(async () => {
  ;[admin, metallurgist] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist')])
  lib = await createLibraryFixture(metallurgist)
})

type Card = ReturnType<Page['getByTestId']>

async function tapAndConfirm(page: Page, card: Card, label: string) {
  await card.getByRole('button', { name: label, exact: true }).click()
  await card.getByRole('button', { name: `Confirm: ${label}` }).click()
}

/** A tap the plan says is early: the card names the shortfall and asks a second time; returns the sentence. */
async function tapEarlyAndRecordAnyway(card: Card, label: string, shortfall: RegExp): Promise<string> {
  await card.getByRole('button', { name: label, exact: true }).click()
  await card.getByRole('button', { name: `Confirm: ${label}` }).click()
  const panel = card.getByTestId('card-shortfall')
  await panel.waitFor()
  const text = (await panel.textContent())!
  expect(text).toMatch(shortfall)
  await card.getByRole('button', { name: `Record anyway: ${label}` }).click()
  return text
}

const waitForState = (page: Page, loadNumber: string, state: string) =>
  page.waitForFunction(([id, s]) => document.querySelector(`[data-testid="card-${id}"]`)?.getAttribute('data-state') === s, [loadNumber, state])

/** Saves the plan through the planner, then books it on a line of its own, due in ten minutes. */
async function bookOnNewLine(spec: PlanSpecInput = pinSpec(lib), stationKind = 'oil') {
  const plan = await savePlan(metallurgist, spec)
  const line = await createLine(admin, 'Floor', stationKind)
  const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 10 * 60_000, 'Floor run') })
  expect(booked.status).toBe(201)
  return { plan, line, batch: booked.body as { id: number; loadNumber: string } }
}

describe('the floor countdown on a 1280×800 tablet', () => {
  it('an operator charges, marks core at heat, starts the quench and sees the time to safe handling (the band’s slow end) counting down', async () => {
    const { plan, line, batch } = await bookOnNewLine()
    // Source: the engine called directly on the same pin written by hand.
    const engineHeatUp_s = runCase(PIN_HEAT_UP_CASE).targetTime_s!
    const engineToHandling_s = runCase(PIN_QUENCH_CASE).targetTime_s!
    const engineSlowEnd_s = runCase(PIN_QUENCH_SLOW_END_CASE).targetTime_s!
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

    // Core at heat straight after charging is before the engine's heat-up: named on the card, recorded only on a second yes.
    await tapEarlyAndRecordAnyway(card, 'Core at heat', /Core at heat \d+ s after charging, .+ before the predicted heat-up of/)
    await waitForState(page, batch.loadNumber, 'soaking')
    expect(await card.getByTestId('card-message').textContent()).toMatch(/recorded at \d{1,2}:\d{2}:\d{2}.*, with its shortfall\./)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-shortfall-recorded.png` })
    // The door tap before the 30 min minimum soak is over: the same second confirmation.
    await tapEarlyAndRecordAnyway(card, 'Out of the furnace', /Out of the furnace with (29 min \d\d|30 min 00) s of the 30 min 00 s minimum soak still to run\./)
    await waitForState(page, batch.loadNumber, 'unloaded')
    // Door open: what counts now is the quench-delay allowance.
    expect(await card.getByTestId('countdown-caption').textContent()).toBe('left of the quench delay allowance: into the bath')
    await tapAndConfirm(page, card, 'Quench started')
    await waitForState(page, batch.loadNumber, 'quenched')

    const detail = (await admin.request(`/api/batches/${batch.id}`)).body
    // Safe to handle is booked at the slow end of the band; the headline stays on the card beside it.
    expect(detail.handlingAt - detail.quenchedAt).toBe(Math.round(plan.summary.slowEndToHandling_s! * 1000))
    expect(plan.summary.quenchToHandling_s).toBeCloseTo(engineToHandling_s, 6)
    expect(plan.summary.slowEndToHandling_s).toBeCloseTo(engineSlowEnd_s, 6)
    expect(await card.getByTestId('handling-basis').textContent()).toContain('safe-to-handle at the slow end of the quench band; headline estimate')
    const shown = Number(await card.getByTestId('countdown').getAttribute('data-seconds'))
    const expected = engineSlowEnd_s - (Date.now() - detail.quenchedAt) / 1000
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
    expect(plan.summary.slowEndToHandling_s).toBeCloseTo(runCase(THIN_SHEET_SLOW_END_CASE).targetTime_s!, 6)
    expect(plan.summary.slowEndToHandling_s).toBeLessThan(10)
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: line.furnace.name }).click()
    const card = page.getByTestId(`card-${batch.loadNumber}`)
    await tapAndConfirm(page, card, 'Load charged')
    await waitForState(page, batch.loadNumber, 'charged')
    await tapEarlyAndRecordAnyway(card, 'Core at heat', /before the predicted heat-up/)
    await waitForState(page, batch.loadNumber, 'soaking')
    await tapEarlyAndRecordAnyway(card, 'Out of the furnace', /of the 10 min 00 s minimum soak still to run/)
    await waitForState(page, batch.loadNumber, 'unloaded')
    await tapAndConfirm(page, card, 'Quench started')
    await waitForState(page, batch.loadNumber, 'quenched')
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
      ['unloaded', 'Tomas Vidal'],
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
    expect(await card.getByTestId('card-message').textContent()).toContain('nothing was recorded')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-offline.png` })
    expect((await admin.request(`/api/batches/${batch.id}`)).body.state).toBe('planned')
    await page.context().setOffline(false)
    await page.getByTestId('connection').filter({ hasText: 'Live' }).waitFor({ timeout: 10_000 })
    await page.context().close()
  })

  it('an armed confirmation disarms itself after 5 s; a shortfall asked and declined records nothing', async () => {
    const { line, batch } = await bookOnNewLine()
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: line.furnace.name }).click()
    const card = page.getByTestId(`card-${batch.loadNumber}`)
    await card.getByRole('button', { name: 'Load charged', exact: true }).click()
    expect(await card.getByTestId('card-action').textContent()).toContain('Confirm: Load charged')
    await page.waitForTimeout(5500)
    expect((await card.getByTestId('card-action').textContent())!.trim()).toBe('Load charged')
    expect((await admin.request(`/api/batches/${batch.id}`)).body.state).toBe('planned')

    await tapAndConfirm(page, card, 'Load charged')
    await waitForState(page, batch.loadNumber, 'charged')
    await card.getByRole('button', { name: 'Core at heat', exact: true }).click()
    await card.getByRole('button', { name: 'Confirm: Core at heat' }).click()
    await card.getByTestId('card-shortfall').waitFor()
    await card.getByTestId('card-shortfall-cancel').click()
    await card.getByTestId('card-shortfall').waitFor({ state: 'detached' })
    expect((await admin.request(`/api/batches/${batch.id}`)).body.state).toBe('charged')
    await page.context().close()
  })
})

describe('the floor on a 1920×1080 desktop', () => {
  it('feedback shows on the tapped card, not elsewhere; the operator corrects a tap to the second with a reason', async () => {
    const first = await bookOnNewLine()
    const page = await browser.desktopPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: first.line.furnace.name }).click()
    const card = page.getByTestId(`card-${first.batch.loadNumber}`)
    await tapAndConfirm(page, card, 'Load charged')
    await waitForState(page, first.batch.loadNumber, 'charged')
    const message = card.getByTestId('card-message')
    expect(await message.textContent()).toMatch(new RegExp(`^\\s*${first.batch.loadNumber}: recorded at \\d{1,2}:\\d{2}:\\d{2}`))
    expect(await page.getByTestId('card-message').count()).toBe(1)

    const tapped = (await admin.request(`/api/batches/${first.batch.id}`)).body.events.find((e: { toState: string }) => e.toState === 'charged')
    const corrected = new Date(Date.parse(tapped.at) - 7000)
    const pad = (n: number) => String(n).padStart(2, '0')
    await card.getByTestId('card-correct').click()
    await card.getByTestId('correction-event').selectOption(String(tapped.id))
    await card.getByTestId('correction-time').fill(`${pad(corrected.getHours())}:${pad(corrected.getMinutes())}:${pad(corrected.getSeconds())}`)
    await card.getByTestId('correction-reason').fill('Door log shows the charge 7 s earlier')
    await card.getByTestId('correction-save').click()
    await message.filter({ hasText: 'corrected to' }).waitFor()
    expect(await message.textContent()).toContain('the original tap stays in the record')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-corrected-desktop.png` })

    const event = (await admin.request(`/api/batches/${first.batch.id}`)).body.events.find((e: { toState: string }) => e.toState === 'charged')
    expect(event.originalAt).toBe(tapped.at)
    expect(event.at).toBe(new Date(Math.floor(corrected.getTime() / 1000) * 1000).toISOString())
    expect(event.corrections).toEqual([expect.objectContaining({ reason: 'Door log shows the charge 7 s earlier', by: 'Tomas Vidal' })])
    await page.context().close()
  })

  it('an operator attaches a thermocouple log from a charged load\'s card; it is stored on the load', async () => {
    const { line, batch } = await bookOnNewLine()
    const operator = await signInDemo('operator')
    expect((await move(operator, batch.id, 'charged')).status).toBe(201)
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/floor')
    await page.getByRole('button', { name: line.furnace.name }).click()
    const card = page.getByTestId(`card-${batch.loadNumber}`)
    await card.getByTestId('card-attach-log').click()
    await card.getByTestId('log-file').setInputFiles({ name: `${batch.loadNumber}.csv`, mimeType: 'text/csv', buffer: Buffer.from('t_s,TC1 (°C)\n0,850\n1,840\n2,831\n') })
    await card.getByTestId('log-preview').waitFor()
    expect(await card.locator('input[name="align"][value="first-row"]').isChecked()).toBe(true)
    await card.getByTestId('log-store').click()
    await card.getByTestId('card-message').filter({ hasText: `Log ${batch.loadNumber}.csv attached to ${batch.loadNumber}.` }).waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/floor-log-attached.png` })
    const logs = (await operator.request(`/api/logs?batchId=${batch.id}`)).body
    expect(logs).toEqual([expect.objectContaining({ fileName: `${batch.loadNumber}.csv`, rows: 3, channels: ['TC1 (°C)'], startedAt: null, quenchAtLog_s: null })])
    await page.context().close()
  })
})
