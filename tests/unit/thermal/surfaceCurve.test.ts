import { describe, expect, it } from 'vitest'
import { interpolate } from '../../../server/thermal/propertyTable'
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
})
