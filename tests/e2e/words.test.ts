import { beforeAll, describe, expect, it } from 'vitest'
import { can, type Capability } from '../../shared/access'
import { ROLES, type Role } from '../../shared/roles'
import { signInDemo } from '../support/http'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser, watchConsoleErrors, type ViewportName } from '../support/browser'
import { retiredWordsIn } from '../support/glossary'

const browser = useBrowser()
const DAY = 86_400_000

/** Every page with the capability its definePageMeta names; the ids are filled from the demo shop. */
const pages: { path: string; capability: Capability }[] = []

beforeAll(async () => {
  const admin = await signInDemo('admin')
  const plans = (await admin.request('/api/plans')).body as { id: number }[]
  const records = (await admin.request('/api/records?limit=1')).body as { id: number }[]
  const now = Date.now()
  const week = (await admin.request(`/api/batches?from=${new Date(now - 2 * DAY).toISOString()}&to=${new Date(now + 2 * DAY).toISOString()}`)).body as { batches: { id: number }[] }
  // The demo shop seeds plans, released loads with records, and loads around today.
  expect({ plans: plans.length > 0, records: records.length > 0, loads: week.batches.length > 0 }).toEqual({ plans: true, records: true, loads: true })
  pages.push(
    { path: '/', capability: 'signedIn' },
    { path: '/plans', capability: 'plans.read' },
    { path: '/plans/new', capability: 'plans.edit' },
    { path: '/plans/compare', capability: 'plans.read' },
    { path: `/plans/${plans[0]!.id}`, capability: 'plans.read' },
    { path: '/schedule', capability: 'schedule.read' },
    { path: `/schedule/${week.batches[0]!.id}`, capability: 'schedule.read' },
    { path: '/floor', capability: 'floor.view' },
    { path: '/records', capability: 'records.read' },
    { path: `/records/${records[0]!.id}`, capability: 'records.read' },
    { path: '/library/materials', capability: 'library.read' },
    { path: '/library/quenchants', capability: 'library.read' },
    { path: '/logs', capability: 'logs.read' },
    { path: '/calibration', capability: 'media.calibrate' },
    { path: '/admin/furnaces', capability: 'equipment.manage' },
    { path: '/admin/users', capability: 'people.manage' },
    { path: '/admin/audit', capability: 'audit.read' },
    { path: '/admin/outbox', capability: 'outbox.manage' },
    { path: '/admin/mail-recipients', capability: 'mail.manage' },
  )
})

const cases = (['tablet', 'desktop'] as ViewportName[]).flatMap((viewport) => ROLES.map((role) => [viewport, role] as [ViewportName, Role]))

describe('every page for every role', () => {
  it.each(cases)('at the %s size, %s: no console errors (hydration included) and none of the retired words of the glossary', async (viewport, role) => {
    const page = await browser.pageAt(viewport)
    const errors = watchConsoleErrors(page)
    await signInThroughPage(page, role)
    const found: Record<string, string[]> = {}
    for (const { path, capability } of pages.filter((p) => can(role, p.capability))) {
      // A full load each time, so every page is rendered on the server and hydrated (Vue marks the root once mounted).
      await page.goto(path)
      await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
      await page.waitForLoadState('networkidle', { timeout: 5000 }).catch(() => undefined)
      expect(new URL(page.url()).pathname, `${role} may open ${path} (${capability})`).toBe(path)
      const words = retiredWordsIn(await page.locator('body').innerText())
      if (words.length) found[path] = words
      if (errors.length) found[`${path} console`] = errors.splice(0)
    }
    await page.screenshot({ path: `${SCREENSHOT_DIR}/words-${viewport}-${role}.png` })
    expect(found).toEqual({})
    await page.context().close()
  }, 300_000)
})
