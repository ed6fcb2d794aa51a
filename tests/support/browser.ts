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

/** The viewports the product is used at: the shop-floor tablet (landscape), an office desktop, a phone. */
export const VIEWPORTS = {
  tablet: { width: 1280, height: 800 },
  desktop: { width: 1920, height: 1080 },
  phone: { width: 375, height: 812 },
} as const
export type ViewportName = keyof typeof VIEWPORTS

/**
 * One browser for a test file: launched before its tests, closed after them. Call it at
 * the top level of the file; each `tabletPage()` is a fresh 1280×800 landscape page
 * (the shop-floor tablet size) and each `desktopPage()` a 1920×1080 one, in a context of
 * its own, so sign-ins never leak between tests; `pageAt(viewport)` does the same at any
 * of the VIEWPORTS (the phone too).
 */
export function useBrowser(): { tabletPage: () => Promise<Page>; desktopPage: () => Promise<Page>; pageAt: (viewport: ViewportName) => Promise<Page> } {
  let browser: Browser | undefined
  beforeAll(async () => {
    browser = await launchBrowser()
  })
  afterAll(async () => {
    await browser?.close()
  })
  async function pageAt(viewport: ViewportName) {
    if (!browser) throw new Error('no browser: call useBrowser() at the top level of the test file')
    const context = await browser.newContext({ viewport: VIEWPORTS[viewport], baseURL: BASE_URL, isMobile: viewport === 'phone', hasTouch: viewport === 'phone' })
    return context.newPage()
  }
  return { tabletPage: () => pageAt('tablet'), desktopPage: () => pageAt('desktop'), pageAt }
}

/** Collects what the page reports as errors (console errors, hydration mismatches, uncaught exceptions) from now on. */
export function watchConsoleErrors(page: Page): string[] {
  const errors: string[] = []
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(message.text())
  })
  page.on('pageerror', (error) => errors.push(error.message))
  return errors
}

export async function signInThroughPage(page: Page, role: Role, next = '/'): Promise<void> {
  const user = demoUser(role)
  await page.goto(`/login?next=${encodeURIComponent(next)}`)
  await page.getByLabel('E-mail').fill(user.email)
  await page.getByLabel('Password').fill(user.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((url) => url.pathname === next)
}
