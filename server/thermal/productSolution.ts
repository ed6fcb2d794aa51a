/**
 * Short cylinders and rectangular blocks by product solutions, staged.
 *
 * With uniform properties, a uniform start and the same ambient T∞ on every face,
 * the excess θ = T − T∞ separates into one 1-D factor per direction,
 *   θ(x, y, z, t)/θ₀ = Π_d f_d(x_d, t)
 * (Carslaw & Jaeger, Conduction of Heat in Solids, §1.15; Incropera et al. §5.8).
 * This stays exact when h changes from stage to stage: each f_d solves its own 1-D
 * problem with the same h(t), and the product satisfies the 3-D equation and every
 * face condition.
 *
 * A change of surrounding temperature between stages (oil, then shop air) is one more
 * term by superposition (Carslaw & Jaeger §1.14, Duhamel's theorem for a step): with
 * a(t) the ambient, a_j that of stage j starting at t_j, the problem is linear in the
 * start and ambient data, so
 *   T = a(t) + (T₀ − a₀) Π_d f_d⁽⁰⁾(x_d, t) − Σ_{j ≥ 1, t_j < t} (a_j − a_{j−1}) Π_d f_d⁽ʲ⁾(x_d, t − t_j),
 * where f⁽ʲ⁾ starts uniform at 1 at t_j under stages j, j+1, … with zero ambient. Each
 * term is continuous at its step (the jump of a is cancelled by the new term's 1), solves
 * the heat equation, and their sum meets −k ∂T/∂n = h(t)(T − a(t)) on every face.
 *
 * Each factor comes from the series engine (solveCooldown) for a slab or rod; the
 * heat-content mean of a product is the product of the 1-D means (the volume
 * integral factorises). Checked in tests/unit/thermal/productSolution.test.ts
 * against closed-form slab and rod series, one-term values and a worked example, and
 * for stages with different surroundings against the long-body 1-D limit and
 * Crank–Nicolson products.
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

/**
 * The 1-D case of one direction for the term that starts at stage `from`: uniform at the
 * term's weight under zero ambient, so the engine's tolerances in K apply at the term's
 * own scale; its factor is the solution over the weight.
 */
function directionCase(input: ProductInput, geometry: 'slab' | 'rod', size_m: number, from: number, weight_K: number) {
  return {
    geometry,
    size_m,
    material: input.material,
    initial_C: weight_K,
    stages: input.stages.slice(from).map((s) => ({
      surface: { h: s.h_W_m2K, ambient_C: 0 },
      ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }),
    })),
  }
}

/** One superposed term: weight_K × Π_d f_d(t − start_s), from stage `from` on; its 1-D solutions start at scale_K. */
interface Term {
  from: number
  start_s: number
  weight_K: number
  /**
   * |weight|, or 1 K for a zero weight (a start at the bath temperature), whose modes are still listed.
   * Positive: the 1-D problem is linear with zero surroundings, so a heating term (charge below the
   * furnace) is the cooling one with its sign in the weight, and its start stays within the bounds.
   */
  scale_K: number
  solutions: CooldownSolution[]
}

interface Superposition {
  terms: Term[]
  /** The surroundings at t: a time on a stage boundary belongs to the earlier stage. */
  ambientAt: (t: number) => number
  /** f_d of a term at absolute time t (1 before its start, and at a centre its faces have not reached). */
  factor: (term: Term, d: number, point: 'centre' | 'surface' | 'mean', t: number) => number
}

/**
 * Below this Fo a direction's centre has not felt its faces: its centre factor is 1 to
 * 1e-50 (Carslaw & Jaeger §3.3, image solution), so its series need not be accurate
 * earlier, which keeps the mode count (and the product's term count) bounded.
 */
const UNDISTURBED_FO = 0.002

function superpose(input: ProductInput, earliest: (size_m: number) => number, deadline: Deadline | undefined): Superposition {
  const starts = stageStarts(input.stages)
  const ambients = input.stages.map((s) => s.ambient_C)
  const alpha = input.material.k / (input.material.rho * input.material.cp)
  const undisturbed_s = input.body.directions.map((d) => (UNDISTURBED_FO * d.size_m * d.size_m) / alpha)
  const termAt = (from: number, weight_K: number): Term => {
    const scale_K = Math.abs(weight_K) || 1
    return {
      from,
      start_s: starts[from]!,
      weight_K,
      scale_K,
      solutions: input.body.directions.map((d, i) =>
        solveCooldown(caseToProblem(parseCase(directionCase(input, d.geometry, d.size_m, from, scale_K))), {
          earliest_s: Math.max(earliest(d.size_m), undisturbed_s[i]!),
          deadline,
        }),
      ),
    }
  }
  const terms = [termAt(0, input.initial_C - ambients[0]!)]
  ambients.forEach((a, j) => {
    if (j > 0 && a !== ambients[j - 1]) terms.push(termAt(j, -(a - ambients[j - 1]!)))
  })
  return {
    terms,
    ambientAt: (t) => {
      let s = 0
      while (s + 1 < starts.length && t > starts[s + 1]!) s++
      return ambients[s]!
    },
    factor: (term, d, point, t) => {
      const tau = t - term.start_s
      if (tau <= 0 || (point === 'centre' && tau < undisturbed_s[d]!)) return 1
      return pointValue(term.solutions[d]!.pointSeries(point), tau) / term.scale_K
    },
  }
}

/** Terms that have started by t (a term starts just after its stage boundary). */
const active = (sp: Superposition, t: number) => sp.terms.filter((term) => term.from === 0 || t > term.start_s)

/** T at the centre or heat-content mean: a(t) + Σ weight Π_d f_d. */
function pointTemperature(sp: Superposition, n: number, point: 'centre' | 'mean', t: number): number {
  let T = sp.ambientAt(t)
  for (const term of active(sp, t)) {
    let f = term.weight_K
    for (let d = 0; d < n; d++) f *= sp.factor(term, d, point, t)
    T += f
  }
  return T
}

/** "Surface" of a block or short cylinder: the face centre farthest from the surroundings (hottest when cooling). */
function surfaceTemperature(sp: Superposition, n: number, t: number): number {
  const a = sp.ambientAt(t)
  let best = 0
  for (let d = 0; d < n; d++) {
    let excess = 0
    for (const term of active(sp, t)) {
      let f = term.weight_K * sp.factor(term, d, 'surface', t)
      for (let e = 0; e < n; e++) if (e !== d) f *= sp.factor(term, e, 'centre', t)
      excess += f
    }
    if (Math.abs(excess) > Math.abs(best)) best = excess
  }
  return a + best
}

export function runProduct(input: ProductInput, options: { times_s?: number[]; deadline?: Deadline } = {}): ModelRun {
  const alpha = input.material.k / (input.material.rho * input.material.cp)
  const sizes = input.body.directions.map((d) => d.size_m)
  const shortest = Math.min(...sizes)
  const goal = input.target.below_C ?? (input.target.above_C as number)
  // A cheap first pass (accurate from FIRST_PASS_FO of each direction) finds the target; the second is accurate from the first curve sample.
  const firstPass_s = (L: number) => (FIRST_PASS_FO * L * L) / alpha
  let sp = superpose(input, firstPass_s, options.deadline)
  let targetTime = crossing(sp, input, goal, shortest, alpha)
  const end_s = 1.25 * targetTime
  farDirections(input, alpha, end_s)
  const firstSample = Math.min(end_s / CURVE_POINTS, ...(options.times_s ?? []).filter((t) => t > 0))
  sp = superpose(input, (L) => Math.min(firstPass_s(L), firstSample), options.deadline)
  targetTime = crossing(sp, input, goal, shortest, alpha)

  const n = input.body.directions.length
  const starts = stageStarts(input.stages)
  const tCurve = curveTimes(end_s, [...starts.slice(1).filter((s) => s < end_s), targetTime])
  // The profile runs from the centre to the nearest face centre, along the shortest direction.
  const along = sizes.indexOf(shortest)
  const profileAt = (t: number) =>
    PROFILE_X.map((x) => {
      let T = sp.ambientAt(t)
      for (const term of active(sp, t)) {
        const tau = t - term.start_s
        let f = term.weight_K * (tau <= 0 ? 1 : term.solutions[along]!.evaluate(tau, x) / term.scale_K)
        for (let e = 0; e < n; e++) if (e !== along) f *= sp.factor(term, e, 'centre', t)
        T += f
      }
      return T
    })
  const times = options.times_s ?? []
  return {
    targetTime_s: targetTime,
    curve: {
      t_s: tCurve,
      centre_C: tCurve.map((t) => pointTemperature(sp, n, 'centre', t)),
      surface_C: tCurve.map((t) => surfaceTemperature(sp, n, t)),
      mean_C: tCurve.map((t) => pointTemperature(sp, n, 'mean', t)),
    },
    profiles: { x: PROFILE_X, t_s: times, T_C: times.map(profileAt) },
    stages: input.stages.map((_, s) => {
      const first = sp.terms[0]!.solutions.map((sol) => sol.summaries[s]!)
      const started = sp.terms.filter((term) => term.from <= s)
      return {
        start_s: first[0]!.start_s,
        end_s: first[0]!.end_s,
        modes: productModes(first.map((m) => m.decayRates_per_s)),
        // |Πf − Πg| ≤ Σ|f_d − g_d| when every factor lies in [0, 1]: the 1-D truncations (each at its term's scale) add up.
        truncationError_K: started.reduce(
          (sum, term) =>
            sum + Math.abs(term.weight_K / term.scale_K) * term.solutions.reduce((inner, sol) => inner + sol.summaries[s - term.from]!.truncationError_K, 0),
          0,
        ),
      }
    }),
    series: productSeries(sp, input.stages, input.target.at, targetTime),
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

/** The target temperature is crossed once (the body only cools, or only heats): bracket by doubling, polish with Brent. */
function crossing(sp: Superposition, input: ProductInput, goal_C: number, shortest: number, alpha: number): number {
  const n = input.body.directions.length
  const gap = (t: number) => {
    const T = pointTemperature(sp, n, input.target.at, t)
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
 * The superposed products, term by term, for the floor countdown. In stage s each
 * started term contributes weight × Π_d (its direction series in that stage); as every
 * factor series is written against absolute time from the stage start, the products
 * keep that form. Terms are dropped smallest first (their size PRODUCT_SERIES_FROM into
 * the stage's span up to the target time) while the dropped total stays under
 * SERIES_TOLERANCE_K; every term decays, so the shipped series is within that
 * tolerance from there on.
 */
function productSeries(sp: Superposition, stages: ProductInput['stages'], at: 'centre' | 'mean', target_s: number): PointStage[] {
  const starts = stageStarts(stages)
  return stages.map((stage, s) => {
    const start_s = starts[s]!
    const end_s = stage.duration_s === undefined ? undefined : start_s + stage.duration_s
    const terms: PointTerm[] = sp.terms
      .filter((term) => term.from <= s)
      .flatMap((term) => {
        let products: PointTerm[] = [{ amplitude_K: term.weight_K, decayRate_per_s: 0 }]
        for (const sol of term.solutions) {
          const own = sol.pointSeries(at)[s - term.from]!
          products = products.flatMap((p) =>
            own.terms.map((u) => ({ amplitude_K: (p.amplitude_K * u.amplitude_K) / term.scale_K, decayRate_per_s: p.decayRate_per_s + u.decayRate_per_s })),
          )
        }
        return products
      })
    const tau = PRODUCT_SERIES_FROM * Math.max(0, Math.min(end_s ?? Infinity, target_s) - start_s)
    const sized = terms.map((t) => ({ t, size: Math.abs(t.amplitude_K) * Math.exp(-t.decayRate_per_s * tau) })).sort((a, b) => a.size - b.size)
    let dropped = 0
    let cut = 0
    while (cut < sized.length && dropped + sized[cut]!.size < SERIES_TOLERANCE_K) dropped += sized[cut++]!.size
    const kept = sized.slice(cut).map((k) => k.t).sort((a, b) => a.decayRate_per_s - b.decayRate_per_s)
    return { start_s, ...(end_s === undefined ? {} : { end_s }), steady_C: stage.ambient_C, terms: kept }
  })
}

/**
 * Finite-difference check of each term's 1-D factors (Crank–Nicolson) at the curve's
 * times; the product's difference is at most the sum of the factors' differences, each
 * in K at its term's scale.
 */
export function checkProduct(input: ProductInput, times_s: number[], deadline?: Deadline): number {
  const alpha = input.material.k / (input.material.rho * input.material.cp)
  const sp = superpose(input, (L) => Math.min((FIRST_PASS_FO * L * L) / alpha, ...times_s.filter((t) => t > 0)), deadline)
  const xs = [0, 0.5, 1]
  return sp.terms.reduce((total, term) => {
    const own = times_s.map((t) => t - term.start_s).filter((tau) => tau > 0)
    if (own.length === 0) return total
    const factorsDifference = input.body.directions.reduce((sum, d, i) => {
      const problem = caseToProblem(parseCase(directionCase(input, d.geometry, d.size_m, term.from, term.scale_K)))
      const fd = solveCrankNicolson(problem, { times_s: own, points: xs, deadline })
      let max = 0
      fd.t_s.forEach((t, a) => xs.forEach((x, b) => (max = Math.max(max, Math.abs(fd.T_C[a]![b]! - term.solutions[i]!.evaluate(t, x))))))
      return sum + max
    }, 0)
    return total + Math.abs(term.weight_K / term.scale_K) * factorsDifference
  }, 0)
}
