import { describe, expect, it } from 'vitest'
import { discreteRates } from '../../../server/thermal/discreteModes'
import { rodRoot, slabRoot, sphereRoot, surfaceValues } from '../../../server/thermal/eigenRoots'
import { scaleDomain } from '../../../server/thermal/properties'
import { modeFamily } from '../../../server/thermal/modeFamily'
import { shootingAccuracy, shootingModes } from '../../../server/thermal/shooting'
import { casedRod } from './helpers'

describe('finite-volume rate estimates (starting values for shooting)', () => {
  const pieces = scaleDomain({ geometry: 'rod', length_m: 0.025, properties: casedRod }).pieces
  it.each([0, 1, 2] as const)('m = %i, cased body: the n-th estimate lies between the shot (n − 1)-th and (n + 1)-th rates and within 0.3 %', (m) => {
    const spec = { m, pieces, innerBiot: 0, outerBiot: 0.8 }
    const shot = shootingModes(spec)
    const estimates = discreteRates(spec, 12)
    for (let n = 1; n <= 12; n++) {
      const exact = shot(n).rate
      expect(estimates[n - 1]).toBeGreaterThan(n === 1 ? 0 : shot(n - 1).rate)
      expect(estimates[n - 1]).toBeLessThan(shot(n + 1).rate)
      expect(Math.abs(estimates[n - 1] / exact - 1)).toBeLessThan(0.003)
    }
  })

  it.each([
    [0, (n: number) => slabRoot(n, 0, 2)],
    [1, (n: number) => rodRoot(n, 2)],
  ] as const)('uniform m = %i, Bi = 2: with the (λΔx)²/12 correction five modes on 40 cells are within 5e-4 of the closed form', (m, root) => {
    const spec = { m, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }], innerBiot: 0, outerBiot: 2 }
    discreteRates(spec, 5, 40).forEach((mu, i) => expect(Math.abs(mu / root(i + 1) ** 2 - 1)).toBeLessThan(5e-4))
  })
})

describe('shooting polish', () => {
  it('a symmetric uniform slab: every shape, moved to the Newton-corrected rate along its μ-sensitivity, is cos λx to 1e-8', () => {
    const shot = shootingModes({ m: 0, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }], innerBiot: 0, outerBiot: 0.7 })
    for (let n = 1; n <= 12; n++) {
      const lam = slabRoot(n, 0, 0.7)
      for (const x of [0, 0.21, 0.5, 0.77, 1]) expect(Math.abs(shot(n).shape(x) - Math.cos(lam * x))).toBeLessThan(1e-8)
    }
  })
})

describe('shooting from the centre power series', () => {
  it.each([
    [1, (n: number) => rodRoot(n, 2)],
    [2, (n: number) => sphereRoot(n, 2)],
  ] as const)('uniform m = %i: the shape at small x (power series) joins the integrated shape and matches the closed form', (m, root) => {
    const shot = shootingModes({ m, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }], innerBiot: 0, outerBiot: 2 })
    for (const n of [1, 4, 9]) {
      const lam = root(n)
      const exact = (x: number) => (m === 1 ? surfaceValues('rod', lam * x).f1 : x === 0 ? 1 : Math.sin(lam * x) / (lam * x))
      // J0 from the `bessel` package is good to ≈ 3e-9.
      for (const x of [0, 0.01, 0.05, 0.1, 0.2, 0.5, 0.9, 1]) expect(Math.abs(shot(n).shape(x) - exact(x))).toBeLessThan(1e-7)
    }
  })
})

describe('graded mode cache', () => {
  const domain = scaleDomain({ geometry: 'rod', length_m: 0.025, properties: casedRod })
  it('a family asked again is the same family, extended lazily, with the rates a fresh shooting gives', () => {
    const first = modeFamily('rod', domain, 0, 0.8)
    const firstRates = [1, 2, 3].map((n) => first.mode(n).rate)
    const again = modeFamily('rod', domain, 0, 0.8)
    for (const n of [1, 2, 3]) expect(again.mode(n)).toBe(first.mode(n))
    const fresh = shootingModes({ m: 1, pieces: domain.pieces, innerBiot: 0, outerBiot: 0.8 })
    for (let n = 1; n <= 8; n++) expect(Math.abs(again.mode(n).rate / fresh(n).rate - 1)).toBeLessThan(1e-9)
    firstRates.forEach((rate, i) => expect(Math.abs(rate / fresh(i + 1).rate - 1)).toBeLessThan(1e-9))
  })

  it('a different surface Biot number or shooting accuracy is a different family', () => {
    const base = modeFamily('rod', domain, 0, 0.8).mode(1).rate
    expect(modeFamily('rod', domain, 0, 0.9).mode(1).rate).toBeGreaterThan(base)
    const loose = modeFamily('rod', domain, 0, 0.8, shootingAccuracy(0.05)).mode(1)
    expect(loose).not.toBe(modeFamily('rod', domain, 0, 0.8).mode(1))
    expect(Math.abs(loose.rate / base - 1)).toBeLessThan(1e-6)
  })
})
