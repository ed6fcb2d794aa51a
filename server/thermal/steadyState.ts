/**
 * Steady state of one stage: the profile the body tends to under that stage's
 * end conditions. With a symmetric centre it is the surface temperature; with two
 * faces a constant heat flux q runs through the chain of resistances
 *     1/h₀ + ∫₀^L dx/k + 1/h₁     (a fixed face has 1/h = 0),
 * so T(x) = T₀∞ − q (1/h₀ + ∫₀^x dx/k). In scaled units (x ∈ [0, 1], k̂ = k/k_ref)
 * each 1/h becomes 1/Bi. Checked against the linear profile of a uniform wall.
 */
import { resistanceTo, type PropertyPiece } from './properties'

export interface ScaledEnd {
  /** 0 for symmetry, Infinity for a fixed temperature. */
  biot: number
  /** Ambient or fixed temperature; ignored for symmetry. */
  temperature_C: number
}

export function steadyProfile(pieces: PropertyPiece[], inner: ScaledEnd, outer: ScaledEnd): (x: number) => number {
  if (inner.biot === 0) return () => outer.temperature_C
  const innerResistance = 1 / inner.biot
  const total = innerResistance + resistanceTo(pieces, 1) + 1 / outer.biot
  const flux = (inner.temperature_C - outer.temperature_C) / total
  return (x) => inner.temperature_C - flux * (innerResistance + resistanceTo(pieces, x))
}
