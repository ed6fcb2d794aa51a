import { describe, expect, it } from 'vitest'
import { besselJ0, besselJ0Zero, besselJ1 } from '../../../server/thermal/bessel'
import { rodRoot, slabRoot, sphereRoot, symmetricRoot, uniformInitialCoefficient } from '../../../server/thermal/eigenRoots'
import type { Geometry } from '../../../server/thermal/types'

describe('Bessel functions', () => {
  // Abramowitz & Stegun (NBS Applied Mathematics Series 55), Table 9.1.
  it.each([
    [0, 1, 0.7651976866, 'A&S Table 9.1'],
    [1, 1, 0.4400505857, 'A&S Table 9.1'],
    [0, 2, 0.2238907791, 'A&S Table 9.1'],
    [1, 2, 0.5767248078, 'A&S Table 9.1'],
  ])('J%i(%f) = %f (%s)', (order, x, value) => {
    expect((order === 0 ? besselJ0 : besselJ1)(x)).toBeCloseTo(value, 8)
  })

  // A&S Table 9.5, zeros j0,s of J0; the library's J values limit us to ~1e-8.
  it.each([
    [1, 2.404825558],
    [2, 5.52007811],
    [3, 8.653727913],
    [4, 11.79153444],
    [5, 14.93091771],
  ])('zero %i of J0 is %f (A&S Table 9.5), and is the fixed-surface rod root', (n, zero) => {
    expect(Math.abs(besselJ0Zero(n) - zero)).toBeLessThan(1e-8)
    expect(Math.abs(rodRoot(n, Infinity) - zero)).toBeLessThan(1e-8)
  })
})

describe('first eigenvalue and one-term coefficient', () => {
  // Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer,
  // Table 5.1 (values from memory, tabulated to 4 decimals).
  it.each([
    ['slab', 0.1, 0.3111, 1.0161],
    ['slab', 1, 0.8603, 1.1191],
    ['slab', 10, 1.4289, 1.262],
    ['rod', 0.1, 0.4417, 1.0246],
    ['rod', 1, 1.2558, 1.2071],
    ['rod', 10, 2.1795, 1.5677],
    ['sphere', 0.1, 0.5423, 1.0298],
    ['sphere', 1, 1.5708, 1.2732],
    ['sphere', 10, 2.8363, 1.9249],
  ] as [Geometry, number, number, number][])('%s at Bi = %f: ζ1 = %f, C1 = %f (Incropera Table 5.1)', (g, bi, zeta, c1) => {
    const lam = symmetricRoot(g, 1, bi)
    expect(Math.abs(lam - zeta)).toBeLessThan(1.5e-4)
    expect(Math.abs(uniformInitialCoefficient(g, lam) - c1)).toBeLessThan(1.5e-4)
  })
})

describe('roots over Bi = 1e-4 … 1e6 and the fixed limit', () => {
  const bis = [1e-4, 1e-2, 0.5, 1, 7, 100, 1e4, 1e6]
  // Residuals of the classical characteristic equations, scaled to O(1).
  const residual: Record<Geometry, (lam: number, bi: number) => number> = {
    slab: (lam, bi) => (lam * Math.sin(lam) - bi * Math.cos(lam)) / (lam + bi),
    rod: (lam, bi) => (lam * besselJ1(lam) - bi * besselJ0(lam)) / (lam + bi),
    sphere: (lam, bi) => (lam * Math.cos(lam) + (bi - 1) * Math.sin(lam)) / (lam + bi),
  }
  const fixed: Record<Geometry, (n: number) => number> = {
    slab: (n) => (n - 0.5) * Math.PI,
    rod: (n) => besselJ0Zero(n),
    sphere: (n) => n * Math.PI,
  }
  it.each(
    (['slab', 'rod', 'sphere'] as Geometry[]).flatMap((g) => bis.map((bi) => [g, bi] as [Geometry, number])),
  )('%s, Bi = %f: 25 roots strictly increasing, one per bracket, small residual (characteristic equations of Incropera §5.5–5.6)', (g, bi) => {
    const roots = Array.from({ length: 25 }, (_, i) => symmetricRoot(g, i + 1, bi))
    roots.forEach((lam, i) => {
      const n = i + 1
      if (i > 0) expect(lam).toBeGreaterThan(roots[i - 1])
      // Each root lies below the fixed-surface root of the same index and above the previous one.
      expect(lam).toBeLessThanOrEqual(fixed[g](n) + 1e-9)
      if (n > 1) expect(lam).toBeGreaterThan(fixed[g](n - 1))
      expect(Math.abs(residual[g](lam, bi))).toBeLessThan(g === 'rod' ? 1e-8 : 1e-12)
    })
  })

  // For large Bi the surface condition is f + f′/Bi = 0, so λ_∞ − λ ≈ λ_∞/Bi to first order.
  it.each(['slab', 'rod', 'sphere'] as Geometry[])('%s: Bi = 1e6 sits λ∞/Bi below the fixed-surface roots (limit Bi → ∞)', (g) => {
    for (let n = 1; n <= 10; n++) {
      const gap = fixed[g](n) - symmetricRoot(g, n, 1e6)
      expect(gap / (fixed[g](n) / 1e6)).toBeCloseTo(1, 2)
      expect(Math.abs(symmetricRoot(g, n, Infinity) - fixed[g](n))).toBeLessThan(1e-8)
    }
  })

  it.each([
    [0.3, 2, 'tan λ = λ(Bi0+Bi1)/(λ² − Bi0 Bi1), Carslaw & Jaeger §3.10'],
    [5, 0.01, 'same equation, nearly insulated outer face'],
  ])('asymmetric slab Bi0 = %f, Bi1 = %f roots satisfy %s', (b0, b1) => {
    for (let n = 1; n <= 15; n++) {
      const lam = slabRoot(n, b0, b1)
      expect(lam).toBeGreaterThan((n - 1) * Math.PI)
      expect(lam).toBeLessThan(n * Math.PI)
      const r = Math.sin(lam) * (lam * lam - b0 * b1) - lam * (b0 + b1) * Math.cos(lam)
      expect(Math.abs(r) / (lam * lam + lam * (b0 + b1))).toBeLessThan(1e-12)
    }
  })

  it('sphere Bi = 1 gives λ = π/2 exactly (1 − λ cot λ = 1)', () => {
    expect(sphereRoot(1, 1)).toBeCloseTo(Math.PI / 2, 12)
  })
})
