import { describe, expect, it } from 'vitest'
import bessel from 'bessel'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import {
  productCentreTemperature,
  productTimeToCentre,
  type ProductCooling,
} from '../../../server/thermal/productSolutions'
import { bisect } from '../../support/bisect'

// Reference values are computed here with their own root finding (bisection),
// not through the engine's eigenvalue code that productSolutions uses.

const J = (x: number, n: number) => bessel.besselj(x, n)

/** Roots of λ tan λ = Bi (n-th in ((n−1)π, (n−½)π)) — Carslaw & Jaeger §3.11. */
const slabRoots = (bi: number, count: number) =>
  Array.from({ length: count }, (_, i) =>
    bisect((l) => l * Math.sin(l) - bi * Math.cos(l), i * Math.PI + 1e-12, (i + 0.5) * Math.PI),
  )

/** First root of λ J1(λ) = Bi J0(λ), below the first zero of J0 (2.4048) — Carslaw & Jaeger §7.7. */
const rodRoot1 = (bi: number) => bisect((l) => l * J(l, 1) - bi * J(l, 0), 1e-12, 2.404825557695773)

/** Slab centre Σ 4 sin λ/(2λ + sin 2λ) e^{−λ²Fo}, 400 terms. */
function slabCentre(bi: number, fo: number): number {
  return slabRoots(bi, 400).reduce((s, l) => s + ((4 * Math.sin(l)) / (2 * l + Math.sin(2 * l))) * Math.exp(-l * l * fo), 0)
}

const steel = { k_W_mK: 40, rhoCp_J_m3K: 7850 * 475, initial_C: 850, ambient_C: 40 }
const ALPHA = steel.k_W_mK / steel.rhoCp_J_m3K

describe('product solutions', () => {
  it.each([
    [200, 0.03],
    [1500, 0.03],
    [5000, 0.015],
  ])('a cylinder with L = ∞ (h = %d W/m²K, R = %d m) cools like the 1-D rod from the finite-volume solver', (h, R) => {
    const times = [5, 20, 60, 200]
    const cn = solveCrankNicolson(
      {
        domain: {
          geometry: 'rod',
          length_m: R,
          properties: [
            { x: 0, k_W_mK: steel.k_W_mK, rhoCp_J_m3K: steel.rhoCp_J_m3K },
            { x: 1, k_W_mK: steel.k_W_mK, rhoCp_J_m3K: steel.rhoCp_J_m3K },
          ],
        },
        initial: steel.initial_C,
        stages: [{ outer: { type: 'convective', h_W_m2K: h, ambient_C: steel.ambient_C }, inner: { type: 'symmetry' } }],
      },
      { times_s: times, points: [0] },
    )
    const p: ProductCooling = { ...steel, h_W_m2K: h, body: { shape: 'cylinder', radius_m: R, halfLength_m: Infinity } }
    times.forEach((t, i) => expect(Math.abs(productCentreTemperature(p, t) - cn.T_C[i][0]), `t=${t}`).toBeLessThan(0.05))
  })

  it.each([
    [0.2, 0.25],
    [1, 0.1],
    [10, 0.05],
    [10, 0.6],
  ])('a cube (Bi = %d, Fo = %d) has the slab centre solution cubed; a square bar the slab squared', (bi, fo) => {
    const a = 0.04
    const h = (bi * steel.k_W_mK) / a
    const t = (fo * a * a) / ALPHA
    const slab = slabCentre(bi, fo)
    const cube: ProductCooling = { ...steel, h_W_m2K: h, body: { shape: 'block', halfWidths_m: [a, a, a] } }
    const bar: ProductCooling = { ...steel, h_W_m2K: h, body: { shape: 'block', halfWidths_m: [a, Infinity, a] } }
    const fraction = (T: number) => (T - steel.ambient_C) / (steel.initial_C - steel.ambient_C)
    expect(fraction(productCentreTemperature(cube, t))).toBeCloseTo(slab ** 3, 9)
    expect(fraction(productCentreTemperature(bar, t))).toBeCloseTo(slab ** 2, 9)
  })

  it('short brass cylinder, D = 10 cm, H = 12 cm, 120 °C into 25 °C air at h = 60: centre ≈ 62.8 °C after 15 min (Çengel, Heat and Mass Transfer, worked example, quoted from memory; ±0.5 K for one-term table precision)', () => {
    const alpha = 3.39e-5
    const k = 110
    const p: ProductCooling = {
      body: { shape: 'cylinder', radius_m: 0.05, halfLength_m: 0.06 },
      k_W_mK: k,
      rhoCp_J_m3K: k / alpha,
      h_W_m2K: 60,
      initial_C: 120,
      ambient_C: 25,
    }
    const T = productCentreTemperature(p, 15 * 60)
    expect(Math.abs(T - 62.8)).toBeLessThan(0.5)
    // and the inverse lands back on 15 min
    expect(productTimeToCentre(p, T)).toBeCloseTo(900, 6)
  })

  // One-term forms (Incropera, Fundamentals of Heat and Mass Transfer, eqs. 5.40, 5.52):
  // slab C1 = 4 sin λ1/(2λ1 + sin 2λ1), rod C1 = 2J1(λ1)/(λ1(J0² + J1²)).
  // The dropped terms are bounded by 1.3·e^{−(λ2²−λ1²)Fo} per direction.
  it.each([
    [300, 0.25],
    [300, 1],
    [3000, 0.4],
  ])('steel disc R = 30 mm, half-length 25 mm, h = %d: centre equals the product of one-term values at Fo_R = %d', (h, foR) => {
    const R = 0.03
    const Lh = 0.025 // shorter than R, so Fo_L > Fo_R > 0.2
    const p: ProductCooling = { ...steel, h_W_m2K: h, body: { shape: 'cylinder', radius_m: R, halfLength_m: Lh } }
    const t = (foR * R * R) / ALPHA
    const biR = (h * R) / steel.k_W_mK
    const biL = (h * Lh) / steel.k_W_mK
    const lr = rodRoot1(biR)
    const [ls, ls2] = slabRoots(biL, 2)
    const lr2 = bisect((l) => l * J(l, 1) - biR * J(l, 0), 3.8317059702075125, 5.520078110286311)
    const foL = (ALPHA * t) / (Lh * Lh)
    const rod = ((2 * J(lr, 1)) / (lr * (J(lr, 0) ** 2 + J(lr, 1) ** 2))) * Math.exp(-lr * lr * foR)
    const slab = ((4 * Math.sin(ls)) / (2 * ls + Math.sin(2 * ls))) * Math.exp(-ls * ls * foL)
    const tol = 1.3 * (Math.exp(-(lr2 ** 2 - lr ** 2) * foR) + Math.exp(-(ls2 ** 2 - ls ** 2) * foL)) + 1e-9
    const fraction = (productCentreTemperature(p, t) - steel.ambient_C) / (steel.initial_C - steel.ambient_C)
    expect(foL).toBeGreaterThan(0.2)
    expect(Math.abs(fraction - rod * slab)).toBeLessThan(tol)
  })

  it('time to a centre temperature inverts the centre curve for a bar and a block', () => {
    const bar: ProductCooling = { ...steel, h_W_m2K: 800, body: { shape: 'block', halfWidths_m: [0.025, 0.04, Infinity] } }
    const block: ProductCooling = { ...steel, h_W_m2K: 800, body: { shape: 'block', halfWidths_m: [0.025, 0.04, 0.1] } }
    for (const p of [bar, block]) {
      for (const target of [800, 400, 100, 45]) {
        const t = productTimeToCentre(p, target)
        expect(productCentreTemperature(p, t)).toBeCloseTo(target, 7)
      }
      expect(productTimeToCentre(p, steel.initial_C)).toBe(0)
    }
    // the block, cooled on more faces, gets there first
    expect(productTimeToCentre(block, 100)).toBeLessThan(productTimeToCentre(bar, 100))
  })

  const cyl: ProductCooling = { ...steel, h_W_m2K: 500, body: { shape: 'cylinder', radius_m: 0.03, halfLength_m: 0.05 } }
  it.each([
    ['k_W_mK', { ...cyl, k_W_mK: 0 }, 600],
    ['rhoCp_J_m3K', { ...cyl, rhoCp_J_m3K: -1 }, 600],
    ['h_W_m2K', { ...cyl, h_W_m2K: 0 }, 600],
    ['body.radius_m', { ...cyl, body: { shape: 'cylinder' as const, radius_m: -0.03, halfLength_m: 0.05 } }, 600],
    ['body.halfWidths_m', { ...cyl, body: { shape: 'block' as const, halfWidths_m: [Infinity, Infinity, Infinity] as [number, number, number] } }, 600],
    ['target_C', cyl, 30], // below the 40 °C ambient
    ['target_C', cyl, 40], // the ambient itself is only reached at t = ∞
    ['target_C', cyl, 900], // above the start
  ])('rejects a bad input, naming %s', (field, p, target) => {
    expect(() => productTimeToCentre(p, target)).toThrow(field)
  })
})
