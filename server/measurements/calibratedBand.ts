/**
 * A fit made into a quench medium's band: the fitted curve (or the constant h as a
 * flat curve) becomes the typical curve, and the low and high curves keep the band
 * around it.
 *
 * Why the medium's own band ratios and not the fit's uncertainty alone: the band
 * stands for what changes from load to load (agitation, the part's surface, the
 * bath's age and temperature), which one probe log in one bath on one day cannot
 * see. The fit's standard uncertainty is usually a percent or two, and a band that
 * narrow would make the slow-end "safe to handle" time optimistic. So at each point
 * the low and high curves keep the medium's existing low/typical and high/typical
 * ratios there (read from its curves by interpolation, else from its single
 * coefficients), widened to the fit's ±2 standard uncertainties where those are
 * wider (ln h is what the fit estimates, so the interval is h·e^(±2σ/h), never
 * negative). Every curve has the same points, each low ≤ typical ≤ high there, so the
 * order holds between points too and the library's checkCurves stays satisfied.
 */
import { interpolate } from '../../shared/interpolate'
import type { CoolingCurves, CurvePoint } from '../../shared/schemas/quenchant'
import type { CalibrationResult } from '../../shared/types/calibration'

/** Standard uncertainties either side the band covers at least (about 95 % for a normal error). */
export const BAND_SIGMAS = 2

/** The band-related fields of a quench medium. */
export interface MediumBand {
  hLow_W_m2K: number
  hTypical_W_m2K: number
  hHigh_W_m2K: number
  coolingCurves: CoolingCurves | null
}

/** A flat curve's points when the medium has no curve to borrow them from: the log's temperature span. */
export function flatCurveTemperatures(medium: MediumBand, measured_C: readonly number[]): number[] {
  if (medium.coolingCurves) return medium.coolingCurves.typical.map((p) => p.T_C)
  const lo = Math.min(...measured_C)
  // At least 2 K apart, so three points always rise strictly.
  const hi = Math.max(Math.max(...measured_C), lo + 2)
  return [lo, (lo + hi) / 2, hi]
}

/** The medium's low/typical and high/typical ratios at surface temperature T. */
export function bandRatios(medium: MediumBand, T_C: number): { low: number; high: number } {
  const curves = medium.coolingCurves
  if (!curves) return { low: medium.hLow_W_m2K / medium.hTypical_W_m2K, high: medium.hHigh_W_m2K / medium.hTypical_W_m2K }
  const at = (curve: CurvePoint[]) => interpolate(curve.map((p) => p.T_C), curve.map((p) => p.h), T_C)
  const typical = at(curves.typical)
  return { low: at(curves.low) / typical, high: at(curves.high) / typical }
}

function widened(ratios: { low: number; high: number }, h: number, uncertainty: number | null): { low: number; high: number } {
  if (uncertainty === null) return ratios
  const spread = Math.exp((BAND_SIGMAS * uncertainty) / h)
  return { low: Math.min(ratios.low, 1 / spread), high: Math.max(ratios.high, spread) }
}

export interface CalibratedBand extends MediumBand {
  coolingCurves: CoolingCurves
}

/**
 * The medium's new band from a fit. A constant fit also becomes the typical single
 * coefficient (with low and high from the same ratios), so plans that read only the
 * single coefficients use it too; a curve fit leaves those as they were, since no one
 * number stands for a curve.
 */
export function calibratedBand(medium: MediumBand, fit: Pick<CalibrationResult, 'h' | 'hCurve' | 'series'>): CalibratedBand {
  const typical: { T_C: number; h: number; uncertainty: number | null }[] = fit.hCurve
    ? fit.hCurve.map((k) => ({ T_C: k.T_C, h: k.h, uncertainty: k.uncertainty }))
    : flatCurveTemperatures(medium, fit.series.measured_C).map((T_C) => ({ T_C, h: fit.h!.value, uncertainty: fit.h!.uncertainty }))
  const ratios = typical.map((p) => widened(bandRatios(medium, p.T_C), p.h, p.uncertainty))
  const coolingCurves: CoolingCurves = {
    low: typical.map((p, i) => ({ T_C: p.T_C, h: p.h * ratios[i].low })),
    typical: typical.map((p) => ({ T_C: p.T_C, h: p.h })),
    high: typical.map((p, i) => ({ T_C: p.T_C, h: p.h * ratios[i].high })),
  }
  if (!fit.h) return { hLow_W_m2K: medium.hLow_W_m2K, hTypical_W_m2K: medium.hTypical_W_m2K, hHigh_W_m2K: medium.hHigh_W_m2K, coolingCurves }
  const single = widened({ low: medium.hLow_W_m2K / medium.hTypical_W_m2K, high: medium.hHigh_W_m2K / medium.hTypical_W_m2K }, fit.h.value, fit.h.uncertainty)
  return { hLow_W_m2K: fit.h.value * single.low, hTypical_W_m2K: fit.h.value, hHigh_W_m2K: fit.h.value * single.high, coolingCurves }
}
