/**
 * A metallurgist uploads a probe log through the logs page (preview, column mapping,
 * store), sees it charted, fits a constant h on the calibration page with progress
 * shown (in °F), and reads the fitted h: the log was made at 1800 W/m²K (tests/support/probeLog.ts).
 * Then saves the fit as a medium's curve (a medium of its own, so the demo library
 * stays as other tests expect it) and finds the provenance on the quench media page.
 */
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'
import { signInDemo } from '../support/http'
import { createLibraryFixture } from '../support/library'
import { syntheticProbeCsv } from '../support/probeLog'

const browser = useBrowser()

describe('calibrating a medium from a probe log', () => {
  it('upload, map, store, chart; then fit and read h within 2 % of the h that made the log', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'probe-')), `kestrel-bay-oil-tank-2-${Date.now()}.csv`)
    writeFileSync(file, syntheticProbeCsv(1800))
    const api = await signInDemo('metallurgist')
    const medium = (await api.request(`/api/quenchants/${(await createLibraryFixture(api)).oilId}`)).body
    const page = await browser.desktopPage()
    await signInThroughPage(page, 'metallurgist', '/logs')
    await page.getByTestId('log-file').setInputFiles(file)
    const preview = page.getByTestId('log-preview')
    await preview.waitFor()
    await expect(preview.textContent()).resolves.toContain('400 rows, separated by commas; time as seconds.')
    await expect(page.getByLabel('Time column').inputValue()).resolves.toBe('Elapsed (s)')
    // The bath column is mapped too; both headers say °C.
    await page.getByTestId('log-store').click()
    await page.getByTestId('log-stored').waitFor()
    await expect(page.getByTestId('log-stored').textContent()).resolves.toContain('400 rows over 79.8 s')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/logs-stored.png`, fullPage: true })

    await page.getByTestId('log-stored').getByRole('link', { name: 'View it' }).click()
    await page.getByTestId('log-chart').waitFor()
    await page.getByRole('link', { name: 'Calibrate a medium' }).click()
    await page.getByTestId('fit-run').waitFor()
    await expect(page.getByLabel('Channel').inputValue()).resolves.toBe('Probe centre (°C)')
    // In °F the bath reads 140 (60 °C × 9/5 + 32, NIST SP 811 §B.8) and is sent back as 60 °C:
    // a bath taken as 140 °C would put the fitted h far from the 1800 that made the log.
    await page.getByLabel('Temperature unit').selectOption('F')
    await expect(page.getByLabel(/^Bath temperature, °F/).inputValue()).resolves.toBe('140')
    await page.getByTestId('fit-run').click()
    const h = page.getByTestId('fitted-h')
    await h.waitFor({ timeout: 30_000 })
    const value = Number((await h.textContent())!.match(/h = ([\d,]+) W/)![1]!.replace(/,/g, ''))
    expect(Math.abs(value / 1800 - 1)).toBeLessThan(0.02)
    // Residuals in the user's unit as temperature differences: under 0.5 K is under 0.9 °F.
    const fitRms_F = Number((await page.getByTestId('fit-residuals').textContent())!.match(/rms (\d+\.\d\d) °F/)![1])
    expect(fitRms_F / 1.8).toBeLessThan(0.5)
    await page.getByTestId('calibration-rate-chart').waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/calibration-fitted.png`, fullPage: true })

    await page.getByLabel('Quench medium').selectOption({ label: medium.name })
    await page.getByTestId('calibration-save').click()
    const saved = page.getByTestId('calibration-saved')
    await saved.waitFor({ timeout: 30_000 })
    await expect(saved.textContent()).resolves.toContain(`Saved as the curves of ${medium.name}`)
    await saved.getByRole('link', { name: 'See it in the library' }).click()
    const row = page.locator(`tr[data-name="${medium.name}"]`)
    const provenance = row.getByTestId('calibration-provenance')
    await provenance.waitFor()
    const text = (await provenance.textContent())!.replace(/\s+/g, ' ')
    expect(text).toContain(`Calibrated from log “${file.split('/').at(-1)}” (Probe centre (°C); Standard nickel-alloy probe (ISO 9950)`)
    // Still in °F: the rms is shown as a temperature difference, 1 K = 1.8 °F, so under 0.5 K is under 0.9 °F.
    const rms_F = Number(text.match(/by Mira Okonkwo: one constant h, rms (\d+\.\d\d) °F over 400 points\./)![1])
    expect(rms_F / 1.8).toBeLessThan(0.5)
    // The typical coefficient is now the fitted h, within 2 % of the 1800 W/m²K the log was made with.
    const typical = Number((await row.locator('[data-column="typical"]').textContent())!.replace(/,/g, ''))
    expect(Math.abs(typical / 1800 - 1)).toBeLessThan(0.02)
    await provenance.scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/calibration-saved-in-library.png`, fullPage: true })
    await page.context().close()
  })
})
