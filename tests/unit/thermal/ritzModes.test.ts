import { describe, expect, it } from 'vitest'
import { rodRoot, slabRoot, sphereRoot } from '../../../server/thermal/eigenRoots'
import { frozenSeries, modalBasis, projectOnto } from '../../../server/thermal/ritzModes'
import { jacobiEigen } from '../../../server/thermal/symmetricEigen'
import type { Geometry } from '../../../server/thermal/types'

describe('jacobiEigen', () => {
  // The second-difference matrix tridiag(−1, 2, −1) of order n has eigenvalues 2 − 2cos(kπ/(n + 1)) (closed form).
  it.each([4, 12, 30])('n = %d: the second-difference matrix has eigenvalues 2 − 2cos(kπ/(n + 1))', (n) => {
    const a = new Float64Array(n * n)
    for (let i = 0; i < n; i++) {
      a[i * n + i] = 2
      if (i > 0) a[i * n + i - 1] = a[(i - 1) * n + i] = -1
    }
    const v = new Float64Array(n * n)
    jacobiEigen(a, n, v)
    const found = Array.from({ length: n }, (_, i) => a[i * n + i]).sort((x, y) => x - y)
    found.forEach((value, k) => expect(value).toBeCloseTo(2 - 2 * Math.cos(((k + 1) * Math.PI) / (n + 1)), 12))
  })

  // Warm start: begin from the eigenvectors of a different matrix (a perturbed diagonal), as a sub-step begins from the last one's.
  it.each([4, 12, 30])('n = %d: started from the eigenvectors of another matrix, the same closed-form eigenvalues and A v = λ v', (n) => {
    const secondDifference = (bump: number) => {
      const a = new Float64Array(n * n)
      for (let i = 0; i < n; i++) {
        a[i * n + i] = 2 + bump * Math.sin(i + 1)
        if (i > 0) a[i * n + i - 1] = a[(i - 1) * n + i] = -1
      }
      return a
    }
    const start = new Float64Array(n * n)
    jacobiEigen(secondDifference(0.3), n, start)
    const a = secondDifference(0)
    const v = new Float64Array(n * n)
    jacobiEigen(a, n, v, start)
    const found = Array.from({ length: n }, (_, i) => a[i * n + i])
    Array.from(found)
      .sort((x, y) => x - y)
      .forEach((value, k) => expect(value).toBeCloseTo(2 - 2 * Math.cos(((k + 1) * Math.PI) / (n + 1)), 12))
    const original = secondDifference(0)
    for (let j = 0; j < n; j++)
      for (let i = 0; i < n; i++) {
        let av = 0
        for (let k = 0; k < n; k++) av += original[i * n + k] * v[k * n + j]
        expect(av).toBeCloseTo(found[j] * v[i * n + j], 12)
      }
  })
})

describe('Ritz modes of a frozen uniform body', () => {
  // For uniform properties the Ritz rates are the closed-form λ²α/L², whose roots eigenRoots.ts
  // checks against Incropera et al., Table 5.1 (e.g. Bi = 1: slab 0.8603, rod 1.2558, sphere 1.5708).
  it.each<[Geometry, number, number]>([
    ['slab', 1, 0.8603],
    ['rod', 1, 1.2558],
    ['sphere', 1, 1.5708],
  ])('%s, Bi = %d: slowest rate is λ₁²α/L² with λ₁ = %d (Incropera Table 5.1)', (geometry, bi, lam1) => {
    const L = 0.02
    const k = 40
    const rhoCp = 3.7e6
    const basis = modalBasis({ geometry, count: 12, inner: 'symmetry', outer: 'convective', innerBiot: 0, outerBiot: bi, outerAmbient_C: 20, breakpoints: [] })
    const q = basis.nodes.length
    const series = frozenSeries(
      basis,
      {
        length_m: L,
        k_W_mK: new Float64Array(q).fill(k),
        rhoCp_J_m3K: new Float64Array(q).fill(rhoCp),
        outerH_W_m2K: (bi * k) / L,
        outerAmbient_C: 20,
        innerH_W_m2K: 0,
        innerAmbient_C: 0,
      },
      projectOnto(basis, () => 820),
    )
    const rates = Array.from(series.rates_per_s).sort((a, b) => a - b)
    const alpha = k / rhoCp
    expect(Math.sqrt((rates[0] * L * L) / alpha)).toBeCloseTo(lam1, 4)
    const root = geometry === 'slab' ? slabRoot(2, 0, bi) : geometry === 'rod' ? rodRoot(2, bi) : sphereRoot(2, bi)
    expect(rates[1] / ((root * root * alpha) / (L * L))).toBeCloseTo(1, 9)
  })
})
