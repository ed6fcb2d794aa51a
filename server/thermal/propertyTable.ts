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
