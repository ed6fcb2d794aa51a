/**
 * Calibrating a quench medium from a logged cooling curve: the surface coefficient h
 * (one constant, or a cooling-power curve h(T_s) at chosen knots) whose predicted
 * thermocouple temperature best matches the log, by Levenberg–Marquardt.
 *
 * Parameters are ln h (h stays positive, and a curve spanning 300 to 5000 W/m²K is
 * scaled evenly). A curve carries a smoothness penalty: one extra residual per inner
 * knot, PENALTY_K times the second divided difference of ln h (scaled to the mean
 * knot spacing), so a knot the log cannot see follows its neighbours instead of
 * wandering. Standard uncertainties come from the Jacobian at the result,
 * cov = s²(JᵀJ)⁻¹ with s² the data residuals' variance (n − p degrees of freedom),
 * carried to h by σ_h = h·σ_ln h.
 *
 * A knot is reported as undetermined when fewer than MIN_POINTS_PER_KNOT logged
 * points have the fitted surface near it (counted with the knot's hat function,
 * whose share of each point is how much that knot sets h there), or when its
 * uncertainty exceeds half its value: its h is then the penalty's guess, not the
 * log's, and no uncertainty is given for it.
 */
import { inverse, pseudoInverse, type Matrix } from 'ml-matrix'
import { forwardTemperatures, type SurfaceTrial } from './forwardModel'
import { levenbergMarquardt } from './levenbergMarquardt'
import { parseFit, type FitCase } from './fitSchema'
import { GEOMETRY_EXPONENT } from '../thermal/types'
import type { CalibrationKnot, CalibrationProgress, CalibrationRatePoint, CalibrationResult } from '../../shared/types/calibration'

/** Weight of the smoothness rows, K per unit second difference of ln h. */
export const PENALTY_K = 0.3
export const MIN_POINTS_PER_KNOT = 5
export const MAX_RELATIVE_UNCERTAINTY = 0.5
/** Half-width, in log points, of the centred differences of the cooling-rate curves. */
const RATE_HALF_WINDOW = 2

export type KnotResult = CalibrationKnot
export type RatePoint = CalibrationRatePoint
export type FitResult = CalibrationResult
export type FitProgress = CalibrationProgress

function trialOf(fc: FitCase, p: number[]): SurfaceTrial {
  if (fc.model.kind === 'constant') return { h_W_m2K: Math.exp(p[0]) }
  return { hCurve: fc.model.knots_C.map((T_C, i) => ({ T_C, h_W_m2K: Math.exp(p[i]) })) }
}

/** Second divided differences of ln h over the knots, in units of the mean knot spacing. */
function smoothnessRows(knots: number[], p: number[]): number[] {
  const spacing = (knots[knots.length - 1] - knots[0]) / (knots.length - 1)
  const rows: number[] = []
  for (let i = 1; i < knots.length - 1; i++) {
    const right = (p[i + 1] - p[i]) / (knots[i + 1] - knots[i])
    const left = (p[i] - p[i - 1]) / (knots[i] - knots[i - 1])
    rows.push((PENALTY_K * 2 * (right - left) * spacing * spacing) / (knots[i + 1] - knots[i - 1]))
  }
  return rows
}

/**
 * A lumped first guess: a thin body falls to half its excess temperature in
 * t½ = ρc (V/A) ln 2 / h, with V/A = L/(m + 1). It underestimates h when the body's
 * interior resists, which Levenberg–Marquardt corrects.
 */
function lumpedGuess(fc: FitCase): number {
  const { domain } = fc.problem
  const rhoCp = domain.properties[0].rhoCp_J_m3K
  const volumePerArea = domain.length_m / (GEOMETRY_EXPONENT[domain.geometry] + 1)
  const start = fc.T_C[0] - fc.ambient_C
  let i = fc.T_C.findIndex((T) => (T - fc.ambient_C) / start <= 0.5)
  if (i < 1) i = fc.T_C.length - 1
  const theta = Math.min(0.99, Math.max(1e-3, (fc.T_C[i] - fc.ambient_C) / start))
  const h = (rhoCp * volumePerArea * -Math.log(theta)) / Math.max(fc.t_s[i], 1e-3)
  return Math.min(1e5, Math.max(1, h))
}

/** Hat weight of knot j at temperature T (the end knots hold beyond the ends, as the curve does). */
function hat(knots: number[], j: number, T: number): number {
  if (j > 0 && T < knots[j]) return T <= knots[j - 1] ? 0 : (T - knots[j - 1]) / (knots[j] - knots[j - 1])
  if (j < knots.length - 1 && T > knots[j]) return T >= knots[j + 1] ? 0 : (knots[j + 1] - T) / (knots[j + 1] - knots[j])
  return 1
}

function coolingRate(t_s: number[], T_C: ArrayLike<number>): RatePoint[] {
  const w = RATE_HALF_WINDOW
  const rates: RatePoint[] = []
  for (let i = w; i < t_s.length - w; i++) rates.push({ T_C: T_C[i], rate_K_s: -(T_C[i + w] - T_C[i - w]) / (t_s[i + w] - t_s[i - w]) })
  return rates
}

function covariance(J: Matrix, variance: number): Matrix {
  const JtJ = J.transpose().mmul(J)
  let inv: Matrix
  try {
    inv = inverse(JtJ)
  } catch {
    inv = pseudoInverse(JtJ)
  }
  return inv.mul(variance)
}

/** Fits a validated case; `onProgress` hears each accepted step. */
export function fitCase(fc: FitCase, onProgress?: (progress: FitProgress) => void): FitResult {
  const n = fc.t_s.length
  const knots = fc.model.kind === 'curve' ? fc.model.knots_C : null
  const parameters = knots ? knots.length : 1
  const residuals = (p: number[]) => {
    const model = forwardTemperatures(fc.problem, fc.x, fc.ambient_C, trialOf(fc, p), fc.t_s).thermocouple_C
    const r = new Float64Array(n + (knots ? knots.length - 2 : 0))
    for (let i = 0; i < n; i++) r[i] = model[i] - fc.T_C[i]
    if (knots) smoothnessRows(knots, p).forEach((v, i) => (r[n + i] = v))
    return r
  }
  const start = Math.log(lumpedGuess(fc))
  // The cost also holds the smoothness rows; close enough to the data misfit for a progress line.
  const onIteration = onProgress && ((iteration: number, cost: number) => onProgress({ iteration, rms_K: Math.sqrt(cost / n) }))
  const solved = levenbergMarquardt(residuals, Array.from({ length: parameters }, () => start), { onIteration })
  const p = solved.params
  const final = forwardTemperatures(fc.problem, fc.x, fc.ambient_C, trialOf(fc, p), fc.t_s)
  let squares = 0
  let maxAbs = 0
  for (let i = 0; i < n; i++) {
    squares += solved.residuals[i] ** 2
    maxAbs = Math.max(maxAbs, Math.abs(solved.residuals[i]))
  }
  const cov = covariance(solved.jacobian, squares / Math.max(1, n - parameters))
  const sigmaH = p.map((lnH, j) => Math.exp(lnH) * Math.sqrt(Math.max(0, cov.get(j, j))))
  const warnings: string[] = []
  if (!solved.converged) warnings.push(`the fit stopped after ${solved.iterations} iterations without settling; treat the values with care`)
  const result: FitResult = {
    model: fc.model.kind,
    rms_K: Math.sqrt(squares / n),
    maxAbs_K: maxAbs,
    points: n,
    iterations: solved.iterations,
    converged: solved.converged,
    series: { t_s: fc.t_s, measured_C: fc.T_C, fitted_C: Array.from(final.thermocouple_C), surface_C: Array.from(final.surface_C) },
    coolingRate: { measured: coolingRate(fc.t_s, fc.T_C), fitted: coolingRate(fc.t_s, final.thermocouple_C) },
    warnings,
  }
  if (!knots) {
    result.h = { value: Math.exp(p[0]), uncertainty: sigmaH[0] }
    return result
  }
  result.hCurve = knots.map((T_C, j) => {
    const h = Math.exp(p[j])
    let seen = 0
    for (let i = 0; i < n; i++) seen += hat(knots, j, final.surface_C[i])
    const relative = sigmaH[j] / h
    const determined = seen >= MIN_POINTS_PER_KNOT && relative <= MAX_RELATIVE_UNCERTAINTY
    if (seen < MIN_POINTS_PER_KNOT)
      warnings.push(`knot at ${T_C} °C is not determined by the log: only ${seen.toFixed(1)} logged point(s) have the surface near it, so its h follows the neighbouring knots`)
    else if (!determined)
      warnings.push(`knot at ${T_C} °C is not determined by the log: its standard uncertainty is ${Math.round(relative * 100)} % of its value`)
    return { T_C, h, uncertainty: determined ? sigmaH[j] : null, points: seen, determined }
  })
  return result
}

/** Validates and fits a raw input (CLI and API); throws FitError naming a bad field. */
export function fitCoolingLog(input: unknown, onProgress?: (progress: FitProgress) => void): FitResult {
  return fitCase(parseFit(input), onProgress)
}
