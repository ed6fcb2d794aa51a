import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { SCREENSHOT_DIR, signInThroughPage, useBrowser } from '../support/browser'

const browser = useBrowser()

const row = (page: Page, table: string, name: string) => page.getByTestId(table).locator(`tbody tr[data-name="${name}"]`)

describe('quench media', () => {
  it('a metallurgist adds a medium: an inline error first, then the row in the table, in °C and °F', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist', '/library/quenchants')
    await page.getByTestId('quenchants-table').waitFor()
    await page.getByRole('button', { name: 'Add quench medium' }).click()
    const form = page.getByTestId('quenchant-form')
    const name = `Tank 3 PAG 15 % ${Date.now()}`
    await form.getByLabel('Name').fill(name)
    await form.getByLabel('Kind').selectOption('polymer')
    await form.getByLabel('Low (W/m²·K)').fill('3000')
    await form.getByLabel('Typical (W/m²·K)').fill('2200')
    await form.getByLabel('High (W/m²·K)').fill('3800')
    await form.getByLabel('Bath temperature (°C)').fill('30')
    await form.getByLabel('Source', { exact: true }).fill('Kestrel Bay probe test, tank 3, March')
    await form.getByRole('button', { name: 'Add quench medium' }).click()

    // The shared schema refuses a low coefficient above the typical one before anything is sent.
    const lowError = form.locator('#quenchant-low ~ .field-error')
    await expect(lowError.textContent()).resolves.toBe('The low coefficient cannot exceed the typical one')
    expect(await form.getByLabel('Low (W/m²·K)').getAttribute('aria-invalid')).toBe('true')
    expect(await row(page, 'quenchants-table', name).count()).toBe(0)
    await page.screenshot({ path: `${SCREENSHOT_DIR}/library-quenchant-inline-error.png`, fullPage: true })

    // A name the server already holds comes back as a 409 and lands under the Name field.
    await form.getByLabel('Low (W/m²·K)').fill('1400')
    await form.getByLabel('Name').fill('Water')
    await form.getByRole('button', { name: 'Add quench medium' }).click()
    await expect(form.locator('#quenchant-name ~ .field-error').textContent()).resolves.toBe('Another quenchant already has this name')

    await form.getByLabel('Name').fill(name)
    await form.getByRole('button', { name: 'Add quench medium' }).click()
    await form.waitFor({ state: 'detached' })
    const added = row(page, 'quenchants-table', name)
    await added.waitFor()
    await expect(added.locator('[data-column="typical"]').textContent()).resolves.toBe('2,200')
    await expect(added.locator('[data-column="bath"]').textContent()).resolves.toBe('30 °C')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/library-quenchant-added.png`, fullPage: true })

    // 30 °C = 86 °F (°F = °C × 9/5 + 32, NIST SP 811 §B.8).
    await page.getByLabel('Temperature unit').selectOption('F')
    await expect(added.locator('[data-column="bath"]').textContent()).resolves.toBe('86 °F')
    await page.context().close()
  })

  it('headers sort and the filter box narrows the table', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'qa', '/library/quenchants')
    const table = page.getByTestId('quenchants-table')
    await table.waitFor()
    const typicals = async () => (await table.locator('[data-column="typical"]').allTextContents()).map((text) => Number(text.replace(/,/g, '')))
    const names = () => table.locator('tbody tr[data-name]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-name')))
    // Sorted by typical h, lowest first (other tests add media of their own, some below still air's 15 W/m²·K):
    // the order holds, and among the seeded media still air comes first.
    const ascending = await typicals()
    expect(ascending).toEqual([...ascending].sort((a, b) => a - b))
    expect((await names()).filter((name) => ['Still air', 'Water', 'Nitrogen gas, 1 bar'].includes(name!))[0]).toBe('Still air')
    await table.getByRole('button', { name: /Typical/ }).click()
    expect(await table.locator('th[aria-sort="descending"]').count()).toBe(1)
    const values = await typicals()
    expect(values).toEqual([...values].sort((a, b) => b - a))
    await page.getByLabel('Filter quench media by name, kind or source').fill('nitrogen')
    expect(await names()).toEqual(['Nitrogen gas, 10 bar', 'Nitrogen gas, 1 bar'])
    await page.context().close()
  })
})

describe('materials', () => {
  it('shows the handbook values with the diffusivity column, sorts by it, filters', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist', '/library/materials')
    const table = page.getByTestId('materials-table')
    await table.waitFor()
    // Incropera et al., Table A.1 prints α = 18.8 × 10⁻⁶ m²/s for AISI 1010 at 300 K (from memory).
    await expect(row(page, 'materials-table', 'AISI 1010').locator('[data-column="alpha"]').textContent()).resolves.toBe('18.8')
    await table.getByRole('button', { name: /Diffusivity/ }).click()
    await table.locator('th[aria-sort="ascending"]', { hasText: 'Diffusivity' }).waitFor()
    // Lowest diffusivities of the seed library, from the Table A.1 values: plain carbon steel at
    // 1000 K, 30.0 / (7854 × 1169) = 3.27 mm²/s (its c_p peaks near the ferrite–austenite change),
    // then AISI 316 at 300 K, whose α the table prints as 3.48 mm²/s.
    const first = await table.locator('tbody tr[data-name]').evaluateAll((rows) =>
      rows.slice(0, 2).map((r) => [r.getAttribute('data-name'), r.querySelector('[data-column="alpha"]')?.textContent]),
    )
    expect(first).toEqual([
      ['Plain carbon steel at 1000 K', '3.27'],
      ['AISI 316 stainless', '3.48'],
    ])
    // "AISI 304" rather than "304": materials other tests create carry timestamps, which may contain 304.
    await page.getByLabel('Filter materials by name, source or note').fill('AISI 304')
    await expect(table.locator('tbody tr[data-name]').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-name')))).resolves.toEqual([
      'AISI 304 stainless',
      'AISI 304 stainless at 600 K',
      'AISI 304 stainless at 1000 K',
    ])
    await page.getByLabel('Filter materials by name, source or note').fill('')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/library-materials-metallurgist.png`, fullPage: true })

    // Editing opens the form filled in, with α recomputed live: 13.4 / (8238 × 468) = 3.48 mm²/s.
    await page.getByRole('button', { name: 'Edit AISI 316 stainless' }).click()
    const form = page.getByTestId('material-form')
    await expect(form.getByLabel('Density ρ (kg/m³)').inputValue()).resolves.toBe('8238')
    expect((await form.getByTestId('alpha-preview').textContent())?.trim()).toBe('3.48 mm²/s')
    await form.getByLabel('Graded profile').fill('0, 13.4, 3855384\n0.5, 13.4')
    await form.getByRole('button', { name: 'Save changes' }).click()
    await expect(form.locator('#material-profile ~ .field-error').textContent()).resolves.toBe('Line 2: write x, k and ρc as three numbers')
    await form.getByLabel('Graded profile').fill('')
    await form.getByLabel('Notes').fill('Checked against the mill certificate, heat 7731')
    await form.getByRole('button', { name: 'Save changes' }).click()
    await form.waitFor({ state: 'detached' })
    await expect(row(page, 'materials-table', 'AISI 316 stainless').textContent()).resolves.toContain('Checked against the mill certificate, heat 7731')
    await page.context().close()
  })
})

describe('read-only roles', () => {
  it.each(['operator', 'qa'] as const)('%s sees both tables without edit controls', async (role) => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, role, '/library/materials')
    await page.getByTestId('materials-table').waitFor()
    expect(await page.getByTestId('materials-table').locator('tbody tr[data-name]').count()).toBeGreaterThanOrEqual(11)
    expect(await page.getByRole('button', { name: /^(Add material|Edit)/ }).count()).toBe(0)
    await page.getByTestId('read-only-note').waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/library-materials-${role}.png`, fullPage: true })

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Quench media' }).click()
    await page.getByTestId('quenchants-table').waitFor()
    expect(await page.getByTestId('quenchants-table').locator('tbody tr[data-name]').count()).toBeGreaterThanOrEqual(9)
    expect(await page.getByRole('button', { name: /^(Add quench medium|Edit)/ }).count()).toBe(0)
    await page.getByTestId('quenchant-caution').waitFor()
    await page.screenshot({ path: `${SCREENSHOT_DIR}/library-quenchants-${role}.png`, fullPage: true })
    await page.context().close()
  })
})

describe('tables and curves', () => {
  it('a material shows its property table and a medium its cooling curves, each with its source', async () => {
    const page = await browser.tabletPage()
    await signInThroughPage(page, 'metallurgist', '/library/materials')
    const steel = row(page, 'materials-table', '1 Cr–½ Mo low-alloy steel').getByTestId('property-table')
    await steel.locator('summary').click()
    // Table A.1 (Incropera et al., from memory), 1 Cr–½ Mo at 300 K: k 42.3 W/m·K, cₚ 442 J/kg·K; then the cₚ peak near 750 °C.
    const first = await steel.locator('tbody tr').first().locator('td').allTextContents()
    expect(first.slice(1, 3)).toEqual(['42.3', '442'])
    expect(await steel.locator('tbody tr').count()).toBe(8)
    await expect(steel.textContent()).resolves.toContain('Table A.1')
    await expect(steel.textContent()).resolves.toContain('common practice, from memory')

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Quench media' }).click()
    const oil = row(page, 'quenchants-table', 'Fast quench oil, agitated').getByTestId('cooling-curves')
    await oil.locator('summary').click()
    await expect(oil.textContent()).resolves.toContain('Common practice, from memory')
    const air = row(page, 'quenchants-table', 'Still air').getByTestId('cooling-curves')
    await air.locator('summary').click()
    await expect(air.textContent()).resolves.toContain('0.8')
    await page.screenshot({ path: `${SCREENSHOT_DIR}/library-curves-metallurgist.png`, fullPage: true })
    await page.context().close()
  })
})
