import { describe, expect, it } from 'vitest'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { signInDemo } from '../support/http'
import { startMailCatcher, waitForMail } from '../support/mailCatcher'

const browser = useBrowser()

describe('the outbox page', () => {
  it('shows a message the mail server refused, with its error, and sends it on retry', async () => {
    const admin = await signInDemo('admin')
    // A catcher demanding authentication refuses our mail with 530: the message fails.
    await startMailCatcher(['--incoming-user', 'records', '--incoming-pass', 'not-configured'])
    let id: number
    try {
      id = (await admin.request('/api/outbox/test-sheet', { method: 'POST', body: { loadNumber: 'KB-E2E-0001' } })).body.id
      const deadline = Date.now() + 20_000
      while ((await admin.request('/api/outbox?status=failed')).body.messages.every((m: { id: number }) => m.id !== id)) {
        if (Date.now() > deadline) throw new Error('the message did not fail')
        await new Promise((resolve) => setTimeout(resolve, 200))
      }
    } finally {
      await startMailCatcher()
    }

    const page = await browser.tabletPage()
    await signInThroughPage(page, 'admin', '/admin/outbox')
    const row = page.locator(`tr[data-id="${id}"]`)
    await row.waitFor()
    expect(await row.getAttribute('data-status')).toBe('failed')
    expect(await row.getByTestId('last-error').textContent()).toMatch(/530/)
    expect(await row.textContent()).toContain('Hold-time sheet · Load KB-E2E-0001')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/outbox-failed.png` })

    await row.getByRole('button', { name: `Retry message ${id}` }).click()
    await page.getByRole('status').filter({ hasText: 'is queued to go out now' }).waitFor()
    await waitForMail((mail) => mail.subject.includes('KB-E2E-0001'), 1)

    await page.getByRole('button', { name: 'Refresh' }).click()
    await page.locator(`tr[data-id="${id}"][data-status="sent"]`).waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/outbox-sent.png` })
    await page.context().close()
  })

  it('mail recipients: an admin adds an address and sees who the sheets go to', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'admin', '/admin/mail-recipients')
    const form = page.locator('form[data-kind="daily_digest"]')
    await form.getByLabel('Further addresses, one per line').fill('plant.manager@kestrelbay.example\nnot an address')
    await form.getByRole('button', { name: 'Save' }).click()
    await form.locator('.field-error').filter({ hasText: 'not: Enter a valid e-mail address' }).waitFor()

    await form.getByLabel('Further addresses, one per line').fill('plant.manager@kestrelbay.example')
    await form.getByRole('button', { name: 'Save' }).click()
    await page.getByRole('status').filter({ hasText: 'Daily digest: saved.' }).waitFor()
    // Every active QA lead (sorted, other tests may add some), then the added address.
    const effective = await page.getByTestId('effective-daily_digest').locator('li').allTextContents()
    expect(effective).toContain('qa@kestrelbay.example')
    expect(effective.at(-1)).toBe('plant.manager@kestrelbay.example')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/mail-recipients.png`, fullPage: true })
    await page.context().close()

    const admin = await signInDemo('admin')
    await admin.request('/api/mail-recipients/daily_digest', { method: 'PUT', body: { emails: [], includeRoleDefault: true } })
  })
})
