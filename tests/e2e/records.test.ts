import { describe, expect, it } from 'vitest'
import { createHmac } from 'node:crypto'
import { canonicalJson } from '../../server/records/canonical'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { demoUser, signInDemo } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { waitForMail } from '../support/mailCatcher'
import { quickPlan, releaseLoad } from '../support/records'
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
    expect(await page.getByTestId('record-state').textContent()).toBe('Unsigned')
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
