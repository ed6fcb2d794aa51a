/**
 * Cheap first estimates of graded decay rates from a finite-volume discretisation
 * of the same Sturm–Liouville problem as shooting.ts,
 *     (x^m k f′)′ = −μ x^m c f   on 0 ≤ x ≤ 1.
 *
 * N equal cells give K f = μ M f with K symmetric tridiagonal (face conductances
 * x^m k / Δx, boundary links through the half cell) and M diagonal (cell heat
 * capacity ∫ x^m c). With D = M^{-1/2}, A = D K D is symmetric tridiagonal with the
 * same eigenvalues; the number of them below λ is the number of negative pivots of
 * A − λI (Sylvester's law of inertia), so bisection on that count yields the n-th
 * eigenvalue and never skips or repeats one. The discrete rates carry an O((λΔx)²)
 * error; shooting.ts only uses them as starting points for Newton polishing, and
 * its own Prüfer-angle Sturm count decides which mode a root is.
 */
import { propertiesAt, type PropertyPiece } from './properties'

export interface DiscreteSpec {
  m: 0 | 1 | 2
  pieces: PropertyPiece[]
  /** 0 for symmetry, Infinity for a fixed face, otherwise a convective slab face. */
  innerBiot: number
  /** Infinity for a fixed surface. */
  outerBiot: number
}

/** Relative width to which each discrete eigenvalue is bisected: far below its discretisation error. */
const BISECTION_RTOL = 1e-3

/** Approximate decay rates μ̂_1 … μ̂_count on `cells` equal cells (default 8 per mode, at least 48). */
export function discreteRates(spec: DiscreteSpec, count: number, cells = Math.max(48, 8 * count)): Float64Array {
  const n = cells
  const dx = 1 / n
  const { m, pieces } = spec
  const area = (x: number) => (m === 0 ? 1 : m === 1 ? x : x * x)
  const mass = new Float64Array(n)
  const diag = new Float64Array(n)
  const off = new Float64Array(n) // off[i] couples cells i and i + 1
  for (let i = 0; i < n; i++) {
    const a = i * dx
    const b = a + dx
    const mid = a + 0.5 * dx
    mass[i] = ((b ** (m + 1) - a ** (m + 1)) / (m + 1)) * propertiesAt(pieces, mid).c
  }
  for (let i = 1; i < n; i++) {
    const x = i * dx
    // Series resistance of the two half cells, so a jump at a face is honoured.
    const left = propertiesAt(pieces, x - 0.25 * dx).k
    const right = propertiesAt(pieces, x + 0.25 * dx).k
    const g = area(x) / (0.5 * dx * (1 / left + 1 / right))
    diag[i - 1] += g
    diag[i] += g
    off[i - 1] = -g
  }
  const link = (biot: number, k: number) => (biot === 0 ? 0 : 1 / (0.5 * dx / k + (biot === Infinity ? 0 : 1 / biot)))
  if (m === 0) diag[0] += link(spec.innerBiot, propertiesAt(pieces, 0).k)
  diag[n - 1] += link(spec.outerBiot, propertiesAt(pieces, 1).k)
  let upper = 0
  for (let i = 0; i < n; i++) {
    diag[i] /= mass[i]
    if (i + 1 < n) off[i] /= Math.sqrt(mass[i] * mass[i + 1])
  }
  for (let i = 0; i < n; i++) upper = Math.max(upper, diag[i] + Math.abs(off[i]) + (i > 0 ? Math.abs(off[i - 1]) : 0))
  const below = (lambda: number) => {
    let count = 0
    let q = 1
    for (let i = 0; i < n; i++) {
      q = diag[i] - lambda - (i > 0 ? (off[i - 1] * off[i - 1]) / q : 0)
      if (q === 0) q = -1e-300
      if (q < 0) count++
    }
    return count
  }
  const rates = new Float64Array(Math.min(count, n))
  let lo = 0
  for (let j = 0; j < rates.length; j++) {
    let hi = upper
    // Bracket the (j + 1)-th eigenvalue from the previous one; grow geometrically before bisecting.
    let probe = Math.max(2 * lo, lo + 1)
    while (probe < hi && below(probe) <= j) {
      lo = probe
      probe *= 2
    }
    hi = Math.min(hi, probe)
    while (hi - lo > BISECTION_RTOL * hi) {
      const mid = 0.5 * (lo + hi)
      if (below(mid) > j) hi = mid
      else lo = mid
    }
    rates[j] = 0.5 * (lo + hi)
  }
  return rates
}
