/**
 * The fit's forward model: the thermocouple and surface temperatures of a body
 * quenched with a given surface law, at the log's times.
 *
 * Choice: the engine's own Crank–Nicolson with temperature-dependent physics
 * (server/thermal/crankNicolsonNonlinear.ts) on a modest grid, FIT_CELLS cells and a
 * step ramp of FIT_RAMP_RATE. A fit calls it (parameters + 1) times per iteration,
 * which the eigenmode engine's temperature-dependent path is too slow for today. The
 * grid was chosen against the engine: on the three synthetic logs of
 * tests/unit/measurements/syntheticLogs.test.ts (Inconel 600 rod, ball and plate,
 * oil and polymer curves, 850 °C into a 40–60 °C bath) it stays within 0.25 K of the
 * eigenmode engine over the whole log, below the 0.3 K noise of a good logger; the
 * engine and its own 400-cell check differ by up to 0.12 K on the same logs, and
 * 24 cells strayed 0.25 K from the engine on the 8 mm ball.
 */
import { solveCrankNicolsonNonlinear } from '../thermal/crankNicolsonNonlinear'
import type { ConvectiveBoundary, CooldownProblem } from '../thermal/types'

export const FIT_CELLS = 32
export const FIT_RAMP_RATE = 0.05

/** A surface law to try: one h, or h at each knot (linear between, constant beyond). */
export type SurfaceTrial = { h_W_m2K: number } | { hCurve: { T_C: number; h_W_m2K: number }[] }

export interface ForwardTemperatures {
  thermocouple_C: Float64Array
  surface_C: Float64Array
}

export function surfaceBoundary(trial: SurfaceTrial, ambient_C: number): ConvectiveBoundary {
  if ('h_W_m2K' in trial) return { type: 'convective', h_W_m2K: trial.h_W_m2K, ambient_C }
  return { type: 'convective', h_W_m2K: trial.hCurve[0].h_W_m2K, ambient_C, hCurve: trial.hCurve }
}

export function forwardTemperatures(problem: CooldownProblem, x: number, ambient_C: number, trial: SurfaceTrial, t_s: number[]): ForwardTemperatures {
  const withSurface: CooldownProblem = { ...problem, stages: [{ inner: problem.stages[0].inner, outer: surfaceBoundary(trial, ambient_C) }] }
  const solved = solveCrankNicolsonNonlinear(withSurface, { times_s: t_s, points: [x, 1], cells: FIT_CELLS, rampRate: FIT_RAMP_RATE })
  return {
    thermocouple_C: Float64Array.from(solved.T_C, (row) => row[0]),
    surface_C: Float64Array.from(solved.T_C, (row) => row[1]),
  }
}
