/**
 * Temperature tables of a material (k, ρc against T) and of a surface (h against the
 * surface temperature): linear between rows, constant beyond the first and last, the
 * usual reading of a handbook table. Rows are strictly increasing in T (checked by
 * the case schema).
 */
import type { HeatTransferPoint, ThermalTableRow } from './types'

/** Linear interpolation in ascending xs, held constant beyond the ends. */
export function interpolate(xs: ArrayLike<number>, ys: ArrayLike<number>, x: number): number {
  const n = xs.length
  if (x <= xs[0]) return ys[0]
  if (x >= xs[n - 1]) return ys[n - 1]
  let lo = 0
  let hi = n - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (xs[mid] <= x) lo = mid
    else hi = mid
  }
  return ys[lo] + ((x - xs[lo]) / (xs[hi] - xs[lo])) * (ys[hi] - ys[lo])
}

/**
 * Mean of the same interpolant over the interval between a and b (either order):
 * its exact integral, segment by segment, divided by the length. Without a row
 * strictly inside the interval the interpolant is linear there and the mean is its
 * value at the middle, so a step that straddles no row is frozen exactly as at its
 * midpoint; one that straddles a kink (a cp peak, a boiling peak) gets the kink's
 * true average instead of a one-sided sample.
 */
export function meanOver(xs: ArrayLike<number>, ys: ArrayLike<number>, a: number, b: number): number {
  const lo = Math.min(a, b)
  const hi = Math.max(a, b)
  const n = xs.length
  let first = 0
  while (first < n && xs[first] <= lo) first++
  if (first === n || xs[first] >= hi) return interpolate(xs, ys, 0.5 * (lo + hi))
  let area = 0
  let x = lo
  let y = interpolate(xs, ys, lo)
  for (let i = first; i < n && xs[i] < hi; i++) {
    area += 0.5 * (xs[i] - x) * (y + ys[i])
    x = xs[i]
    y = ys[i]
  }
  area += 0.5 * (hi - x) * (y + interpolate(xs, ys, hi))
  return area / (hi - lo)
}

/** Gauss–Legendre points of [0, 1] for two-point quadrature in time: ½ ∓ √3/6. */
export const GAUSS_POINTS = [0.5 - Math.sqrt(3) / 6, 0.5 + Math.sqrt(3) / 6] as const

/**
 * Time mean of the interpolant over a step along which T goes T0 → Tg1 → Tg2 → T1
 * (Tg the values at the step's GAUSS_POINTS). Where the path crosses no row the
 * interpolant is smooth along it and the two-point Gauss mean is exact to fourth
 * order; a step that crosses a row (a kink) takes the path as straight between
 * those four moments and gets each piece's exact mean (meanOver), weighted by the
 * piece's share of the step: second order for that one step, instead of a sample
 * on one side of the kink.
 */
export function pathMean(xs: ArrayLike<number>, ys: ArrayLike<number>, T0: number, Tg1: number, Tg2: number, T1: number): number {
  const lo = Math.min(T0, Tg1, Tg2, T1)
  const hi = Math.max(T0, Tg1, Tg2, T1)
  let i = 0
  while (i < xs.length && xs[i] <= lo) i++
  if (i === xs.length || xs[i] >= hi) return 0.5 * (interpolate(xs, ys, Tg1) + interpolate(xs, ys, Tg2))
  const [g1, g2] = GAUSS_POINTS
  return g1 * meanOver(xs, ys, T0, Tg1) + (g2 - g1) * meanOver(xs, ys, Tg1, Tg2) + (1 - g2) * meanOver(xs, ys, Tg2, T1)
}

/** k(T) and ρc(T) of a material table as column arrays, for fast lookups at many nodes. */
export interface MaterialCurves {
  T_C: Float64Array
  k_W_mK: Float64Array
  rhoCp_J_m3K: Float64Array
}

export function materialCurves(table: ThermalTableRow[]): MaterialCurves {
  return {
    T_C: Float64Array.from(table, (r) => r.T_C),
    k_W_mK: Float64Array.from(table, (r) => r.k_W_mK),
    rhoCp_J_m3K: Float64Array.from(table, (r) => r.rhoCp_J_m3K),
  }
}

/** A material table whose k and ρc are the same in every row: the constant-property case. */
export function isFlatMaterial(table: ThermalTableRow[]): boolean {
  return table.every((r) => r.k_W_mK === table[0].k_W_mK && r.rhoCp_J_m3K === table[0].rhoCp_J_m3K)
}

/** A heat-transfer curve with the same h at every point. */
export function isFlatCurve(curve: HeatTransferPoint[]): boolean {
  return curve.every((p) => p.h_W_m2K === curve[0].h_W_m2K)
}
