/**
 * One call from a case (CLI / web JSON) to the full result: stage modes, the
 * table of requested points × times, profiles, a ~600-point curve, the target time
 * and, per stage, the target point's serialisable series. Optionally re-solves
 * with the Crank–Nicolson code as an independent check.
 */
import { caseToProblem, parseCase, type Case } from './caseSchema'
import { constantLimit } from './constantLimit'
import type { Deadline } from './deadline'
import { CaseError, EngineLimitError, WHOLE_CASE } from './errors'
import { solveCrankNicolson } from './crankNicolson'
import { solveCrankNicolsonNonlinear } from './crankNicolsonNonlinear'
import { pointValues, type PointStage } from '../../shared/pointSeries'
import { solveCooldown } from './solveCooldown'
import type { TargetSpec } from './targetTime'
import type { CooldownSolution, PointRef, StageSummary } from './types'

export interface RunOptions {
  /** Also solve with Crank–Nicolson and report the largest difference. */
  check?: 'finite-difference'
  /** Refuse (EngineLimitError) once it passes; absent, the case takes the time it needs. */
  deadline?: Deadline
}

export interface CaseResult {
  targetTime_s: number | null
  target: { at: PointRef; below_C?: number; above_C?: number } | null
  /** x (fraction of size_m) read as "centre". */
  centreX: number
  stages: (StageSummary & { method: string; estimatedError_K: number; pointSeries: PointStage; subStepSeries?: PointStage[] })[]
  table: { points: number[]; t_s: number[]; T_C: number[][] }
  profiles: { x: number[]; t_s: number[]; T_C: number[][] }
  curve: { t_s: number[]; centre_C: number[]; surface_C: number[]; mean_C: number[] }
  check?: { maxDifference_K: number; times_s: number[]; points: number[] }
}

/** Equal steps of a result curve (plus its exact moments). */
export const CURVE_POINTS = 600
/** Where a temperature profile is read, centre (0) to surface (1). */
export const PROFILE_X = Array.from({ length: 21 }, (_, i) => i / 20)
/** The cheap first pass is accurate from this Fourier number on: a handful of modes. */
export const FIRST_PASS_FO = 0.05

export function runCase(caseInput: unknown, options: RunOptions = {}): CaseResult {
  const c = parseCase(caseInput)
  try {
    return finiteResult(solveCase(c, options))
  } catch (error) {
    // A limit hit deep in the engine knows no field: blame what makes a case heavy.
    if (error instanceof EngineLimitError && error.field === WHOLE_CASE) throw new EngineLimitError(error.reason, c.material.profile ? 'material.profile' : 'stages')
    throw error
  }
}

function solveCase(c: Case, options: RunOptions): CaseResult {
  const problem = caseToProblem(c)
  const times = c.times_s ?? []
  const points = c.points ?? [0, 0.5, 1]
  const target = c.target ? targetSpec(c.target) : null
  const at: PointRef = c.target?.at ?? 'centre'
  const starts = stageStarts(c.stages)
  const solveWith = (earliestCurve_s: number) =>
    solveCooldown(problem, {
      minModes: c.modes,
      earliest_s: starts.map((start, i) => {
        const end = starts[i + 1] ?? Infinity
        const taus = times.filter((t) => t > start && t <= end).map((t) => t - start)
        return Math.min(earliestCurve_s, ...taus)
      }),
      deadline: options.deadline,
    })
  // A cheap first pass (accurate from FIRST_PASS_FO on) finds the target and hence the
  // curve's end and spacing; the second pass is accurate from the first curve sample.
  const cheapFrom_s = firstGuess(problem, c)
  let solution = solveWith(cheapFrom_s)
  let targetTime = target ? solution.targetTime(at, target) : null
  let end_s = curveEnd(solution, c, starts, targetTime)
  const spacing = end_s / CURVE_POINTS
  if (spacing < cheapFrom_s || times.some((t) => t > 0 && t < cheapFrom_s)) {
    solution = solveWith(spacing)
    targetTime = target ? solution.targetTime(at, target) : null
    end_s = curveEnd(solution, c, starts, targetTime)
  }
  if (target && targetTime === null) unreachable(solution, at, c)
  options.deadline?.check()

  const centre = solution.pointSeries('centre')
  const surface = solution.pointSeries('surface')
  const tCurve = curveTimes(end_s, [...starts.slice(1).filter((s) => s < end_s), ...(targetTime === null ? [] : [targetTime])])
  // t = 0 reads the start itself; the series is not converged there.
  const curveOf = (series: PointStage[], initial_C: number) => {
    const values = pointValues(series, tCurve)
    return tCurve.map((t, i) => (t <= 0 ? initial_C : values[i]))
  }
  const table = times.map((t) => points.map((x) => solution.evaluate(t, x)))
  const result: CaseResult = {
    targetTime_s: targetTime,
    target: c.target ? { ...c.target, at } : null,
    centreX: solution.centreX,
    stages: stageResults(solution, at),
    table: { points, t_s: times, T_C: table },
    profiles: { x: PROFILE_X, t_s: times, T_C: times.map((t) => PROFILE_X.map((x) => solution.evaluate(t, x))) },
    curve: {
      t_s: tCurve,
      centre_C: curveOf(centre, solution.initialAt(solution.centreX)),
      surface_C: curveOf(surface, solution.initialAt(1)),
      mean_C: curveOf(solution.pointSeries('mean'), solution.mean(0)),
    },
  }
  if ((options.check ?? c.check) === 'finite-difference') result.check = finiteDifferenceCheck(solution, c, problem, tCurve, points, options.deadline)
  return result
}

/** Every number shown must be finite: a NaN or infinity anywhere is refused, not printed. */
function finiteResult(result: CaseResult): CaseResult {
  const numbers = [
    result.targetTime_s ?? 0,
    ...result.curve.t_s,
    ...result.curve.centre_C,
    ...result.curve.surface_C,
    ...result.curve.mean_C,
    ...result.table.T_C.flat(),
    ...result.profiles.T_C.flat(),
    ...result.stages.flatMap((s) => [s.truncationError_K, s.pointSeries.steady_C, ...s.pointSeries.terms.flatMap((t) => [t.amplitude_K, t.decayRate_per_s])]),
    result.check?.maxDifference_K ?? 0,
  ]
  if (!numbers.every(Number.isFinite)) throw new EngineLimitError('the series gave a temperature or time that is not a finite number')
  return result
}

/**
 * Each stage's summary with the method that ran and its error estimate, and the
 * target point's series. A temperature-dependent stage is a chain of sub-step
 * series: all of them are in subStepSeries, and pointSeries is the first of them
 * only (kept for the shape; read subStepSeries for the stage's history).
 */
function stageResults(solution: CooldownSolution, at: PointRef): CaseResult['stages'] {
  const series = solution.pointSeries(at)
  return solution.summaries.map((s) => {
    const end = s.end_s ?? Infinity
    const own = series.filter((p) => p.start_s >= s.start_s && p.start_s < end)
    const method = s.method ?? SERIES_METHOD
    const estimatedError_K = s.estimatedError_K ?? s.truncationError_K
    return s.method === undefined
      ? { ...s, method, estimatedError_K, pointSeries: own[0] }
      : { ...s, method, estimatedError_K, pointSeries: own[0], subStepSeries: own }
  })
}

const SERIES_METHOD = 'eigenmode series'

function targetSpec(t: NonNullable<Case['target']>): TargetSpec {
  return t.below_C !== undefined ? { below_C: t.below_C } : { above_C: t.above_C as number }
}

/** Each stage's start time; every stage but the last has a duration. */
export function stageStarts(stages: readonly { duration_s?: number }[]): number[] {
  const starts = [0]
  for (const s of stages.slice(0, -1)) starts.push(starts[starts.length - 1] + (s.duration_s as number))
  return starts
}

/** FIRST_PASS_FO of the whole body, with its fastest diffusivity. */
function firstGuess(problem: ReturnType<typeof caseToProblem>, c: Case): number {
  const k = Math.max(...problem.domain.properties.map((p) => p.k_W_mK))
  const rc = Math.min(...problem.domain.properties.map((p) => p.rhoCp_J_m3K))
  return (FIRST_PASS_FO * c.size_m ** 2 * rc) / k
}

/**
 * The curve's sample times: CURVE_POINTS equal steps from 0 to end_s, plus the
 * moments the curve must show exactly (stage starts, the target time). A grid time
 * within rounding of one of those gives way to it, so no two samples sit a
 * floating-point hair apart.
 */
export function curveTimes(end_s: number, exact: number[]): number[] {
  const tolerance = 1e-9 * end_s
  const grid = Array.from({ length: CURVE_POINTS + 1 }, (_, i) => (end_s * i) / CURVE_POINTS).filter((t) => exact.every((e) => Math.abs(t - e) > tolerance))
  return [...new Set([...grid, ...exact])].sort((a, b) => a - b)
}

/**
 * Past the target (×1.25), the requested times and every finite stage; without a
 * target, until the centre is within 1 K of the last stage's steady value or five
 * of its slowest time constants, whichever comes first.
 */
function curveEnd(solution: CooldownSolution, c: Case, starts: number[], targetTime: number | null): number {
  const lastStart = starts[starts.length - 1]
  const lastDuration = c.stages[c.stages.length - 1].duration_s ?? 0
  const candidates = [lastStart + lastDuration, ...(c.times_s ?? [])]
  if (targetTime !== null) candidates.push(1.25 * targetTime)
  else {
    const last = solution.pointSeries('centre').at(-1) as PointStage
    const slow = last.terms[0]
    if (slow) {
      const within1K = Math.log(Math.max(1, Math.abs(slow.amplitude_K))) / slow.decayRate_per_s
      candidates.push(lastStart + Math.min(within1K, 5 / slow.decayRate_per_s))
    }
  }
  const end = Math.max(...candidates)
  return end > 0 ? end : 1
}

function unreachable(solution: CooldownSolution, at: PointRef, c: Case): never {
  const final = (solution.pointSeries(at).at(-1) as PointStage).steady_C
  const field = c.target?.below_C !== undefined ? 'target.below_C' : 'target.above_C'
  const goal = c.target?.below_C ?? c.target?.above_C
  throw new CaseError(field, `the last stage settles at ${final.toFixed(2)} °C there, so ${goal} °C is never reached`)
}

/** Compares the series with Crank–Nicolson at the table points and 12 curve times. */
function finiteDifferenceCheck(
  solution: CooldownSolution,
  c: Case,
  problem: ReturnType<typeof caseToProblem>,
  tCurve: number[],
  points: number[],
  deadline: Deadline | undefined,
): NonNullable<CaseResult['check']> {
  const stride = Math.max(1, Math.floor(tCurve.length / 12))
  const times = [...new Set([...(c.times_s ?? []), ...tCurve.filter((t, i) => t > 0 && i % stride === 0)])].sort((a, b) => a - b)
  const xs = [...new Set([solution.centreX, 1, ...points])]
  const options = { times_s: times, points: xs, deadline }
  const fd = constantLimit(problem) ? solveCrankNicolson(problem, options) : solveCrankNicolsonNonlinear(problem, options)
  let max = 0
  fd.t_s.forEach((t, i) => xs.forEach((x, j) => (max = Math.max(max, Math.abs(fd.T_C[i][j] - solution.evaluate(t, x))))))
  return { maxDifference_K: max, times_s: times, points: xs }
}
