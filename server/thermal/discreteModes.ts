/**
 * Cheap first estimates of graded decay rates from a finite-volume discretisation
 * of the same Sturm–Liouville problem as shooting.ts,
 *     (x^m k f′)′ = −μ x^m c f   on 0 ≤ x ≤ 1.
 *
 * About N equal cells (split at every property breakpoint) give K f = μ M f with K symmetric tridiagonal (face conductances
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

/** Relative width to which each discrete eigenvalue is bisected: at the accuracy of the corrected estimate (~1e-3 at 6 cells per mode). */
const BISECTION_RTOL = 2e-4

/** Approximate decay rates μ̂_1 … μ̂_count on about `cells` cells (default 6 per mode, at least 32). */
export function discreteRates(spec: DiscreteSpec, count: number, cells = Math.max(32, 6 * count)): Float64Array {
  const { m, pieces } = spec
  // Property breakpoints are faces too, so a jump never sits inside a cell.
  const faces = [...new Set([...Array.from({ length: cells + 1 }, (_, i) => i / cells), ...pieces.map((p) => p.x0)])].sort((a, b) => a - b)
  const n = faces.length - 1
  const area = (x: number) => (m === 0 ? 1 : m === 1 ? x : x * x)
  const mass = new Float64Array(n)
  const diag = new Float64Array(n)
  const off = new Float64Array(n) // off[i] couples cells i and i + 1
  // ∫ dx/k from each cell centre to its left and right faces (k at the half-cell midpoints).
  const toLeft = new Float64Array(n)
  const toRight = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const a = faces[i]
    const b = faces[i + 1]
    const mid = 0.5 * (a + b)
    mass[i] = ((b ** (m + 1) - a ** (m + 1)) / (m + 1)) * propertiesAt(pieces, mid).c
    toLeft[i] = (mid - a) / propertiesAt(pieces, 0.5 * (a + mid)).k
    toRight[i] = (b - mid) / propertiesAt(pieces, 0.5 * (mid + b)).k
  }
  for (let i = 1; i < n; i++) {
    const g = area(faces[i]) / (toRight[i - 1] + toLeft[i])
    diag[i - 1] += g
    diag[i] += g
    off[i - 1] = -g
  }
  const link = (biot: number, halfResistance: number) => (biot === 0 ? 0 : 1 / (halfResistance + (biot === Infinity ? 0 : 1 / biot)))
  if (m === 0) diag[0] += link(spec.innerBiot, toLeft[0])
  diag[n - 1] += link(spec.outerBiot, toRight[n - 1])
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
  // λ² = μ c/k on average: the mean of c/k over the body.
  const phase2 = pieces.reduce((sum, p) => sum + 0.5 * (p.c0 / p.k0 + p.c1 / p.k1) * (p.x1 - p.x0), 0)
  const dx = 1 / cells
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
    // Lumped finite volumes underestimate a mode of wavenumber λ by ~(λΔx)²/12
    // (exactly so for uniform cells and properties); remove that leading term.
    const mu = 0.5 * (lo + hi)
    rates[j] = mu * (1 + (mu * phase2 * dx * dx) / 12)
  }
  return rates
}
