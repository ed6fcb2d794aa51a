import { describe, expect, it } from 'vitest'
import { GAUSS_POINTS, interpolate, meanOver, pathMean } from '../../../server/thermal/propertyTable'
import { STEFAN_BOLTZMANN, surfaceFlux, surfaceLaw } from '../../../server/thermal/surfaceCurve'

describe('surface law', () => {
  // Stefan–Boltzmann law, q = εσ(T_s⁴ − T∞⁴) in kelvin (Incropera et al., eq. 1.7), written out here.
  it.each([
    [850, 25, 0.8, 12, 'air from austenitising: radiation carries most of the heat'],
    [300, 25, 0.8, 12, 'air at 300 °C'],
    [850, 850, 0.5, 10, 'no difference, no flux'],
  ])('T_s = %d °C, T∞ = %d °C, ε = %d, h = %d: flux is h ΔT + εσ(T_s⁴ − T∞⁴) (%s)', (Ts, Tinf, eps, h, _why) => {
    const law = surfaceLaw({ type: 'convective', h_W_m2K: h, ambient_C: Tinf, emissivity: eps })
    const expected = h * (Ts - Tinf) + eps * 5.670374419e-8 * ((Ts + 273.15) ** 4 - (Tinf + 273.15) ** 4)
    expect(surfaceFlux(law, Ts)).toBeCloseTo(expected, 8)
    expect(law.constant).toBe(false)
  })

  it('uses σ = 5.670374419e-8 W/m²K⁴ (CODATA 2018)', () => expect(STEFAN_BOLTZMANN).toBe(5.670374419e-8))

  it('a curve is read linearly between points and held beyond the ends', () => {
    const law = surfaceLaw({ type: 'convective', h_W_m2K: 0, ambient_C: 60, hCurve: [{ T_C: 100, h_W_m2K: 400 }, { T_C: 600, h_W_m2K: 3000 }, { T_C: 800, h_W_m2K: 600 }] })
    expect(law.effectiveH(350)).toBeCloseTo(1700, 12)
    expect(law.effectiveH(700)).toBeCloseTo(1800, 12)
    expect(law.effectiveH(20)).toBe(400)
    expect(law.effectiveH(900)).toBe(600)
  })

  it('a plain h without radiation is constant', () => expect(surfaceLaw({ type: 'convective', h_W_m2K: 800, ambient_C: 60 }).constant).toBe(true))

  it.each([
    [[0, 1], [5, 7], -1, 5],
    [[0, 1], [5, 7], 0.25, 5.5],
    [[0, 1, 3], [5, 7, 3], 2, 5],
    [[0, 1, 3], [5, 7, 3], 4, 3],
  ])('interpolate(%j, %j, %d) = %d (linear, constant beyond the ends)', (xs, ys, x, y) => expect(interpolate(xs, ys, x)).toBeCloseTo(y, 14))

  // Means of a piecewise-linear curve, worked by hand as areas of trapezoids (the triangle
  // 0 → 10 → 0 over 0–20 °C, and a ramp 1 → 3 held beyond its ends).
  it.each([
    [[0, 10, 20], [0, 10, 0], 0, 20, 5, 'the whole triangle: area 100 over 20 K'],
    [[0, 10, 20], [0, 10, 0], 15, 5, 7.5, 'its middle, either order: (37.5 + 37.5) over 10 K'],
    [[0, 10, 20], [0, 10, 0], 2, 6, 4, 'no row inside: the value at the middle'],
    [[0, 10], [1, 3], -10, 0, 1, 'below the first row: the first value'],
    [[0, 10], [1, 3], 5, 20, 42.5 / 15, 'across the last row: 12.5 + 30 over 15 K'],
    [[0, 10], [1, 3], 4, 4, 1.8, 'an empty interval: the value there'],
  ])('meanOver(%j, %j, %d, %d) = %d (%s)', (xs, ys, a, b, mean, _why) => expect(meanOver(xs, ys, a, b)).toBeCloseTo(mean, 12))

  it('pathMean off the rows is the two-point Gauss mean, exact for a curve linear in T along a path quadratic in time', () => {
    // f = 2T + 1 on 0–1000 °C and T(τ) = 100 + 50τ + 30τ²: the time mean is 2(100 + 25 + 10) + 1 = 271.
    const T = (tau: number) => 100 + 50 * tau + 30 * tau * tau
    const [g1, g2] = GAUSS_POINTS
    expect(pathMean([0, 1000], [1, 2001], T(0), T(g1), T(g2), T(1))).toBeCloseTo(271, 10)
  })

  it('pathMean across a row is the exact mean of a path straight in time', () => {
    // T(τ) = 20τ over the triangle: the time mean equals the temperature mean, 5.
    const [g1, g2] = GAUSS_POINTS
    expect(pathMean([0, 10, 20], [0, 10, 0], 0, 20 * g1, 20 * g2, 20)).toBeCloseTo(5, 12)
  })

  it('pathEffectiveH of a standing surface is effectiveH there, and a curve without radiation follows pathMean', () => {
    const radiating = surfaceLaw({ type: 'convective', h_W_m2K: 12, ambient_C: 25, emissivity: 0.8 })
    expect(radiating.pathEffectiveH(600, 600, 600, 600)).toBeCloseTo(radiating.effectiveH(600), 10)
    const curve = [{ T_C: 100, h_W_m2K: 400 }, { T_C: 600, h_W_m2K: 3000 }, { T_C: 800, h_W_m2K: 600 }]
    const law = surfaceLaw({ type: 'convective', h_W_m2K: 0, ambient_C: 60, hCurve: curve })
    const path = [750, 640, 560, 520] as const
    expect(law.pathEffectiveH(...path)).toBeCloseTo(pathMean([100, 600, 800], [400, 3000, 600], ...path), 10)
  })
})
