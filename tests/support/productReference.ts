/**
 * Closed-form centre temperature of a short cylinder or block (product solution):
 *
 *   θ(0, t)/θ₀ = Π_d Σ_n C_n e^{−λ_n² Fo_d},
 *
 * slab: λ tan λ = Bi, C_n = 4 sin λ/(2λ + sin 2λ); rod: λ J1(λ) = Bi J0(λ),
 * C_n = 2 J1(λ)/(λ (J0² + J1²)) (Carslaw & Jaeger, Conduction of Heat in Solids,
 * §1.15, §3.11, §7.7; Incropera et al., Fundamentals of Heat and Mass Transfer, §5.8).
 *
 * Roots come from plain bisection and Bessel values from the `bessel` package, not
 * from the engine's root finders, so a fault there cannot hide in both the engine's
 * answer and the value it is checked against.
 */
import bessel from 'bessel'
import { bisect } from './bisect'

export interface ReferenceBody {
  /** Half-thickness (slab) or radius (rod) of each finite direction. */
  directions: { geometry: 'slab' | 'rod'; size_m: number }[]
  k_W_mK: number
  rhoCp_J_m3K: number
  h_W_m2K: number
  initial_C: number
  ambient_C: number
}

const J = (x: number, n: number) => bessel.besselj(x, n)

/** A zero of J_order near the McMahon estimate; neighbouring zeros are about π apart. */
const besselZeroNear = (order: 0 | 1, estimate: number) => bisect((x) => J(x, order), estimate - 0.4, estimate + 0.4)

/** n-th root: slab in ((n−1)π, (n−½)π); rod between the (n−1)-th zero of J1 and the n-th of J0. */
function root(geometry: 'slab' | 'rod', bi: number, n: number): number {
  if (geometry === 'slab') return bisect((l) => l * Math.sin(l) - bi * Math.cos(l), (n - 1) * Math.PI + 1e-12, (n - 0.5) * Math.PI)
  const lo = n === 1 ? 1e-12 : besselZeroNear(1, (n - 0.75) * Math.PI)
  return bisect((l) => l * J(l, 1) - bi * J(l, 0), lo, besselZeroNear(0, (n - 0.25) * Math.PI))
}

function coefficient(geometry: 'slab' | 'rod', lam: number): number {
  if (geometry === 'slab') return (4 * Math.sin(lam)) / (2 * lam + Math.sin(2 * lam))
  return (2 * J(lam, 1)) / (lam * (J(lam, 0) ** 2 + J(lam, 1) ** 2))
}

const rootCache = new Map<string, number[]>()

/** Σ C_n e^{−λ_n² Fo}, summed until e^{−λ_n² Fo} < 1e-17, past which no term can change it. */
export function centreFraction1D(geometry: 'slab' | 'rod', bi: number, fo: number): number {
  const key = `${geometry}:${bi}`
  const roots = rootCache.get(key) ?? []
  rootCache.set(key, roots)
  let sum = 0
  for (let n = 1; ; n++) {
    if (roots.length < n) roots.push(root(geometry, bi, n))
    const lam = roots[n - 1]!
    const decay = Math.exp(-lam * lam * fo)
    sum += coefficient(geometry, lam) * decay
    if (decay < 1e-17) return sum
  }
}

/** Centre temperature (°C) at t_s > 0. */
export function referenceCentre_C(body: ReferenceBody, t_s: number): number {
  const alpha = body.k_W_mK / body.rhoCp_J_m3K
  const fraction = body.directions.reduce(
    (acc, d) => acc * centreFraction1D(d.geometry, (body.h_W_m2K * d.size_m) / body.k_W_mK, (alpha * t_s) / (d.size_m * d.size_m)),
    1,
  )
  return body.ambient_C + (body.initial_C - body.ambient_C) * fraction
}

/** Time (s) for the cooling centre to reach target_C, from Fo = 0.01 of the shortest direction on: bracketed by doubling, then bisected. */
export function referenceTimeToCentre_s(body: ReferenceBody, target_C: number): number {
  const gap = (t: number) => referenceCentre_C(body, t) - target_C
  const shortest = Math.min(...body.directions.map((d) => d.size_m))
  let lo = (0.01 * shortest * shortest * body.rhoCp_J_m3K) / body.k_W_mK
  if (!(gap(lo) > 0)) throw new RangeError(`${target_C} °C is reached before Fo = 0.01, outside this reference's range`)
  let hi = 2 * lo
  while (gap(hi) > 0) {
    lo = hi
    hi *= 2
  }
  return bisect(gap, lo, hi)
}
