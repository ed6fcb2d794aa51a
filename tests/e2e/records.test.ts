import { describe, expect, it } from 'vitest'
import { createHmac } from 'node:crypto'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { canonicalJson } from '../../server/records/canonical'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { demoUser, signInDemo } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { waitForMail } from '../support/mailCatcher'
import { pause, until } from '../support/poll'
import { move, quickPlan, releaseLoad } from '../support/records'
import { booking, createLine } from '../support/schedule'
import { BASE_URL, RECORD_SEAL_KEY } from '../support/stackConfig'

const browser = useBrowser()

describe('signing a record from the e-mailed link', () => {
  it('a QA lead follows the sheet’s link, signs in, lands on the record and approves it; it shows signed and intact', async () => {
    const [admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
    const plan = await quickPlan(metallurgist, await createLibraryFixture(metallurgist), 60)
    const released = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, plan, 2500)

    const [mail] = await waitForMail((m) => m.subject.includes(released.loadNumber), 1)
    const link = /href="([^"]+)" data-role="sign-off"/.exec(mail!.html)![1]!
    expect(link).toMatch(new RegExp(`^${BASE_URL}/records/\\d+$`))
    const path = new URL(link).pathname

    const page = await browser.tabletPage()
    await page.goto(link)
    // Not signed in: the guard sends the reader to sign in, remembering where they were going.
    await page.waitForURL((url) => url.pathname === '/login' && url.searchParams.get('next') === path)
    const user = demoUser('qa')
    await page.getByLabel('E-mail').fill(user.email)
    await page.getByLabel('Password').fill(user.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((url) => url.pathname === path)

    expect(await page.getByTestId('record-load-number').textContent()).toBe(released.loadNumber)
    expect(await page.getByTestId('record-integrity').getAttribute('data-integrity')).toBe('intact')
    await page.getByTestId('record-curve-chart').locator('canvas').waitFor()
    const events = await page.getByTestId('record-events').locator('tbody tr').evaluateAll((rows) => rows.map((row) => row.getAttribute('data-type')))
    expect(events).toEqual(['charged', 'soaking', 'furnace_opened', 'quenched', 'cooling', 'ready_to_handle', 'released'])

    // Approving signs for good: the first tap only asks for confirmation.
    await page.getByRole('button', { name: 'Approve record' }).click()
    expect(await page.getByTestId('record-state').textContent()).toBe('Waiting for sign-off')
    await page.getByRole('button', { name: 'Confirm: approve and sign' }).click()
    await page.getByRole('status').filter({ hasText: 'Record approved.' }).waitFor()
    expect((await page.getByTestId('sign-off-state').textContent())!.trim()).toBe(`Approved by ${user.displayName}`)
    expect(await page.getByTestId('record-state').textContent()).toBe('Approved')
    expect(await page.getByTestId('record-integrity').getAttribute('data-integrity')).toBe('intact')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/record-approved.png`, fullPage: true })

    const id = Number(path.split('/').at(-1))
    const stored = (await qa.request(`/api/records/${id}`)).body
    expect(stored).toMatchObject({ state: 'approved', integrity: 'intact', signedBy: user.displayName })
    expect(createHmac('sha256', RECORD_SEAL_KEY).update(canonicalJson(stored.snapshot), 'utf8').digest('hex')).toBe(stored.hash)

    // The records list shows it approved and filters it out of the unsigned ones.
    await page.goto('/records')
    await page.locator(`tr[data-load="${released.loadNumber}"][data-state="approved"]`).waitFor()
    await page.getByLabel('Sign-off').selectOption('unsigned')
    await page.locator(`tr[data-load="${released.loadNumber}"]`).waitFor({ state: 'detached' })
    await page.context().close()
  })

  it('rejecting without a comment shows the field’s own message and no generic banner; nothing is signed', async () => {
    const [admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
    const plan = await quickPlan(metallurgist, await createLibraryFixture(metallurgist), 60)
    const released = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, plan, 2500)
    const listed = (await qa.request('/api/records?state=unsigned&limit=500')).body as { id: number; loadNumber: string }[]
    const recordId = listed.find((r) => r.loadNumber === released.loadNumber)!.id
    const path = `/records/${recordId}`
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'qa', path)
    await page.getByRole('button', { name: 'Reject record' }).click()
    await expect(page.getByTestId('sign-off').locator('.field-error').textContent()).resolves.toBe('A rejection needs a comment saying why')
    expect(await page.getByTestId('sign-off').getByRole('alert').count()).toBe(0)
    expect((await qa.request(`/api/records/${recordId}`)).body.state).toBe('unsigned')
    await page.context().close()
  })
})

describe('the record of a load with an early tap, a correction and no door tap', () => {
  it('desktop: a metallurgist corrects core at heat on the record; tablet: QA reads recorded and predicted moments apart, to the second', async () => {
    const [admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
    const plan = await quickPlan(metallurgist, await createLibraryFixture(metallurgist), 60)
    const line = await createLine(admin, 'Truth', 'water')
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 1000, 'PO-TRUTH') })
    expect(booked.status).toBe(201)
    const batchId = booked.body.id
    await move(operator, batchId, 'charged')
    // Core at heat tapped at once, confirmed early; the door tap is missed.
    expect((await move(operator, batchId, 'soaking', true)).status).toBe(201)
    await pause(2500)
    expect((await move(operator, batchId, 'quenched')).status).toBe(201)
    await until(async () => (await move(operator, batchId, 'released')).status, (status) => status === 201, 20, 'release')
    const recordId = ((await qa.request('/api/records?limit=500')).body as { id: number; batchId: number }[]).find((r) => r.batchId === batchId)!.id
    const charged = (await qa.request(`/api/batches/${batchId}`)).body.events.find((e: { toState: string }) => e.toState === 'charged')
    const soaking = (await qa.request(`/api/batches/${batchId}`)).body.events.find((e: { toState: string }) => e.toState === 'soaking')

    const desk = await browser.desktopPage()
    await signInThroughPage(desk, 'metallurgist', `/records/${recordId}`)
    await desk.getByTestId('record-not-recorded').filter({ hasText: 'Out of the furnace (door open): not recorded on the floor' }).waitFor()
    expect(await desk.getByTestId('record-quench-delay').textContent()).toContain('not measured: door opening not recorded')
    await desk.getByTestId('record-correct').click()
    await desk.getByTestId('correction-event').selectOption(String(soaking.id))
    // The chart recorder says core at heat 1 s after the charge (whole seconds, browser time zone).
    const at = new Date(Math.ceil((Date.parse(charged.at) + 1000) / 1000) * 1000)
    const pad = (n: number) => String(n).padStart(2, '0')
    await desk.getByTestId('correction-time').fill(`${pad(at.getHours())}:${pad(at.getMinutes())}:${pad(at.getSeconds())}`)
    await desk.getByTestId('correction-reason').fill('Chart recorder shows core at heat sooner')
    await desk.getByTestId('correction-save').click()
    await desk.getByTestId('event-correction').filter({ hasText: 'Chart recorder shows core at heat sooner' }).waitFor()
    await desk.screenshot({ path: `${SCREENSHOT_DIR}/record-corrected-desktop.png`, fullPage: true })
    await desk.context().close()

    const record = (await qa.request(`/api/records/${recordId}`)).body
    expect(record.integrity).toBe('intact')
    const heatUp_s = (at.getTime() - Date.parse(charged.at)) / 1000
    expect(record.snapshot.measured.heatUp_s).toBe(heatUp_s)
    expect(record.snapshot.deviations[0]).toMatchObject({ rule: 'short_heat_up', actual_s: heatUp_s })

    const tablet = await browser.tabletPage()
    await signInThroughPage(tablet, 'qa', `/records/${recordId}`)
    const rows = tablet.getByTestId('record-events').locator('tbody tr')
    await rows.first().waitFor()
    const seen = await rows.evaluateAll((trs) => trs.map((tr) => [tr.getAttribute('data-type'), tr.getAttribute('data-source'), tr.classList.contains('italic'), tr.querySelector('td')!.textContent!.trim()]))
    // No door row: it was not tapped, and the record does not make one up.
    expect(seen.map(([type]) => type)).toEqual(['charged', 'soaking', 'quenched', 'cooling', 'ready_to_handle', 'released'])
    for (const [type, source, italic, when] of seen) {
      const predicted = type === 'cooling' || type === 'ready_to_handle'
      expect([type, source, italic]).toEqual([type, predicted ? 'predicted' : 'recorded', predicted])
      expect(when).toMatch(/\d{1,2}:\d{2}:\d{2}/)
    }
    const coreRow = tablet.locator('tr[data-type="soaking"]')
    expect(await coreRow.getByTestId('event-shortfall').textContent()).toMatch(/^Confirmed early: Core at heat \d+ s after charging/)
    expect(await coreRow.getByTestId('event-original').textContent()).toMatch(/^tapped .*\d{1,2}:\d{2}:\d{2}/)
    expect(await tablet.locator('tr[data-type="ready_to_handle"]').textContent()).toContain('predicted')
    expect(await tablet.getByTestId('record-deviations').locator('li[data-rule="short_heat_up"]').textContent()).toMatch(/^Core at heat recorded \d+ s after charging, .+ sooner than the predicted heat-up of .+\.$/)
    expect(await tablet.getByTestId('record-chart-key').textContent()).toContain('predicted')
    await tablet.screenshot({ path: `${SCREENSHOT_DIR}/record-truth-tablet.png`, fullPage: true })
    await tablet.context().close()
  })
})

describe('a load log on the record', () => {
  it('an operator attaches a log from the load\'s page; QA reads the measured trace over the band and its deviations', async () => {
    const [admin, metallurgist, operator, qa] = await Promise.all([signInDemo('admin'), signInDemo('metallurgist'), signInDemo('operator'), signInDemo('qa')])
    const plan = await quickPlan(metallurgist, await createLibraryFixture(metallurgist), 60)
    const released = await releaseLoad({ admin, metallurgist, recorder: operator, reader: qa }, plan, 2500)
    // 1 s rows for 2 min, 850 °C falling 4 K a second, the quench tapped 10 s in: far slower than the 2 mm sheet's plan.
    const rows = Array.from({ length: 121 }, (_, t) => `${t},${850 - 4 * t}`)
    const file = join(mkdtempSync(join(tmpdir(), 'load-log-')), `${released.loadNumber}-core.csv`)
    writeFileSync(file, ['time_s,Core (°C)', ...rows].join('\n') + '\n')

    const tablet = await browser.tabletPage()
    await signInThroughPage(tablet, 'operator', `/schedule/${released.batchId}`)
    await tablet.getByTestId('attach-log').click()
    await tablet.getByTestId('log-file').setInputFiles(file)
    await tablet.getByTestId('log-preview').waitFor()
    await tablet.locator('input[name="align"][value="offset"]').check()
    await tablet.locator('input[name="quenchAtLog_s"]').fill('10')
    await tablet.getByTestId('log-store').click()
    await tablet.getByRole('status').filter({ hasText: `${released.loadNumber}-core.csv attached to ${released.loadNumber}.` }).waitFor()
    await tablet.locator(`[data-testid="batch-logs"] tr[data-log="${released.loadNumber}-core.csv"]`).waitFor()
    await tablet.context().close()

    const listed = (await qa.request('/api/records?state=unsigned&limit=500')).body as { id: number; loadNumber: string }[]
    const recordId = listed.find((r) => r.loadNumber === released.loadNumber)!.id
    const page = await browser.desktopPage()
    await signInThroughPage(page, 'qa', `/records/${recordId}`)
    expect(await page.getByTestId('record-integrity').getAttribute('data-integrity')).toBe('intact')
    await page.getByTestId('record-curve-chart').locator('canvas').waitFor()
    expect(await page.getByTestId('record-curve-chart').getAttribute('data-traces')).toBe('1')
    const trace = page.getByTestId('record-measured').locator(`tr[data-trace="${released.loadNumber}-core.csv · Core (°C)"]`)
    await expect(trace.textContent()).resolves.toContain('the quench tap is 10 s into the log, as the uploader gave it')
    const rules = await page.getByTestId('record-deviations').locator('li').evaluateAll((items) => items.map((item) => item.getAttribute('data-rule')))
    expect(rules).toEqual(['above_band_at_release', 'slow_cooling'])
    await page.screenshot({ path: `${SCREENSHOT_DIR}/record-measured-trace.png`, fullPage: true })
    await page.context().close()
  })
})
