import { describe, expect, it } from 'vitest'
import { materialInputSchema } from '../../../shared/schemas/material'
import { quenchantInputSchema } from '../../../shared/schemas/quenchant'
import { thermalDiffusivity_m2_s, thermalDiffusivity_mm2_s } from '../../../shared/library'
import { DEMO_MATERIALS } from '../../../server/db/demo/materials'
import { DEMO_QUENCHANTS } from '../../../server/db/demo/quenchants'

const byName = (name: string) => {
  const found = DEMO_MATERIALS.find((material) => material.name === name)
  if (!found) throw new Error(`no seed material ${name}`)
  return materialInputSchema.parse(found)
}

describe('thermal diffusivity α = k / (ρ c_p)', () => {
  it('is the closed form in m²/s and mm²/s', () => {
    // AISI 1010 at 300 K: 63.9 / (7832 × 434) = 63.9 / 3 399 088 = 1.879914…e-5 m²/s.
    expect(thermalDiffusivity_m2_s(63.9, 7832, 434)).toBeCloseTo(63.9 / 3_399_088, 18)
    expect(thermalDiffusivity_mm2_s(63.9, 7832, 434)).toBeCloseTo(18.79916, 5)
    // Water-like unit check: 1 W/m·K over 1e6 J/m³·K is exactly 1 mm²/s.
    expect(thermalDiffusivity_mm2_s(1, 1000, 1000)).toBe(1)
  })

  // The table prints α·10⁶ (m²/s) beside k, ρ and c_p at 300 K. Our α from the seed's
  // k, ρ, c_p must round to the printed α: within half a unit in its last digit.
  // Source: Incropera et al., Fundamentals of Heat and Mass Transfer, Table A.1 (from memory).
  it.each([
    ['Plain carbon steel (Mn ≤ 1 %, Si ≤ 0.1 %)', 17.7, 0.05],
    ['AISI 1010', 18.8, 0.05],
    ['1 Cr–½ Mo low-alloy steel', 12.2, 0.05],
    ['AISI 302 stainless', 3.91, 0.005],
    ['AISI 304 stainless', 3.95, 0.005],
    ['AISI 316 stainless', 3.48, 0.005],
  ])('%s: α from the seed values matches the table’s %s mm²/s', (name, tableAlpha_mm2_s, halfUnit) => {
    const { k_W_mK, density_kg_m3, specificHeat_J_kgK } = byName(name)
    expect(Math.abs(thermalDiffusivity_mm2_s(k_W_mK, density_kg_m3, specificHeat_J_kgK) - tableAlpha_mm2_s)).toBeLessThanOrEqual(halfUnit)
  })
})

describe('seed materials', () => {
  it.each(DEMO_MATERIALS.map((material) => [material.name, material] as const))('%s passes the shared schema and names a source', (_name, material) => {
    const parsed = materialInputSchema.safeParse(material)
    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true)
    expect(parsed.data!.source.length).toBeGreaterThan(10)
  })

  it('names are unique (the table has a unique index on name)', () => {
    expect(new Set(DEMO_MATERIALS.map((material) => material.name.toLowerCase())).size).toBe(DEMO_MATERIALS.length)
  })

  // Spot checks against Incropera et al., Table A.1 (from memory): AISI 1010 and AISI 304 at 300 K, 304 at 1000 K.
  it.each([
    ['AISI 1010', { k_W_mK: 63.9, density_kg_m3: 7832, specificHeat_J_kgK: 434 }],
    ['AISI 304 stainless', { k_W_mK: 14.9, density_kg_m3: 7900, specificHeat_J_kgK: 477 }],
    ['AISI 304 stainless at 1000 K', { k_W_mK: 25.4, density_kg_m3: 7900, specificHeat_J_kgK: 611 }],
  ])('%s carries the handbook values', (name, expected) => {
    expect(byName(name)).toMatchObject(expected)
  })

  it('elevated-temperature rows state their temperature: 600 K = 326.85 °C, 1000 K = 726.85 °C', () => {
    expect(byName('Plain carbon steel at 600 K').propertiesAt_C).toBeCloseTo(600 - 273.15, 10)
    expect(byName('AISI 304 stainless at 1000 K').propertiesAt_C).toBeCloseTo(1000 - 273.15, 10)
  })

  it('the case-hardened demo bar is two layers built from the AISI 1010 values and marked illustrative', () => {
    const bar = byName('Case-hardened AISI 1010 bar (demo)')
    const base = byName('AISI 1010')
    const rhoCp = base.density_kg_m3 * base.specificHeat_J_kgK // 7832 × 434 = 3 399 088 J/m³·K
    expect(rhoCp).toBe(3_399_088)
    expect(bar.gradedProfile).toEqual([
      { x: 0, k: 63.9, rhoCp },
      { x: 0.9, k: 63.9, rhoCp },
      { x: 0.9, k: 57.5, rhoCp }, // 0.9 × 63.9 = 57.51, rounded to 0.1
      { x: 1, k: 57.5, rhoCp },
    ])
    expect(bar.notes).toMatch(/DEMO \/ ILLUSTRATIVE/)
    expect(bar.source).toMatch(/illustrative/)
  })
})

describe('seed quench media', () => {
  it.each(DEMO_QUENCHANTS.map((quenchant) => [quenchant.name, quenchant] as const))('%s passes the shared schema, has a source and low ≤ typical ≤ high', (_name, quenchant) => {
    const parsed = quenchantInputSchema.safeParse(quenchant)
    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true)
    const q = parsed.data!
    expect(q.source.length).toBeGreaterThan(10)
    expect(q.hLow_W_m2K).toBeLessThanOrEqual(q.hTypical_W_m2K)
    expect(q.hTypical_W_m2K).toBeLessThanOrEqual(q.hHigh_W_m2K)
  })

  it('covers every kind of medium the schema knows', () => {
    expect(new Set(DEMO_QUENCHANTS.map((quenchant) => quenchant.kind))).toEqual(new Set(['still-air', 'forced-air', 'oil', 'water', 'polymer', 'salt', 'gas']))
  })

  // Incropera et al., Table 1.1: forced convection of gases 25–250 W/m²·K (from memory).
  it('forced air spans the handbook range for forced convection of gases', () => {
    expect(DEMO_QUENCHANTS.find((q) => q.name === 'Forced air (fan)')).toMatchObject({ hLow_W_m2K: 25, hHigh_W_m2K: 250 })
  })

  // Totten, Bates & Clinton, Handbook of Quenchants (ASM, 1993): still oil 1000–1500, agitated oil 1800–2200 W/m²·K (from memory).
  it('agitation raises the oil coefficient, as in the published still/agitated ranges', () => {
    const still = DEMO_QUENCHANTS.find((q) => q.name === 'Fast quench oil, still')!
    const agitated = DEMO_QUENCHANTS.find((q) => q.name === 'Fast quench oil, agitated')!
    expect([still.hLow_W_m2K, still.hHigh_W_m2K]).toEqual([1000, 1500])
    expect([agitated.hLow_W_m2K, agitated.hHigh_W_m2K]).toEqual([1800, 2200])
  })
})
