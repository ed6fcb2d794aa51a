/**
 * A calibration fit's result (server/measurements/fit.ts) as the fit returns it and
 * the calibration page receives it.
 */
export interface CalibrationKnot {
  T_C: number
  h: number
  /** Standard uncertainty of h, W/m²K; null where the log does not determine the knot. */
  uncertainty: number | null
  /** Logged points with the surface near this knot (hat-weighted). */
  points: number
  determined: boolean
}

export interface CalibrationRatePoint {
  T_C: number
  /** −dT/dt, K/s (positive while cooling). */
  rate_K_s: number
}

export interface CalibrationResult {
  model: 'constant' | 'curve'
  /** The constant model's h and its standard uncertainty. */
  h?: { value: number; uncertainty: number }
  hCurve?: CalibrationKnot[]
  rms_K: number
  maxAbs_K: number
  points: number
  iterations: number
  converged: boolean
  series: { t_s: number[]; measured_C: number[]; fitted_C: number[]; surface_C: number[] }
  coolingRate: { measured: CalibrationRatePoint[]; fitted: CalibrationRatePoint[] }
  warnings: string[]
}

export interface CalibrationProgress {
  iteration: number
  /** Root-mean-square misfit after this step, K. */
  rms_K: number
}

/** One line of the fit's stream (POST /api/calibrations/fit), the last a result, a refusal or a failure. */
export type CalibrationMessage =
  | { progress: CalibrationProgress }
  | { result: CalibrationResult }
  | { refused: { field: string; message: string } }
  | { failed: { message: string } }
