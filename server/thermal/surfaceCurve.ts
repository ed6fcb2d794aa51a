/**
 * Heat lost by a convective surface at temperature T_s to surroundings at T∞:
 *
 *   q = h(T_s)·(T_s − T∞) + εσ(T_s⁴ − T∞⁴),   temperatures in kelvin in the radiative term,
 *
 * with h constant or read from a curve against the surface temperature (a liquid
 * quenchant's vapour-blanket, boiling and convection phases). The stepped engine
 * (galerkinStage.ts) uses q itself; the finite-volume solver and the frozen series of
 * a stage's start and end read it as q = h_eff·(T_s − T∞) with the secant coefficient
 *
 *   h_eff = h(T*) + εσ(T*² + T∞²)(T* + T∞),
 *
 * exact at the frozen surface temperature T* (the radiative factor is the exact
 * factorisation of T⁴ − T∞⁴; Incropera et al., Fundamentals of Heat and Mass
 * Transfer, eq. 1.9).
 */
import { interpolate } from './propertyTable'
import type { ConvectiveBoundary } from './types'

/** Stefan–Boltzmann constant, W/m²K⁴ (CODATA 2018, exact in the SI). */
export const STEFAN_BOLTZMANN = 5.670374419e-8
const KELVIN = 273.15

/** The surface law of a convective boundary: h_eff(T_s) as above. */
export interface SurfaceLaw {
  ambient_C: number
  /** Secant coefficient at surface temperature T_s, W/m²K. */
  effectiveH: (surface_C: number) => number
  /** True when h_eff does not depend on T_s (a plain h, no radiation). */
  constant: boolean
}

export function surfaceLaw(b: ConvectiveBoundary): SurfaceLaw {
  const curve = b.hCurve
  const xs = curve ? Float64Array.from(curve, (p) => p.T_C) : null
  const hs = curve ? Float64Array.from(curve, (p) => p.h_W_m2K) : null
  const es = (b.emissivity ?? 0) * STEFAN_BOLTZMANN
  const ambientK = b.ambient_C + KELVIN
  const convective = xs && hs ? (T: number) => interpolate(xs, hs, T) : () => b.h_W_m2K
  const radiative = (T: number) => {
    const tk = T + KELVIN
    return es * (tk * tk + ambientK * ambientK) * (tk + ambientK)
  }
  return {
    ambient_C: b.ambient_C,
    effectiveH: (T) => convective(T) + radiative(T),
    constant: !curve && es === 0,
  }
}

/** Heat flux out of the surface at T_s, W/m². */
export function surfaceFlux(law: SurfaceLaw, surface_C: number): number {
  return law.effectiveH(surface_C) * (surface_C - law.ambient_C)
}
