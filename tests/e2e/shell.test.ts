import { describe, expect, it } from 'vitest'
import { ROLE_LABELS, type Role } from '../../shared/roles'
import { demoUser } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'

const browser = useBrowser()

const expectedNavigation: Record<Role, string[]> = {
  admin: ['Shift overview', 'Plans', 'Schedule', 'Floor', 'Records', 'Materials', 'Logs', 'Calibrate', 'Quench media', 'Furnaces', 'People', 'Audit trail', 'Outbox', 'Mail recipients'],
  metallurgist: ['Shift overview', 'Plans', 'Schedule', 'Floor', 'Records', 'Materials', 'Logs', 'Calibrate', 'Quench media'],
  operator: ['Shift overview', 'Plans', 'Schedule', 'Floor', 'Materials', 'Logs', 'Quench media'],
  qa: ['Shift overview', 'Plans', 'Schedule', 'Records', 'Materials', 'Logs', 'Quench media', 'Audit trail'],
}

describe('the signed-in shell', () => {
  it.each(Object.keys(expectedNavigation) as Role[])('%s signs in through the page, sees their navigation, is kept out of People, signs out', async (role) => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, role)
    await expect(page.getByTestId('user-name').textContent()).resolves.toBe(demoUser(role).displayName)
    await expect(page.getByTestId('user-role').textContent()).resolves.toBe(ROLE_LABELS[role])
    const links = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()
    expect(links.map((text) => text.trim())).toEqual(expectedNavigation[role])
    await page.screenshot({ path: `${SCREENSHOT_DIR}/shell-${role}.png` })

    await page.goto('/admin/users')
    if (role === 'admin') {
      await page.getByTestId('users-table').waitFor()
      expect(await page.getByTestId('users-table').locator('tbody tr').count()).toBeGreaterThanOrEqual(4)
    } else {
      await page.waitForURL((url) => url.pathname === '/' && url.searchParams.get('denied') === '/admin/users')
      await page.getByTestId('denied').waitFor()
    }

    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL((url) => url.pathname === '/login')
    await page.goto('/admin/audit')
    await page.waitForURL((url) => url.pathname === '/login' && url.searchParams.get('next') === '/admin/audit')
    await page.context().close()
  })

  it('a wrong password shows a clear message and stays on the sign-in page', async () => {
    const page = await browser.tabletPage()
    await page.goto('/login')
    await page.getByLabel('E-mail').fill(demoUser('qa').email)
    await page.getByLabel('Password').fill('definitely-wrong')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect(page.getByTestId('signin-error').textContent()).resolves.toContain('do not match an active account')
    expect(new URL(page.url()).pathname).toBe('/login')
    await page.context().close()
  })

  it('a signed-out visitor is sent to sign in and then back where they were going', async () => {
    const page = await browser.tabletPage()
    await page.goto('/admin/audit')
    await page.waitForURL((url) => url.pathname === '/login')
    await page.getByLabel('E-mail').fill(demoUser('admin').email)
    await page.getByLabel('Password').fill(demoUser('admin').password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((url) => url.pathname === '/admin/audit')
    await page.getByTestId('audit-table').waitFor()
    expect(new URL(page.url()).pathname).toBe('/admin/audit')
    // The sign-in just made is itself in the trail, so it cannot be empty.
    expect(await page.getByTestId('audit-table').locator('tbody tr').count()).toBeGreaterThan(0)
    await page.context().close()
  })
})
