import { describe, expect, it } from 'vitest'
import { besselJ0, besselJ0Zero, besselJ1, besselJ1Zero } from '../../../server/thermal/bessel'
import { rodRoot, slabRoot, sphereRoot, symmetricRoot, uniformInitialCoefficient } from '../../../server/thermal/eigenRoots'
import type { Geometry } from '../../../server/thermal/types'
import { besselValues, besselZeros, biotRoots } from '../../support/referenceValues'

// Reference values: mpmath (scripts/reference/generate.py → tests/fixtures/reference-values.json).
describe('Bessel functions', () => {
  // The bessel package's fits carry ≈ 3e-9 absolute error (server/thermal/bessel.ts).
  it.each(besselValues.map((row) => [row.x, row] as const))('J0(%f) and J1 agree with mpmath to 1e-8', (x, row) => {
    expect(Math.abs(besselJ0(x) - row.J0)).toBeLessThan(1e-8)
    expect(Math.abs(besselJ1(x) - row.J1)).toBeLessThan(1e-8)
  })

  it.each(besselZeros.J0.map((zero, i) => [i + 1, zero] as const))(
    'zero %i of J0 is %f (mpmath besseljzero) to 1e-8, and is the fixed-surface rod root',
    (n, zero) => {
      expect(Math.abs(besselJ0Zero(n) - zero)).toBeLessThan(1e-8)
      expect(Math.abs(rodRoot(n, Infinity) - zero)).toBeLessThan(1e-8)
    },
  )

  it.each(besselZeros.J1.map((zero, i) => [i + 1, zero] as const))('zero %i of J1 is %f (mpmath besseljzero) to 1e-8', (n, zero) => {
    expect(Math.abs(besselJ1Zero(n) - zero)).toBeLessThan(1e-8)
  })
})

describe('roots and one-term coefficients against mpmath', () => {
  // Slab and sphere roots are polished to rtol 1e-15 from exact trigonometry, so 1e-12
  // relative holds with room; rods inherit the ≈ 1e-8 of the Bessel values.
  it.each(biotRoots.map((row) => [row.geometry, row.bi, row] as const))('%s at Bi = %f: λ1 … λ6 and C1 … C6', (g, bi, row) => {
    const tol = g === 'rod' ? 1e-8 : 1e-12
    row.roots.forEach((zeta, i) => {
      const lam = symmetricRoot(g, i + 1, bi)
      expect(Math.abs(lam / zeta - 1), `λ${i + 1}`).toBeLessThan(tol)
      expect(Math.abs(uniformInitialCoefficient(g, lam) - row.coefficients[i]!), `C${i + 1}`).toBeLessThan(tol)
    })
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
