import { describe, expect, it } from 'vitest'
import { symmetricRoot, uniformInitialCoefficient } from '../../../server/thermal/eigenRoots'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import type { Geometry } from '../../../server/thermal/types'
import { centreSeries, fixedSurfaceSphere } from '../../support/referenceValues'
import { convective, fixed, uniformProblem } from './helpers'

const K = 40
const RHOCP = 7850 * 475
const KAPPA = K / RHOCP

describe('decay rates of fixed-face slabs (separation of variables, Carslaw & Jaeger §3.3)', () => {
  it.each([0.01, 0.05])('symmetric slab, half-thickness L = %f m: μ_n = κ((2n − 1)π/2L)²', (L) => {
    const sol = solveCooldown(uniformProblem('slab', L, K, RHOCP, 800, [{ outer: fixed(20) }]), { minModes: 8 })
    sol.summaries[0].decayRates_per_s.slice(0, 8).forEach((mu, i) => {
      expect(mu / (KAPPA * (((2 * i + 1) * Math.PI) / (2 * L)) ** 2) - 1).toBeCloseTo(0, 12)
    })
  })

  it.each([0.02, 0.1])('full thickness W = %f m, both faces fixed: μ_n = κ(nπ/W)²', (W) => {
    const sol = solveCooldown(uniformProblem('slab', W, K, RHOCP, 800, [{ inner: fixed(20), outer: fixed(20) }]), { minModes: 8 })
    sol.summaries[0].decayRates_per_s.slice(0, 8).forEach((mu, i) => {
      expect(mu / (KAPPA * (((i + 1) * Math.PI) / W) ** 2) - 1).toBeCloseTo(0, 12)
    })
    // Mid-plane of the full-thickness slab is the "centre".
    expect(sol.centreX).toBe(0.5)
  })
})

describe('full series against mpmath (tests/fixtures/reference-values.json)', () => {
  // The fixture sums the series to 40 digits; the engine truncates at 0.01 K unless
  // asked for more modes, so it gets 40 here, far past any term that matters at Fo ≥ 0.05.
  it.each(centreSeries.map((row) => [row.geometry, row.bi, row.fo, row.centreRatio] as const))(
    '%s, Bi = %f, Fo = %f: centre excess ratio %f',
    (g, bi, fo, ratio) => {
      const L = 0.03
      const outer = bi === Infinity ? fixed(20) : convective((bi * K) / L, 20)
      const sol = solveCooldown(uniformProblem(g, L, K, RHOCP, 820, [{ outer }]), { earliest_s: (0.05 * L * L) / KAPPA, minModes: 40 })
      const theta = (sol.evaluate((fo * L * L) / KAPPA, 0) - 20) / 800
      // Slab and sphere: exact trigonometry, 1e-10; rods: the Bessel values' ≈ 1e-8.
      expect(Math.abs(theta - ratio)).toBeLessThan(g === 'rod' ? 1e-7 : 1e-10)
    },
  )

  it.each(fixedSurfaceSphere.map((row) => [row.x, row.fo, row.ratio] as const))(
    'sphere held at its surface, x = %f, Fo = %f: the sine series gives %f',
    (x, fo, ratio) => {
      const R = 0.02
      const sol = solveCooldown(uniformProblem('sphere', R, K, RHOCP, 820, [{ outer: fixed(20) }]), { earliest_s: (0.02 * R * R) / KAPPA, minModes: 60 })
      expect(Math.abs((sol.evaluate((fo * R * R) / KAPPA, x) - 20) / 800 - ratio)).toBeLessThan(1e-10)
    },
  )
})

describe('one-term approximation (Incropera §5.5: within 2% for Fo ≥ 0.2)', () => {
  it.each([
    ['slab', Infinity],
    ['slab', 1],
    ['rod', 5],
    ['sphere', 0.5],
  ] as [Geometry, number][])('%s, Bi = %f: centre excess ratio within 2%% of C1 e^{−ζ1² Fo} at Fo = 0.2, 0.5, 1', (g, bi) => {
    const L = 0.03
    const outer = bi === Infinity ? fixed(20) : convective((bi * K) / L, 20)
    const sol = solveCooldown(uniformProblem(g, L, K, RHOCP, 820, [{ outer }]), { earliest_s: 0.01 * (L * L) / KAPPA })
    const zeta = symmetricRoot(g, 1, bi)
    const c1 = uniformInitialCoefficient(g, zeta)
    for (const fo of [0.2, 0.5, 1]) {
      const theta = (sol.evaluate((fo * L * L) / KAPPA, 0) - 20) / 800
      const oneTerm = c1 * Math.exp(-zeta * zeta * fo)
      expect(Math.abs(oneTerm / theta - 1)).toBeLessThan(0.02)
    }
  })
})

describe('lumped-capacitance limit (Incropera §5.1: Bi < 0.1 within ~5%)', () => {
  it.each([
    ['slab', 1],
    ['rod', 2],
    ['sphere', 3],
  ] as [Geometry, number][])('%s at Bi = 0.05: mean excess ratio vs exp(−hA t/ρcV), A/V = (m+1)/L', (g, mPlus1) => {
    const L = 0.02
    const h = (0.05 * K) / L
    const sol = solveCooldown(uniformProblem(g, L, K, RHOCP, 850, [{ outer: convective(h, 50) }]))
    const rate = (h * mPlus1) / (RHOCP * L)
    for (const ratio of [0.8, 0.4, 0.1]) {
      const t = -Math.log(ratio) / rate
      const theta = (sol.mean(t) - 50) / 800
      expect(Math.abs(theta / ratio - 1)).toBeLessThan(0.05)
    }
  })
})

describe('textbook worked example', () => {
  // Çengel & Ghajar, Heat and Mass Transfer, Ch. 4, "cooling of a long stainless steel
  // cylindrical shaft" (provenance: DEVELOPERS.md, "Provenance of numbers"): D = 20 cm, T_i = 600 °C, T∞ = 200 °C, h = 80 W/m²K,
  // k = 14.9 W/mK, α = 3.95e-6 m²/s; after 45 min the one-term table (Bi = 0.537,
  // λ1 = 0.970, A1 = 1.122, τ = 1.07) gives θ0 = 0.41, T0 ≈ 364 °C. Tolerance ±2 K for
  // the 3-figure table values.
  it('stainless shaft centre after 45 min ≈ 364 °C', () => {
    const k = 14.9
    const sol = solveCooldown(uniformProblem('rod', 0.1, k, k / 3.95e-6, 600, [{ outer: convective(80, 200) }]))
    expect(sol.summaries[0].biot).toBeCloseTo(0.537, 3)
    expect(Math.abs(sol.evaluate(45 * 60, 0) - 364)).toBeLessThan(2)
  })
})

describe('series coefficients and truncation', () => {
  it.each(['slab', 'rod', 'sphere'] as Geometry[])(
    '%s: closed-form C_n (Incropera eqs. 5.39b, 5.50c, 5.51c) equal quadrature projection of a flat profile to 1e-6 K',
    (g) => {
      const outer = convective(600, 40)
      const flat = uniformProblem(g, 0.025, K, RHOCP, 800, [{ outer }])
      const table = uniformProblem(g, 0.025, K, RHOCP, [{ x: 0, T_C: 800 }, { x: 1, T_C: 800 }], [{ outer }])
      const a = solveCooldown(flat, { earliest_s: 2, minModes: 30 })
      const b = solveCooldown(table, { earliest_s: 2, minModes: 30 })
      // The rod's Bessel values carry ≈ 3e-9 absolute error, i.e. ≈ 3e-6 K on an 800 K drop.
      const tol = g === 'rod' ? 1e-5 : 1e-6
      for (const t of [2, 20, 200]) for (const x of [0, 0.4, 0.9, 1]) expect(Math.abs(a.evaluate(t, x) - b.evaluate(t, x))).toBeLessThan(tol)
    },
  )

  it.each([
    ['slab', 0.5],
    ['rod', 2],
    ['sphere', 5],
  ] as [Geometry, number][])('%s: the reported truncation error (< 0.01 K) bounds the dropped tail at the earliest time (t = %f s)', (g, t) => {
    const problem = uniformProblem(g, 0.02, K, RHOCP, 850, [{ outer: convective(2000, 60) }])
    const cut = solveCooldown(problem, { earliest_s: t })
    const full = solveCooldown(problem, { earliest_s: t, minModes: 300 })
    const reported = cut.summaries[0].truncationError_K
    expect(reported).toBeLessThan(0.01)
    for (const x of [0, 0.5, 0.95, 1]) expect(Math.abs(cut.evaluate(t, x) - full.evaluate(t, x))).toBeLessThanOrEqual(reported + 1e-9)
  })
})

describe('time to target', () => {
  it('finds the FIRST crossing when the surface dips under the target in oil and rebounds in air', () => {
    // Rod: 10 s in agitated oil chills the surface to ≈ 420 °C, then still air lets it
    // re-warm from the core to ≈ 650 °C before everything cools slowly.
    const problem = uniformProblem('rod', 0.04, K, RHOCP, 850, [
      { outer: convective(3000, 60), duration_s: 10 },
      { outer: convective(10, 25) },
    ])
    const sol = solveCooldown(problem, { earliest_s: 0.5 })
    const target = 500
    const t = sol.targetTime('surface', { below_C: target }) as number
    expect(Math.abs(sol.evaluate(t, 1) - target)).toBeLessThan(1e-6)
    expect(t).toBeLessThan(10)
    for (let s = 0.5; s < t - 1e-3; s += 0.05) expect(sol.evaluate(s, 1)).toBeGreaterThan(target)
    // It is indeed non-monotone: the surface is back above the target after the oil,
    // and would cross again much later in air.
    expect(sol.evaluate(60, 1)).toBeGreaterThan(target)
    expect(sol.evaluate(20000, 1)).toBeLessThan(target)
  })
})

describe('time to target at a stage start', () => {
  it.each(['slab', 'rod', 'sphere'] as const)(
    '%s: a surface held at 20 °C is below 100 °C from the first instant (the closed-form surface value), without a search failure',
    (geometry) => {
      // A fixed surface temperature is the boundary condition itself: T(R, t) = 20 °C for every t > 0.
      const problem = uniformProblem(geometry, 0.02, K, RHOCP, 850, [{ outer: fixed(20) }])
      const sol = solveCooldown(problem, { earliest_s: 1 })
      const t = sol.targetTime('surface', { below_C: 100 }) as number
      expect(t).toBeGreaterThanOrEqual(0)
      expect(t).toBeLessThan(1)
      expect(sol.evaluate(1, 1)).toBeCloseTo(20, 6)
    },
  )
})
