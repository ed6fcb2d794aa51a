import { mkdirSync } from 'node:fs'
import { afterAll, beforeAll } from 'vitest'
import { chromium, type Browser, type Page } from 'playwright-core'
import { BASE_URL } from './stackConfig'
import { demoUser } from './http'
import type { Role } from '../../shared/roles'

export const SCREENSHOT_DIR = 'test-results/screenshots'

/** Debian's Chromium, headless; background services off (this machine has no outside network). */
async function launchBrowser(): Promise<Browser> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-dev-shm-usage'],
  })
}

/**
 * One browser for a test file: launched before its tests, closed after them. Call it at
 * the top level of the file; each `tabletPage()` is a fresh 1280×800 landscape page
 * (the shop-floor tablet size) and each `desktopPage()` a 1920×1080 one, in a context of
 * its own, so sign-ins never leak between tests.
 */
export function useBrowser(): { tabletPage: () => Promise<Page>; desktopPage: () => Promise<Page> } {
  let browser: Browser | undefined
  beforeAll(async () => {
    browser = await launchBrowser()
  })
  afterAll(async () => {
    await browser?.close()
  })
  async function pageOf(width: number, height: number) {
    if (!browser) throw new Error('no browser: call useBrowser() at the top level of the test file')
    const context = await browser.newContext({ viewport: { width, height }, baseURL: BASE_URL })
    return context.newPage()
  }
  return { tabletPage: () => pageOf(1280, 800), desktopPage: () => pageOf(1920, 1080) }
}

export async function signInThroughPage(page: Page, role: Role, next = '/'): Promise<void> {
  const user = demoUser(role)
  await page.goto(`/login?next=${encodeURIComponent(next)}`)
  await page.getByLabel('E-mail').fill(user.email)
  await page.getByLabel('Password').fill(user.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((url) => url.pathname === next)
}
