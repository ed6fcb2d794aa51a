import { mkdirSync } from 'node:fs'
import { chromium, type Browser, type Page } from 'playwright-core'
import { BASE_URL } from './stackConfig'
import { demoUser } from './http'
import type { Role } from '../../shared/roles'

export const SCREENSHOT_DIR = 'test-results/screenshots'

/** Debian's Chromium, headless; background services off (this machine has no outside network). */
export async function launchBrowser(): Promise<Browser> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-dev-shm-usage'],
  })
}

/** A 1280×800 landscape page: the shop-floor tablet size. */
export async function tabletPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: BASE_URL })
  return context.newPage()
}

export async function signInThroughPage(page: Page, role: Role, next = '/'): Promise<void> {
  const user = demoUser(role)
  await page.goto(`/login?next=${encodeURIComponent(next)}`)
  await page.getByLabel('E-mail').fill(user.email)
  await page.getByLabel('Password').fill(user.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((url) => url.pathname === next)
}
