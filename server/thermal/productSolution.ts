/**
 * Short cylinders and rectangular blocks by product solutions, staged.
 *
 * With uniform properties, a uniform start and the same ambient T∞ on every face,
 * the excess θ = T − T∞ separates into one 1-D factor per direction,
 *   θ(x, y, z, t)/θ₀ = Π_d f_d(x_d, t)
 * (Carslaw & Jaeger, Conduction of Heat in Solids, §1.15; Incropera et al. §5.8).
 * This stays exact when h changes from stage to stage, provided every stage has the
 * same T∞: each f_d then solves its own 1-D problem with the same h(t), and the
 * product satisfies the 3-D equation and every face condition. Stages with different
 * ambients break the separation, so they are refused (CaseError on `stages`).
 *
 * Each factor comes from the series engine (solveCooldown) for a slab or rod; the
 * heat-content mean of a product is the product of the 1-D means (the volume
 * integral factorises). Checked in tests/unit/thermal/productSolution.test.ts
 * against closed-form slab and rod series, one-term values and a worked example.
 */
import { caseToProblem, parseCase } from './caseSchema'
import type { Deadline } from './deadline'
import { CaseError } from './errors'
import { solveCrankNicolson } from './crankNicolson'
import { brent } from './roots'
import { CURVE_POINTS, FIRST_PASS_FO, PROFILE_X, curveTimes, stageStarts } from './runCase'
import { solveCooldown } from './solveCooldown'
import type { CooldownSolution } from './types'
import { pointValue, type PointStage, type PointTerm } from '../../shared/pointSeries'
import type { PlanMode } from '../../shared/types/planResult'

/** One finite direction of the body: a slab half-thickness or a rod radius. */
export interface ProductDirection {
  /** The part's own word for it ("diameter", "side 2"), used in messages. */
  label: string
  geometry: 'slab' | 'rod'
  size_m: number
}

export interface ProductInput {
  body: { directions: ProductDirection[] }
  material: { k: number; rho: number; cp: number }
  initial_C: number
  stages: { h_W_m2K: number; ambient_C: number; duration_s?: number }[]
  target: { at: 'centre' | 'mean'; below_C?: number; above_C?: number }
}

export interface ModelRun {
  targetTime_s: number
  curve: { t_s: number[]; centre_C: number[]; surface_C: number[]; mean_C: number[] }
  profiles: { x: number[]; t_s: number[]; T_C: number[][] }
  stages: { modes: PlanMode[]; truncationError_K: number; start_s: number; end_s: number | null }[]
  /** The target point's history as a serialisable series (shared/pointSeries). */
  series: PointStage[]
}

/** The shipped series is trimmed for size; it stays within 0.05 K from this fraction into each stage's span on (checked against the curve in tests). */
export const PRODUCT_SERIES_FROM = 0.001
const SERIES_TOLERANCE_K = 0.05
/** Slowest modes a plan lists per stage, for 1-D bodies and products alike. */
export const MODES_LISTED = 8

function directionCase(input: ProductInput, geometry: 'slab' | 'rod', size_m: number) {
  return {
    geometry,
    size_m,
    material: input.material,
    initial_C: input.initial_C,
    stages: input.stages.map((s) => ({ surface: { h: s.h_W_m2K, ambient_C: s.ambient_C }, ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }) })),
  }
}

interface Factors {
  ambient_C: number
  theta0: number
  solutions: CooldownSolution[]
  /** f_d(point, t) = θ_d/θ₀ for direction d. */
  factor: (d: number, point: 'centre' | 'surface' | 'mean', t: number) => number
}

/**
 * Below this Fo a direction's centre has not felt its faces: its centre factor is 1 to
 * 1e-50 (Carslaw & Jaeger §3.3, image solution), so its series need not be accurate
 * earlier, which keeps the mode count (and the product's term count) bounded.
 */
const UNDISTURBED_FO = 0.002

function solveFactors(input: ProductInput, earliest: (size_m: number) => number, deadline: Deadline | undefined): Factors {
  const ambient_C = input.stages[0]!.ambient_C
  if (input.stages.some((s) => s.ambient_C !== ambient_C)) {
    throw new CaseError(
      'stages',
      'a short cylinder or block can only be computed when every stage has the same bath temperature (product solutions); use one stage or quenchants with equal bath temperatures',
    )
  }
  const theta0 = input.initial_C - ambient_C
  const alpha = input.material.k / (input.material.rho * input.material.cp)
  const undisturbed_s = input.body.directions.map((d) => (UNDISTURBED_FO * d.size_m * d.size_m) / alpha)
  const solutions = input.body.directions.map((d, i) =>
    solveCooldown(caseToProblem(parseCase(directionCase(input, d.geometry, d.size_m))), { earliest_s: Math.max(earliest(d.size_m), undisturbed_s[i]!), deadline }),
  )
  return {
    ambient_C,
    theta0,
    solutions,
    factor: (d, point, t) =>
      t <= 0 || (point === 'centre' && t < undisturbed_s[d]!) ? 1 : (pointValue(solutions[d]!.pointSeries(point), t) - ambient_C) / theta0,
  }
}

export function runProduct(input: ProductInput, options: { times_s?: number[]; deadline?: Deadline } = {}): ModelRun {
  const alpha = input.material.k / (input.material.rho * input.material.cp)
  const sizes = input.body.directions.map((d) => d.size_m)
  const shortest = Math.min(...sizes)
  const goal = input.target.below_C ?? (input.target.above_C as number)
  // A cheap first pass (accurate from FIRST_PASS_FO of each direction) finds the target; the second is accurate from the first curve sample.
  const firstPass_s = (L: number) => (FIRST_PASS_FO * L * L) / alpha
  let factors = solveFactors(input, firstPass_s, options.deadline)
  let targetTime = crossing(factors, input, goal, shortest, alpha)
  const end_s = 1.25 * targetTime
  farDirections(input, alpha, end_s)
  const firstSample = Math.min(end_s / CURVE_POINTS, ...(options.times_s ?? []).filter((t) => t > 0))
  factors = solveFactors(input, (L) => Math.min(firstPass_s(L), firstSample), options.deadline)
  targetTime = crossing(factors, input, goal, shortest, alpha)

  const n = input.body.directions.length
  const { ambient_C, theta0, factor } = factors
  const productOf = (factorsAt: number[]) => ambient_C + theta0 * factorsAt.reduce((a, b) => a * b, 1)
  const factorsAt = (point: 'centre' | 'mean' | 'surface', t: number) => Array.from({ length: n }, (_, d) => factor(d, point, t))
  // "Surface" of a block or short cylinder: the face centre farthest from the ambient (hottest when cooling).
  const surfaceFrom = (centres: number[], t: number) => {
    let best = 0
    for (let d = 0; d < n; d++) {
      let f = factor(d, 'surface', t)
      for (let e = 0; e < n; e++) if (e !== d) f *= centres[e]!
      if (Math.abs(f) > Math.abs(best)) best = f
    }
    return ambient_C + theta0 * best
  }
  const starts = stageStarts(input.stages)
  const tCurve = curveTimes(end_s, [...starts.slice(1).filter((s) => s < end_s), targetTime])
  // Each direction's centre factor once per curve time: the centre and the surface curves both use it.
  const centres = tCurve.map((t) => factorsAt('centre', t))
  // The profile runs from the centre to the nearest face centre, along the shortest direction.
  const along = sizes.indexOf(shortest)
  const profileAt = (t: number) =>
    PROFILE_X.map((x) => {
      let f = t <= 0 ? 1 : (factors.solutions[along]!.evaluate(t, x) - ambient_C) / theta0
      for (let e = 0; e < n; e++) if (e !== along) f *= factor(e, 'centre', t)
      return ambient_C + theta0 * f
    })
  const times = options.times_s ?? []
  return {
    targetTime_s: targetTime,
    curve: {
      t_s: tCurve,
      centre_C: centres.map(productOf),
      surface_C: tCurve.map((t, i) => surfaceFrom(centres[i]!, t)),
      mean_C: tCurve.map((t) => productOf(factorsAt('mean', t))),
    },
    profiles: { x: PROFILE_X, t_s: times, T_C: times.map(profileAt) },
    stages: input.stages.map((_, s) => {
      const summaries = factors.solutions.map((sol) => sol.summaries[s]!)
      return {
        start_s: summaries[0]!.start_s,
        end_s: summaries[0]!.end_s,
        modes: productModes(summaries.map((m) => m.decayRates_per_s)),
        // |Πf − Πg| ≤ Σ|f_d − g_d| when every factor lies in [0, 1]: the 1-D truncations add up.
        truncationError_K: summaries.reduce((sum, m) => sum + m.truncationError_K, 0),
      }
    }),
    series: productSeries(factors, input.target.at, targetTime),
  }
}

/**
 * A direction whose centre never feels its faces before the curve ends adds nothing at
 * the centre but would need hundreds of modes for its early mean and face values: the
 * part is then a plate (or round bar) for this purpose, and the planner says so.
 */
function farDirections(input: ProductInput, alpha: number, end_s: number): void {
  input.body.directions.forEach((d) => {
    if ((alpha * end_s) / (d.size_m * d.size_m) < UNDISTURBED_FO) {
      const instead = input.body.directions.some((e) => e.geometry === 'rod') ? 'a round bar' : 'a plate'
      throw new CaseError('part', `the ${d.label} is so large against the other sizes that its faces do not reach the centre before handling; plan this part as ${instead}`)
    }
  })
}

/** Product mode (n₁, n₂, …) decays at Σ rate_{n_d}: the slowest few are listed. */
function productModes(rates: number[][]): PlanMode[] {
  let combos: { label: number[]; rate: number }[] = [{ label: [], rate: 0 }]
  for (const direction of rates) {
    combos = combos.flatMap((c) => direction.slice(0, MODES_LISTED).map((r, i) => ({ label: [...c.label, i + 1], rate: c.rate + r })))
  }
  return combos
    .sort((a, b) => a.rate - b.rate)
    .slice(0, MODES_LISTED)
    .map((c) => ({ label: `(${c.label.join(', ')})`, decayRate_per_s: c.rate, timeConstant_s: 1 / c.rate }))
}

/** The target temperature is crossed once (each factor falls monotonically): bracket by doubling, polish with Brent. */
function crossing(factors: Factors, input: ProductInput, goal_C: number, shortest: number, alpha: number): number {
  const n = input.body.directions.length
  const at = input.target.at
  const gap = (t: number) => {
    let f = 1
    for (let d = 0; d < n; d++) f *= factors.factor(d, at, t)
    const T = factors.ambient_C + factors.theta0 * f
    return input.target.below_C !== undefined ? T - goal_C : goal_C - T
  }
  const fa = gap(0)
  if (fa <= 0) return 0
  let lo = 0
  let hi = (0.01 * shortest * shortest) / alpha
  let fHi = gap(hi)
  for (let i = 0; fHi > 0; i++) {
    if (i > 80) throw new CaseError(input.target.below_C !== undefined ? 'target.below_C' : 'target.above_C', `${goal_C} °C is never reached`)
    lo = hi
    hi *= 2
    fHi = gap(hi)
  }
  return brent(gap, lo, hi, { fa: gap(lo), fb: fHi, rtol: 1e-12 })
}

/**
 * The product of the factor series, term by term, for the floor countdown. Terms are
 * dropped smallest first (their size PRODUCT_SERIES_FROM into the stage's span up to the
 * target time) while the dropped total stays under SERIES_TOLERANCE_K; every term decays,
 * so the shipped series is within that tolerance from there on.
 */
function productSeries(factors: Factors, at: 'centre' | 'mean', target_s: number): PointStage[] {
  const perDirection = factors.solutions.map((sol) => sol.pointSeries(at))
  return perDirection[0]!.map((stage0, s) => {
    let terms: PointTerm[] = [{ amplitude_K: factors.theta0, decayRate_per_s: 0 }]
    for (const series of perDirection) {
      const stage = series[s]!
      terms = terms.flatMap((t) => stage.terms.map((u) => ({ amplitude_K: (t.amplitude_K * u.amplitude_K) / factors.theta0, decayRate_per_s: t.decayRate_per_s + u.decayRate_per_s })))
    }
    const tau = PRODUCT_SERIES_FROM * Math.max(0, Math.min(stage0.end_s ?? Infinity, target_s) - stage0.start_s)
    const sized = terms.map((t) => ({ t, size: Math.abs(t.amplitude_K) * Math.exp(-t.decayRate_per_s * tau) })).sort((a, b) => a.size - b.size)
    let dropped = 0
    let cut = 0
    while (cut < sized.length && dropped + sized[cut]!.size < SERIES_TOLERANCE_K) dropped += sized[cut++]!.size
    const kept = sized.slice(cut).map((k) => k.t).sort((a, b) => a.decayRate_per_s - b.decayRate_per_s)
    return { start_s: stage0.start_s, ...(stage0.end_s === undefined ? {} : { end_s: stage0.end_s }), steady_C: factors.ambient_C, terms: kept }
  })
}

/**
 * Finite-difference check of each 1-D factor (Crank–Nicolson) at the curve's times;
 * the product's difference is at most the sum of the factors' differences in K.
 */
export function checkProduct(input: ProductInput, times_s: number[], deadline?: Deadline): number {
  const alpha = input.material.k / (input.material.rho * input.material.cp)
  const factors = solveFactors(input, (L) => Math.min((FIRST_PASS_FO * L * L) / alpha, ...times_s.filter((t) => t > 0)), deadline)
  return input.body.directions.reduce((sum, d, i) => {
    const problem = caseToProblem(parseCase(directionCase(input, d.geometry, d.size_m)))
    const xs = [0, 0.5, 1]
    const fd = solveCrankNicolson(problem, { times_s, points: xs, deadline })
    let max = 0
    fd.t_s.forEach((t, a) => xs.forEach((x, b) => (max = Math.max(max, Math.abs(fd.T_C[a]![b]! - factors.solutions[i]!.evaluate(t, x))))))
    return sum + max
  }, 0)
}
