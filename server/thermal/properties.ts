/**
 * Piecewise-linear property tables in dimensionless form.
 *
 * k and ρc are scaled by their means over 0 ≤ x ≤ 1 (k_ref, (ρc)_ref), lengths by
 * L, and time by L²(ρc)_ref/k_ref, so the eigenproblem on 0 ≤ x ≤ 1 has O(1)
 * coefficients whatever the material: a dimensionless decay rate μ̂ is
 * μ̂ / timeScale_s in 1/s, and a Biot number is h L / k_ref.
 */
import { EngineLimitError } from './errors'
import { compositeRule, type QuadratureRule } from './quadrature'
import type { ConductionDomain, PropertyPoint } from './types'
import { GEOMETRY_EXPONENT } from './types'

/** One linear piece x0 < x < x1 with scaled k and ρc linear in between. */
export interface PropertyPiece {
  x0: number
  x1: number
  k0: number
  k1: number
  c0: number
  c1: number
}

export interface ScaledDomain {
  m: 0 | 1 | 2
  length_m: number
  kRef_W_mK: number
  rhoCpRef_J_m3K: number
  /** L²(ρc)_ref / k_ref: converts dimensionless rates to 1/s. */
  timeScale_s: number
  pieces: PropertyPiece[]
  uniform: boolean
}

/** Linear pieces between consecutive distinct x; a repeated x is a jump. */
function piecesOf(points: PropertyPoint[]): PropertyPiece[] {
  const pieces: PropertyPiece[] = []
  for (let j = 0; j + 1 < points.length; j++) {
    const a = points[j]
    const b = points[j + 1]
    if (b.x > a.x) pieces.push({ x0: a.x, x1: b.x, k0: a.k_W_mK, k1: b.k_W_mK, c0: a.rhoCp_J_m3K, c1: b.rhoCp_J_m3K })
  }
  return pieces
}

export function scaleDomain(domain: ConductionDomain): ScaledDomain {
  const raw = piecesOf(domain.properties)
  let kRef = 0
  let cRef = 0
  for (const p of raw) {
    kRef += 0.5 * (p.k0 + p.k1) * (p.x1 - p.x0)
    cRef += 0.5 * (p.c0 + p.c1) * (p.x1 - p.x0)
  }
  const pieces = raw.map((p) => ({ x0: p.x0, x1: p.x1, k0: p.k0 / kRef, k1: p.k1 / kRef, c0: p.c0 / cRef, c1: p.c1 / cRef }))
  const k = domain.properties.map((p) => p.k_W_mK)
  const c = domain.properties.map((p) => p.rhoCp_J_m3K)
  const uniform = k.every((v) => v === k[0]) && c.every((v) => v === c[0])
  const timeScale_s = (domain.length_m ** 2 * cRef) / kRef
  // Every rate and time of the series is scaled by it: zero (a 1e-300 m part) or infinity makes them all NaN.
  if (!(timeScale_s > 0 && Number.isFinite(timeScale_s)))
    throw new EngineLimitError(`the time scale L²ρc/k is ${timeScale_s} s, which the series cannot use; the size or the properties are out of range`, 'size_m')
  return {
    m: GEOMETRY_EXPONENT[domain.geometry],
    length_m: domain.length_m,
    kRef_W_mK: kRef,
    rhoCpRef_J_m3K: cRef,
    timeScale_s,
    pieces,
    uniform,
  }
}

/** Index of the piece containing x (the right-hand piece at a jump). */
export function pieceIndex(pieces: PropertyPiece[], x: number): number {
  let lo = 0
  let hi = pieces.length - 1
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1
    if (pieces[mid].x0 <= x) lo = mid
    else hi = mid - 1
  }
  return lo
}

/** Scaled k and ρc at x. */
export function propertiesAt(pieces: PropertyPiece[], x: number): { k: number; c: number } {
  const p = pieces[pieceIndex(pieces, x)]
  const s = (x - p.x0) / (p.x1 - p.x0)
  return { k: p.k0 + s * (p.k1 - p.k0), c: p.c0 + s * (p.c1 - p.c0) }
}

/** ∫₀^x dx′/k̂(x′) — the scaled conduction resistance from x = 0 (exact for linear k). */
export function resistanceTo(pieces: PropertyPiece[], x: number): number {
  let total = 0
  for (const p of pieces) {
    if (p.x0 >= x) break
    const x1 = Math.min(p.x1, x)
    const kEnd = p.k0 + ((x1 - p.x0) / (p.x1 - p.x0)) * (p.k1 - p.k0)
    const dx = x1 - p.x0
    const dk = kEnd - p.k0
    // ∫ dx/(k0 + s·dk/dx) = dx·ln(kEnd/k0)/dk, → dx/k0 as dk → 0.
    total += Math.abs(dk) < 1e-12 * p.k0 ? dx / p.k0 : (dx * Math.log(kEnd / p.k0)) / dk
  }
  return total
}

/** All x where a property table has a kink or a jump (for quadrature panels). */
export function breakpointsOf(pieces: PropertyPiece[]): number[] {
  return pieces.map((p) => p.x0)
}

/** The largest c/k at any piece end: a mode of rate μ oscillates at most like λ = √(μ max c/k). */
export function maxCapacityRatio(pieces: PropertyPiece[]): number {
  let ratio = 0
  for (const p of pieces) ratio = Math.max(ratio, p.c0 / p.k0, p.c1 / p.k1)
  return ratio
}

/**
 * Composite Gauss–Legendre on the body with the eigenproblem's weight w = c(x) x^m,
 * split at every property breakpoint (and at `extraBreakpoints`), panels no wider than `maxWidth`.
 */
export function weightedRule(domain: ScaledDomain, maxWidth: number, extraBreakpoints: number[] = []): QuadratureRule {
  const capacityWeight = (x: number) => propertiesAt(domain.pieces, x).c * (domain.m === 0 ? 1 : x ** domain.m)
  return compositeRule([...breakpointsOf(domain.pieces), ...extraBreakpoints], maxWidth, capacityWeight)
}
