import { describe, expect, it } from 'vitest'
import { materialInputSchema, materialPatchSchema } from '../../../shared/schemas/material'
import { quenchantInputSchema, quenchantPatchSchema } from '../../../shared/schemas/quenchant'

function problems(result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
  expect(result.success).toBe(false)
  return result.error!.issues.map((issue) => [issue.path.map(String).join('.'), issue.message])
}

const material = {
  name: 'Test steel',
  k_W_mK: 50,
  density_kg_m3: 7850,
  specificHeat_J_kgK: 460,
  source: 'Shop measurement',
}

const quenchant = {
  name: 'Test oil',
  kind: 'oil',
  hTypical_W_m2K: 1200,
  hLow_W_m2K: 900,
  hHigh_W_m2K: 1600,
  bath_C: 60,
  source: 'Shop probe',
}

describe('material input', () => {
  it('fills the optional fields with null', () => {
    const defaults = { propertiesAt_C: null, gradedProfile: null, propertyTable: null, propertyTableSource: null, notes: null }
    expect(materialInputSchema.parse(material)).toEqual({ ...material, ...defaults })
  })

  it.each([
    [{ name: 'A' }, 'name', 'Name needs at least 2 characters'],
    [{ k_W_mK: -1 }, 'k_W_mK', 'Thermal conductivity must be between 0.1 W/m·K and 500 W/m·K (from insulating coatings to silver and copper)'],
    [{ k_W_mK: 900 }, 'k_W_mK', 'Thermal conductivity must be between 0.1 W/m·K and 500 W/m·K (from insulating coatings to silver and copper)'],
    [{ density_kg_m3: '7850' }, 'density_kg_m3', 'Density must be between 500 kg/m³ and 25 000 kg/m³ (from the lightest to the densest metals)'],
    [{ specificHeat_J_kgK: 0 }, 'specificHeat_J_kgK', 'Specific heat must be between 100 J/kg·K and 5000 J/kg·K (a metal or alloy)'],
    [{ propertiesAt_C: -300 }, 'propertiesAt_C', 'Reference temperature cannot be below absolute zero'],
    [{ source: '' }, 'source', 'Say where the values come from'],
    [{ notes: 'x'.repeat(2001) }, 'notes', 'Notes are too long'],
    [{ gradedProfile: [{ x: 0.1, k: 50, rhoCp: 3.6e6 }, { x: 1, k: 50, rhoCp: 3.6e6 }] }, 'gradedProfile', 'A graded profile must run from x = 0 (centre) to x = 1 (surface)'],
    [{ gradedProfile: [{ x: 0, k: 50, rhoCp: 3.6e6 }, { x: 1, k: -5, rhoCp: 3.6e6 }] }, 'gradedProfile.1.k', 'Conductivity must be between 0.1 W/m·K and 500 W/m·K (from insulating coatings to silver and copper)'],
    // Once hung or crashed the engine: a conductivity jump of 1e12 (here 0.1 to 400, 4000×) and 1000 alternating points hung or crashed the engine.
    [{ gradedProfile: [{ x: 0, k: 0.1, rhoCp: 3.6e6 }, { x: 0.5, k: 0.1, rhoCp: 3.6e6 }, { x: 0.5, k: 400, rhoCp: 3.6e6 }, { x: 1, k: 400, rhoCp: 3.6e6 }] }, 'gradedProfile.2.k', 'Conductivity differs from the previous point’s conductivity by more than 1000× (no real layer does)'],
    [{ gradedProfile: Array.from({ length: 1000 }, (_, i) => ({ x: i / 999, k: i % 2 ? 10 : 60, rhoCp: 3.6e6 })) }, 'gradedProfile', 'A graded profile has at most 64 points'],
    [{ gradedProfile: [{ x: 0, k: 50, rhoCp: 3.6e6 }, { x: 0.5, k: 50, rhoCp: 3.6e6 }, { x: 0.50001, k: 45, rhoCp: 3.6e6 }, { x: 1, k: 45, rhoCp: 3.6e6 }] }, 'gradedProfile.2.x', 'x must be the previous x (a jump) or at least 0.0001 from it'],
    [{ gradedProfile: [{ x: 0, k: 50, rhoCp: 3.6e6 }, { x: 0.9, k: 50, rhoCp: 3.6e6 }, { x: 0.5, k: 45, rhoCp: 3.6e6 }, { x: 1, k: 45, rhoCp: 3.6e6 }] }, 'gradedProfile.2.x', 'x must not decrease'],
    [{ propertyTable: [{ T_C: 20, k: 50, cp: 460 }], propertyTableSource: 'lab' }, 'propertyTable', 'A property table needs at least two rows'],
    [{ propertyTable: [{ T_C: 20, k: 50, cp: 460 }, { T_C: 400, k: 42, cp: 590 }, { T_C: 300, k: 44, cp: 560 }], propertyTableSource: 'lab' }, 'propertyTable.2.T_C', 'Temperatures must rise strictly from row to row'],
    [{ propertyTable: [{ T_C: 20, k: 50, cp: 460 }, { T_C: 20, k: 48, cp: 470 }], propertyTableSource: 'lab' }, 'propertyTable.1.T_C', 'Temperatures must rise strictly from row to row'],
    [{ propertyTable: [{ T_C: 20, k: -50, cp: 460 }, { T_C: 400, k: 42, cp: 590 }], propertyTableSource: 'lab' }, 'propertyTable.0.k', 'Conductivity must be between 0.1 W/m·K and 500 W/m·K (from insulating coatings to silver and copper)'],
    [{ propertyTable: [{ T_C: 20, k: 50, cp: 460, rho: -1 }, { T_C: 400, k: 42, cp: 590 }], propertyTableSource: 'lab' }, 'propertyTable.0.rho', 'Density must be between 500 kg/m³ and 25 000 kg/m³ (from the lightest to the densest metals)'],
    [{ propertyTable: [{ T_C: 20, k: 50, cp: 460 }, { T_C: 400, k: 42, cp: 590 }] }, 'propertyTableSource', 'Say where the table comes from'],
    [{ propertyTable: [{ T_C: 20, k: 50, cp: 460 }, { T_C: 400, k: 42, cp: 590 }], propertyTableSource: 'lab', gradedProfile: [{ x: 0, k: 50, rhoCp: 3.6e6 }, { x: 1, k: 45, rhoCp: 3.6e6 }] }, 'propertyTable', 'A graded material cannot also carry a temperature table; use one or the other'],
  ])('refuses %j naming %s', (change, field, message) => {
    expect(problems(materialInputSchema.safeParse({ ...material, ...change }))).toContainEqual([field, message])
  })

  it('refuses unknown keys instead of ignoring them', () => {
    expect(materialInputSchema.safeParse({ ...material, alpha: 1 }).success).toBe(false)
  })

  it('a patch carries only the fields sent, and must send one', () => {
    expect(materialPatchSchema.parse({ notes: ' re-measured ' })).toEqual({ notes: 're-measured' })
    expect(problems(materialPatchSchema.safeParse({}))).toContainEqual(['', 'Send at least one field to change'])
    expect(problems(materialPatchSchema.safeParse({ k_W_mK: 0 }))).toContainEqual(['k_W_mK', 'Thermal conductivity must be between 0.1 W/m·K and 500 W/m·K (from insulating coatings to silver and copper)'])
  })
})

describe('quenchant input', () => {
  it('accepts a coherent medium', () => {
    expect(quenchantInputSchema.parse(quenchant)).toEqual({ ...quenchant, coolingCurves: null, emissivity: null, curveSource: null, notes: null })
  })

  const curve = (points: [number, number][]) => points.map(([T_C, h]) => ({ T_C, h }))
  const curves = {
    low: curve([[60, 300], [500, 2000], [800, 400]]),
    typical: curve([[60, 400], [500, 3000], [800, 500]]),
    high: curve([[60, 500], [500, 4000], [800, 600]]),
  }

  it('accepts cooling curves with their source, and an emissivity on air with curves', () => {
    expect(quenchantInputSchema.parse({ ...quenchant, coolingCurves: curves, curveSource: 'probe test' }).coolingCurves).toEqual(curves)
    const air = { ...quenchant, kind: 'still-air', hLow_W_m2K: 5, hTypical_W_m2K: 15, hHigh_W_m2K: 80, bath_C: 25 }
    expect(quenchantInputSchema.parse({ ...air, coolingCurves: curves, curveSource: 'probe', emissivity: 0.8 }).emissivity).toBe(0.8)
  })

  it.each([
    [{ coolingCurves: { ...curves, typical: curve([[60, 400], [500, 3000]]) }, curveSource: 'probe' }, 'coolingCurves.typical', 'A cooling curve needs at least three points'],
    [{ coolingCurves: { ...curves, typical: curve([[60, 400], [800, 3000], [500, 500]]) }, curveSource: 'probe' }, 'coolingCurves.typical.2.T_C', 'Surface temperatures must rise strictly from point to point'],
    [{ coolingCurves: { ...curves, high: curve([[60, 500], [500, -4000], [800, 600]]) }, curveSource: 'probe' }, 'coolingCurves.high.1.h', 'Coefficient must be between 1 W/m²·K and 100 000 W/m²·K (from still gas to the fiercest spray quench)'],
    [{ coolingCurves: curves }, 'curveSource', 'Say where the curves come from'],
    [{ coolingCurves: { ...curves, low: curve([[60, 300], [500, 3500], [800, 400]]) }, curveSource: 'probe' }, 'coolingCurves.low', 'The low curve cannot exceed the typical one (at 500 °C)'],
    [{ coolingCurves: { ...curves, high: curve([[60, 500], [650, 3000], [800, 600]]) }, curveSource: 'probe' }, 'coolingCurves.high', 'The high curve cannot be below the typical one (at 500 °C)'],
    [{ emissivity: 0.8, coolingCurves: curves, curveSource: 'probe' }, 'emissivity', 'Emissivity applies to air and gas media only; a liquid’s curve already includes its radiation'],
    [{ emissivity: 1.2, kind: 'gas' }, 'emissivity', 'Emissivity cannot be above 1'],
    [{ emissivity: 0.8, kind: 'gas' }, 'emissivity', 'Emissivity adds radiation to the cooling curves; give the curves with it'],
  ])('refuses curves or emissivity %j naming %s', (change, field, message) => {
    expect(problems(quenchantInputSchema.safeParse({ ...quenchant, ...change }))).toContainEqual([field, message])
  })

  it.each([
    [{ kind: 'brine' }, 'kind', 'Kind must be one of: oil, water, polymer, salt, forced-air, still-air, gas'],
    [{ hTypical_W_m2K: 0 }, 'hTypical_W_m2K', 'Typical coefficient must be between 1 W/m²·K and 100 000 W/m²·K (from still gas to the fiercest spray quench)'],
    [{ hLow_W_m2K: 1300 }, 'hLow_W_m2K', 'The low coefficient cannot exceed the typical one'],
    [{ hHigh_W_m2K: 1000 }, 'hHigh_W_m2K', 'The high coefficient cannot be below the typical one'],
    [{ hHigh_W_m2K: 200000 }, 'hHigh_W_m2K', 'High coefficient must be between 1 W/m²·K and 100 000 W/m²·K (from still gas to the fiercest spray quench)'],
    [{ bath_C: 800 }, 'bath_C', 'Bath temperature above 700 °C is not supported'],
    [{ bath_C: null }, 'bath_C', 'Bath temperature must be a number (°C)'],
    [{ name: undefined }, 'name', 'Name is required'],
    [{ source: ' ' }, 'source', 'Say where the values come from'],
  ])('refuses %j naming %s', (change, field, message) => {
    expect(problems(quenchantInputSchema.safeParse({ ...quenchant, ...change }))).toContainEqual([field, message])
  })

  it('a patch is checked field by field; the order of the coefficients is checked on the merged record', () => {
    expect(quenchantPatchSchema.parse({ hLow_W_m2K: 5000 })).toEqual({ hLow_W_m2K: 5000 })
    expect(problems(quenchantInputSchema.safeParse({ ...quenchant, hLow_W_m2K: 5000 }))).toContainEqual(['hLow_W_m2K', 'The low coefficient cannot exceed the typical one'])
    expect(problems(quenchantPatchSchema.safeParse({ bath_C: 'hot' }))).toContainEqual(['bath_C', 'Bath temperature must be a number (°C)'])
  })
})
