/**
 * When a fit may become a medium's curve. Refused: a fit that misses its log by more
 * than MAX_SAVE_RMS_K, one that never settled, and one with knots the log does not
 * determine unless the person has seen that and confirms (their h is the smoothness
 * penalty's guess, not a measurement).
 *
 * The limit: 5 K rms is twice the ±2.5 K tolerance of a class 2 type K thermocouple
 * (IEC 60584-1, from memory; ±0.75 % of the reading above 333 °C). A fit that misses
 * by more than that is not explained by the sensor: the model (one h for a liquid
 * that boils, too few knots), the window or the probe does not describe the log.
 */
import type { CalibrationResult } from '../../shared/types/calibration'

export const MAX_SAVE_RMS_K = 5

export interface SaveProblem {
  field: string
  message: string
}

export function saveProblems(fit: Pick<CalibrationResult, 'rms_K' | 'converged' | 'iterations' | 'hCurve'>, acceptUndeterminedKnots: boolean): SaveProblem[] {
  const problems: SaveProblem[] = []
  if (fit.rms_K > MAX_SAVE_RMS_K)
    problems.push({
      field: 'model',
      message: `the fit misses the log by ${fit.rms_K.toFixed(2)} K rms, more than the ${MAX_SAVE_RMS_K} K a saved curve may miss by; try a curve with more knots, a window without the handling, or check the probe and bath`,
    })
  if (!fit.converged) problems.push({ field: 'model', message: `the fit stopped after ${fit.iterations} iterations without settling, so its values are not a result to save` })
  if (!acceptUndeterminedKnots)
    fit.hCurve?.forEach((knot, i) => {
      if (!knot.determined)
        problems.push({
          field: `model.knots_C.${i}`,
          message: `the log does not determine the knot at ${knot.T_C} °C (its h follows the neighbouring knots); confirm to save it anyway, or drop the knot`,
        })
    })
  return problems
}
