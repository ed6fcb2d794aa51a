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

/** The body a calibration treated as its probe, as stored with the calibration and shown beside it. */
export interface CalibrationProbe {
  /** A preset's id, or the plan whose part was the probe. */
  preset: string | null
  plan: { id: number; revision: number; name: string } | null
  /** In words: "Standard nickel-alloy probe (ISO 9950) …" or "Plan "Drive pin" rev 2: Round bar Ø40 mm, 1 Cr–½ Mo, thermocouple 5 mm deep". */
  label: string
  geometry: 'slab' | 'rod' | 'sphere'
  size_m: number
  /** Thermocouple position as a fraction 0–1 of size_m from the centre. */
  x: number
}

/** What a saved calibration fitted: one h or the knots, as the fit gave them. */
export interface CalibrationFitted {
  h?: { value: number; uncertainty: number }
  hCurve?: CalibrationKnot[]
}

/** A calibration saved as a quench medium's curves (GET /api/calibrations): its provenance. */
export interface QuenchantCalibration {
  id: number
  quenchantId: number
  quenchantName: string
  logId: number
  logFileName: string
  channel: string
  probe: CalibrationProbe
  bath_C: number
  initial_C: number
  /** The part of the log the fit used, seconds from its first row. */
  window: { from_s: number; to_s: number }
  model: 'constant' | 'curve'
  fitted: CalibrationFitted
  rms_K: number
  maxAbs_K: number
  points: number
  iterations: number
  /** The medium's curves as the save wrote them. */
  curves: { low: { T_C: number; h: number }[]; typical: { T_C: number; h: number }[]; high: { T_C: number; h: number }[] }
  createdBy: string | null
  createdAt: string
}
