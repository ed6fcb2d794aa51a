import { describe, expect, it } from 'vitest'
import { planSpecSchema, resolvedPlanSchema, type ResolvedPlan } from '../../shared/schemas/plan'
import { engineBody, volumeToSurface_m, characteristicLength_m } from '../../server/planning/shapes'
import { furnaceCoefficient_W_m2K } from '../../server/planning/furnace'
import { computePlan, curveCsv, planField, quenchCase } from '../../server/planning/computePlan'
import { referenceTimeToCentre_s } from '../support/productReference'
import { pointValue } from '../../shared/pointSeries'
import type { PlanResult } from '../../shared/types/planResult'
import { firstMode } from '../support/referenceValues'

const validSpec = {
  name: 'Shaft 40 mm',
  part: { shape: 'round-bar', diameter_m: 0.04 },
  materialId: 1,
  start_C: 850,
  stages: [{ quenchantId: 1, duration_s: 60 }, { quenchantId: 2 }],
  handling: { below_C: 100 },
}

const library: ResolvedPlan['library'] = {
  material: { id: 1, name: 'Medium-carbon steel', k_W_mK: 40, density_kg_m3: 7850, specificHeat_J_kgK: 475, gradedProfile: null, source: 'test' },
  quenchants: [
    { id: 1, name: 'Oil', kind: 'oil', hLow_W_m2K: 500, hTypical_W_m2K: 800, hHigh_W_m2K: 1200, bath_C: 25, source: 'test' },
    { id: 2, name: 'Still air', kind: 'still-air', hLow_W_m2K: 10, hTypical_W_m2K: 15, hHigh_W_m2K: 25, bath_C: 25, source: 'test' },
    { id: 3, name: 'Agitated water', kind: 'water', hLow_W_m2K: 1500, hTypical_W_m2K: 2000, hHigh_W_m2K: 3000, bath_C: 25, source: 'test' },
  ],
}

const resolved = (over: Record<string, unknown> = {}) => resolvedPlanSchema.parse({ ...validSpec, ...over, library })

describe('plan spec schema', () => {
  it('accepts a plain bar plan and fills the defaults', () => {
    const spec = planSpecSchema.parse(validSpec)
    expect(spec.handling.at).toBe('centre')
    expect(spec.stages[0]!.coefficient).toBe('typical')
    expect(spec.soak).toBeNull()
    expect(planSpecSchema.parse({ ...validSpec, soak: { furnace_C: 850, tolerance_K: 10, minimumSoak_s: 1800 } }).soak).toEqual({
      furnace_C: 850,
      tolerance_K: 10,
      minimumSoak_s: 1800,
      charge_C: 20,
      furnaceH_W_m2K: null,
    })
  })

  it.each([
    ['name', { name: 'x' }],
    ['part.shape', { part: { shape: 'cone', diameter_m: 0.04 } }],
    ['part.diameter_m', { part: { shape: 'round-bar', diameter_m: 0 } }],
    ['part.thickness_m', { part: { shape: 'plate', thickness_m: 'thin' } }],
    ['part.length_m', { part: { shape: 'cylinder', diameter_m: 0.04 } }],
    ['part.sides_m.2', { part: { shape: 'block', sides_m: [0.1, 0.1, -1] } }],
    ['materialId', { materialId: 0 }],
    ['start_C', { start_C: 5000 }],
    ['stages', { stages: [] }],
    ['stages.0.duration_s', { stages: [{ quenchantId: 1 }, { quenchantId: 2 }] }],
    ['stages.1.duration_s', { stages: [{ quenchantId: 1, duration_s: 60 }, { quenchantId: 2, duration_s: 60 }] }],
    ['stages.0.coefficient', { stages: [{ quenchantId: 1, coefficient: 'extreme' }] }],
    ['stages.0.quenchantId', { stages: [{ quenchantId: -3 }] }],
    ['handling.below_C', { handling: { below_C: 900 } }],
    ['handling.at', { handling: { below_C: 100, at: 'corner' } }],
    ['soak.tolerance_K', { soak: { furnace_C: 850, tolerance_K: 900, minimumSoak_s: 0 } }],
    ['soak.minimumSoak_s', { soak: { furnace_C: 850, tolerance_K: 10, minimumSoak_s: -1 } }],
    ['soak.furnaceH_W_m2K', { soak: { furnace_C: 850, tolerance_K: 10, minimumSoak_s: 0, furnaceH_W_m2K: 0 } }],
    ['quenchDelayAllowance_s', { quenchDelayAllowance_s: -5 }],
  ])('names %s', (field, change) => {
    const parsed = planSpecSchema.safeParse({ ...validSpec, ...change })
    expect(parsed.success).toBe(false)
    expect(parsed.error!.issues.map((i) => i.path.join('.'))).toContain(field)
  })
})

describe('shape → engine geometry', () => {
  it.each([
    [{ shape: 'plate', thickness_m: 0.03 }, 'slab', 0.015],
    [{ shape: 'round-bar', diameter_m: 0.04 }, 'rod', 0.02],
    [{ shape: 'sphere', diameter_m: 0.05 }, 'sphere', 0.025],
  ] as const)('%o → %s of half-size %f m (half-thickness / radius)', (part, geometry, size) => {
    expect(engineBody(part)).toEqual({ kind: 'series', geometry, size_m: size })
    expect(quenchCase(resolved({ part }))).toMatchObject({ geometry, size_m: size })
  })

  it('short cylinder → rod of radius D/2 × slab of half-length L/2; block → three slabs of half-sides', () => {
    expect(engineBody({ shape: 'cylinder', diameter_m: 0.04, length_m: 0.1 })).toEqual({
      kind: 'product',
      directions: [
        { label: 'diameter', geometry: 'rod', size_m: 0.02 },
        { label: 'length', geometry: 'slab', size_m: 0.05 },
      ],
    })
    const block = engineBody({ shape: 'block', sides_m: [0.1, 0.2, 0.3] })
    expect(block.kind === 'product' && block.directions.map((d) => [d.geometry, d.size_m])).toEqual([
      ['slab', 0.05],
      ['slab', 0.1],
      ['slab', 0.15],
    ])
    expect(characteristicLength_m({ shape: 'block', sides_m: [0.1, 0.2, 0.3] })).toBe(0.05)
  })

  it('V/A from the volume and cooled area computed directly', () => {
    // Cylinder D 40 × L 100 mm: V = πR²L, A = 2πRL + 2πR². Block a × b × c: V = abc, A = 2(ab + bc + ca).
    const R = 0.02
    const L = 0.1
    expect(volumeToSurface_m({ shape: 'cylinder', diameter_m: 0.04, length_m: L })).toBeCloseTo((Math.PI * R * R * L) / (2 * Math.PI * R * L + 2 * Math.PI * R * R), 14)
    expect(volumeToSurface_m({ shape: 'block', sides_m: [0.1, 0.2, 0.3] })).toBeCloseTo(0.006 / (2 * (0.02 + 0.06 + 0.03)), 14)
    // Sphere V/A = (4/3 πR³)/(4πR²) = R/3; long bar πR²/(2πR) = R/2; plate (both faces) = half-thickness.
    expect(volumeToSurface_m({ shape: 'sphere', diameter_m: 0.06 })).toBeCloseTo(0.01, 14)
    expect(volumeToSurface_m({ shape: 'round-bar', diameter_m: 0.04 })).toBeCloseTo(0.01, 14)
    expect(volumeToSurface_m({ shape: 'plate', thickness_m: 0.03 })).toBeCloseTo(0.015, 14)
  })
})

describe('Biot, Fourier and the one-term rule', () => {
  it('a bar at Bi = 1 past Fo = 0.2: the centre follows the one-term solution with the mpmath constants', () => {
    // Infinite cylinder, Bi = 1: ζ1 and C1 from tests/fixtures/reference-values.json (mpmath);
    // θ*₀ = C1 exp(−ζ1² Fo).
    const { zeta, c1 } = firstMode('rod', 1)
    const result = computePlan(resolved({ stages: [{ quenchantId: 3 }], handling: { below_C: 200 } }))
    const stage = result.stages[0]!
    expect(stage.biot).toBeCloseTo((2000 * 0.02) / 40, 12)
    expect(stage.biotLumped).toBeCloseTo((2000 * 0.01) / 40, 12)
    const alpha = 40 / (7850 * 475)
    const fo = (alpha * result.quenchToHandling_s) / 0.02 ** 2
    expect(result.fourierAtHandling).toBeCloseTo(fo, 12)
    expect(fo).toBeGreaterThan(0.2)
    expect(result.oneTermValid).toBe(true)
    const oneTerm = c1 * Math.exp(-(zeta ** 2) * fo)
    expect(oneTerm).toBeCloseTo((200 - 25) / (850 - 25), 3)
    // The slowest decay rate is ζ1² α / R².
    expect(stage.modes[0]!.decayRate_per_s / ((zeta ** 2 * alpha) / 0.02 ** 2)).toBeCloseTo(1, 8)
  })

  it('below Fo = 0.2 the one-term estimate is flagged as not valid', () => {
    const result = computePlan(resolved({ stages: [{ quenchantId: 3 }], handling: { below_C: 800 } }))
    expect(result.fourierAtHandling).toBeLessThan(0.2)
    expect(result.oneTermValid).toBe(false)
  })
})

describe('furnace coefficient (common practice)', () => {
  it('850 °C furnace, 20 °C charge: 10 + 0.8 σ (T_f² + T_s²)(T_f + T_s) at T_s midway', () => {
    // Incropera eq. 1.9 with T_f = 1123.15 K, T_s = 708.15 K, σ = 5.670374419e-8 (CODATA 2018):
    // (1123.15² + 708.15²) = 1 762 633.2; × 1831.3 = 3.227 909e9; × σ × 0.8 = 146.43; + 10.
    expect(furnaceCoefficient_W_m2K(850, 20)).toBeCloseTo(156.43, 1)
  })
})

describe('product shapes', () => {
  it('one stage: a block centre time equals the closed-form product of three slab series', () => {
    // Source: tests/support/productReference.ts (Carslaw & Jaeger §1.15, product of three slab series, bisected roots).
    const block = computePlan(resolved({ part: { shape: 'block', sides_m: [0.04, 0.08, 0.2] }, stages: [{ quenchantId: 1 }] }))
    const slab = (size_m: number) => ({ geometry: 'slab' as const, size_m })
    const expected = referenceTimeToCentre_s(
      { directions: [slab(0.02), slab(0.04), slab(0.1)], k_W_mK: 40, rhoCp_J_m3K: 7850 * 475, h_W_m2K: 800, initial_C: 850, ambient_C: 25 },
      100,
    )
    expect(block.method).toBe('product')
    expect(block.quenchToHandling_s / expected - 1).toBeCloseTo(0, 6)
  })

  it('a block whose other sides never reach the centre before handling is refused, naming part, with the plate as the way out', () => {
    expect(() => computePlan(resolved({ part: { shape: 'block', sides_m: [0.04, 5, 5] }, stages: [{ quenchantId: 1 }] }))).toThrow(
      expect.objectContaining({ field: 'part', message: expect.stringContaining('plan this part as a plate') }),
    )
  })

  it('the shipped product series stays within 0.05 K of the computed curve from early in each stage', () => {
    const result = computePlan(resolved({ part: { shape: 'block', sides_m: [0.04, 0.08, 0.2] }, stages: [{ quenchantId: 1, duration_s: 60 }, { quenchantId: 2 }] }))
    const series = result.summary.handlingPointSeries
    let worst = 0
    result.curve.t_s.forEach((t, i) => {
      if (t >= 5) worst = Math.max(worst, Math.abs(pointValue(series, t) - result.curve.centre_C[i]!))
    })
    expect(worst).toBeLessThan(0.05)
    expect(pointValue(series, result.quenchToHandling_s)).toBeCloseTo(100, 1)
  })
})

describe('engine field → plan field', () => {
  it.each([
    ['target.below_C', 'quench', 'handling.below_C'],
    ['stages.1.surface.h', 'quench', 'stages.1.quenchantId'],
    ['stages.0.duration_s', 'quench', 'stages.0.duration_s'],
    ['material.profile', 'quench', 'materialId'],
    ['initial_C', 'quench', 'start_C'],
    ['target.above_C', 'heat-up', 'soak.tolerance_K'],
    ['initial_C', 'heat-up', 'soak.charge_C'],
  ] as const)('%s (%s) → %s', (field, context, expected) => {
    expect(planField(field, context)).toBe(expected)
  })
})

describe('curve CSV', () => {
  const result = {
    curve: { t_s: [0, 12.5], centre_C: [850, 100], surface_C: [850, 60.25], mean_C: [850, 80] },
    band: { low: { quenchToHandling_s: 0, handling_C: [850, 120] }, high: { quenchToHandling_s: 0, handling_C: [850, 90] } },
  } as unknown as PlanResult

  it('has units in the header, one CRLF row per curve time, three decimals', () => {
    expect(curveCsv(result)).toBe(
      'time (s),centre (°C),surface (°C),mean (°C),handling point at low coefficients (°C),handling point at high coefficients (°C)\r\n' +
      '0.000,850.000,850.000,850.000,850.000,850.000\r\n' +
      '12.500,100.000,60.250,80.000,120.000,90.000\r\n',
    )
  })

  it('in °F: 100 °C = 212 °F, 60.25 °C = 140.45 °F (°F = °C × 9/5 + 32)', () => {
    const row = curveCsv(result, 'F').split('\r\n')[2]
    expect(row).toBe('12.500,212.000,140.450,176.000,248.000,194.000')
  })
})
