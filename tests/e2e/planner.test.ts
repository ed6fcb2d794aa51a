import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { signInDemo } from '../support/http'
import { runCase } from '../../server/thermal/runCase'

const browser = useBrowser()
let lib: LibraryFixture
beforeAll(async () => {
  lib = await createLibraryFixture(await signInDemo('metallurgist'))
})

/** Waits until the headline time is shown and differs from `previous`; returns it in seconds. */
async function headlineSeconds(page: Page, previous?: number): Promise<number> {
  const handle = page.getByTestId('quench-to-handling')
  await page.waitForFunction(
    (prev) => {
      const value = document.querySelector('[data-testid="quench-to-handling"]')?.getAttribute('data-seconds')
      return !!value && Number(value) > 0 && Number(value) !== prev
    },
    previous ?? -1,
    { timeout: 20_000 },
  )
  return Number(await handle.getAttribute('data-seconds'))
}

describe('cooldown planner in the browser', () => {
  it('a metallurgist plans a bar quenched in oil then still air, thickens it, saves, and sees the same after a reload', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist', '/plans/new')
    await page.getByLabel('Plan name').fill('Kestrel shaft, oil then air')
    await page.getByLabel('Shape').selectOption('round-bar')
    await page.getByLabel('Diameter').fill('40')
    await page.getByLabel('Material').selectOption(String(lib.steelId))
    await page.locator('#stage-0-quenchant').selectOption(String(lib.oilId))
    await page.getByRole('button', { name: 'Add a stage' }).click()
    await page.locator('#stage-0-duration').fill('60')
    await page.locator('#stage-1-quenchant').selectOption(String(lib.airId))

    const thin = await headlineSeconds(page)
    // Source: the engine called directly on the same bar (radius 20 mm, 60 s oil at 800 W/m²K, then air at 15 W/m²K).
    const direct = (d: number) =>
      runCase({
        geometry: 'rod',
        size_m: d / 2,
        material: { k: 40, rho: 7850, cp: 475 },
        initial_C: 850,
        stages: [{ surface: { h: 800, ambient_C: 60 }, duration_s: 60 }, { surface: { h: 15, ambient_C: 25 } }],
        target: { at: 'centre', below_C: 100 },
      }).targetTime_s as number
    expect(thin).toBeCloseTo(direct(0.04), 3)

    await page.getByLabel('Diameter').fill('50')
    const thick = await headlineSeconds(page, thin)
    expect(thick).toBeGreaterThan(thin)
    expect(thick).toBeCloseTo(direct(0.05), 3)
    await page.getByTestId('plan-curve-chart').locator('canvas').first().waitFor()

    await page.getByRole('button', { name: 'Save plan' }).click()
    await page.waitForURL((url) => /^\/plans\/\d+$/.test(url.pathname))
    await expect(page.getByTestId('plan-title').textContent()).resolves.toBe('Kestrel shaft, oil then air')
    expect(await headlineSeconds(page)).toBeCloseTo(thick, 6)

    await page.reload()
    expect(await headlineSeconds(page)).toBeCloseTo(thick, 6)
    await expect(page.getByLabel('Diameter').inputValue()).resolves.toBe('50')
    await page.getByTestId('plan-curve-chart').locator('canvas').first().waitFor()
    await page.getByTestId('plan-profile-chart').locator('canvas').first().waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/planner-bar-oil-air.png`, fullPage: true })

    await page.getByTestId('check-button').click()
    await page.getByTestId('check-result').waitFor()
    expect(await page.getByTestId('check-result').textContent()).toMatch(/Largest difference: [0-9.e-]+ K/)
    await page.context().close()
  })

  it('the demo drive pin shows its temperature-dependent time beside the constant-property estimate, and the method, in °F too', async () => {
    const metallurgist = await signInDemo('metallurgist')
    const list = (await metallurgist.request('/api/plans')).body as { id: number; name: string }[]
    const pin = list.find((p) => p.name.startsWith('Drive pin'))!
    const stored = (await metallurgist.request(`/api/plans/${pin.id}`)).body
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist', `/plans/${pin.id}`)
    expect(await headlineSeconds(page)).toBeCloseTo(stored.result.quenchToHandling_s, 6)
    const estimate = page.getByTestId('constant-property-estimate')
    await estimate.waitFor()
    expect(Number(await estimate.locator('strong').getAttribute('data-seconds'))).toBeCloseTo(stored.result.physics.constantPropertyToHandling_s, 6)
    expect(await page.getByTestId('plan-method').textContent()).toMatch(/temperature tables and cooling curves; method: eigenmode series with stepped amplitudes \(modal Galerkin, L-stable SDIRK sub-steps\), estimated error [0-9.]+ K/)
    await page.getByTestId('plan-curve-chart').locator('canvas').first().waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/planner-drive-pin-two-times.png`, fullPage: true })
    await page.getByLabel('Temperature unit').selectOption('F')
    // A kelvin of error is 1.8 °F.
    await page.getByTestId('plan-method').getByText(/estimated error [0-9.]+ °F/).waitFor()
    await page.context().close()
  }, 60_000)

  it('an operator sees plans read-only: no save button, form disabled', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'operator', '/plans')
    await page.getByTestId('plans-table').waitFor()
    await page.getByTestId('plans-table').getByRole('link').first().click()
    await page.waitForURL((url) => /^\/plans\/\d+$/.test(url.pathname))
    await headlineSeconds(page)
    expect(await page.getByRole('button', { name: 'Save as new revision' }).count()).toBe(0)
    expect(await page.getByLabel('Diameter').isDisabled()).toBe(true)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/planner-operator-read-only.png` })
    await page.context().close()
  })
})
