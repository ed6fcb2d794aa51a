/**
 * Cooldowns with temperature-dependent physics — k(T), ρc(T) from a material table,
 * h(T_s) from a quenchant curve, radiation εσ(T_s⁴ − T∞⁴) — as an eigenmode series
 * whose amplitudes are stepped in time (the method named in the stage summaries).
 *
 * Each stage writes the field on its modal basis, T = ℓ + Σ c_j(t) φ_j (ritzModes.ts:
 * the modes of a uniform body at the stage's starting Biot number, plus a face
 * function per convective face). With constant coefficients the amplitudes would
 * decay one by one as the familiar series; with k, ρc and h following the
 * temperature they are coupled, and the projected conduction equation M(c) ċ = f(c)
 * is stepped by an L-stable implicit Runge–Kutta method with an embedded error
 * estimate (galerkinStage.ts, sdirk.ts), the step accepted when the estimate is
 * within STEP_TOLERANCE_K (scaled by accuracy_K) and resized from it. Coefficients
 * are read node by node from the current field, so a node crossing the cp peak or
 * the surface crossing the boiling peak is seen where it happens.
 *
 * Between step ends each sub-step's history is the cubic through four neighbouring
 * step ends written as three exponentials (stepSeries), so each sub-step is a
 * PointStage like any series stage: target times are bracketed and polished by
 * firstCrossing on the sub-step where the crossing occurs, and the floor evaluates
 * the history without the engine. The last, open-ended stage ends in an open-ended
 * frozen series once the body is within OPEN_END_K of its steady state.
 *
 * The reported error estimate carries each step's local estimate forward on the
 * frozen modes of the stage's start, each mode's share fading at its own rate
 * (carryErrors), plus the series' truncation at the earliest reading.
 *
 * Cost (issue 12, the benchmark's oil-quenched steel bar, 14 basis functions on 64
 * quadrature nodes): ~125 sub-steps of three stages, each stage about two Newton
 * iterations of one residual (the field and its properties at the nodes, projected
 * back: four passes over functions × nodes), Newton's matrix assembled ~30 times in
 * all; ~8–11 ms, 1.1–1.2× faster than Crank–Nicolson at the same accuracy
 * (`npm run bench:engine`). The earlier method froze the
 * coefficients over each sub-step and carried the frozen problem's own series (an
 * eigen solve per sub-step): second order in the step, ~390 sub-steps, six times
 * slower for the same accuracy.
 *
 * solveCooldown sends only problems whose tables are not flat here; flat tables take
 * today's constant-property path unchanged. Checked against a refined finite-volume
 * solution (crankNicolsonNonlinear.ts) and the Kirchhoff closed form
 * (tests/unit/thermal/temperatureDependent.test.ts).
 */
import { pointValue, type PointStage } from '../../shared/pointSeries'
import { EngineLimitError } from './errors'
import { profileAt } from './solveCooldown'
import { GalerkinStepper, type NodeProperties, type StepResult } from './galerkinStage'
import { ALEXANDER_3 } from './sdirk'
import { interpolate, materialCurves } from './propertyTable'
import { propertiesAt, scaleDomain } from './properties'
import {
  basisValues,
  endTemperature,
  frozenSeries,
  largestOver,
  modalAmplitudes,
  modalBasis,
  modeShapes,
  nodeTemperatures,
  projectOnto,
  seriesCoefficients,
  type FaceKind,
  type FrozenSeries,
  type ModalBasis,
} from './ritzModes'
import type { StageSeries } from './series'
import { surfaceFlux, surfaceLaw, type SurfaceLaw } from './surfaceCurve'
import { firstCrossing, type TargetSpec } from './targetTime'
import type { Boundary, CooldownProblem, CooldownSolution, PointRef, SolveOptions, StageSummary } from './types'

/**
 * Accepted local error per sub-step at the default accuracy (the embedded estimate,
 * galerkinStage.ts), tuned against converged Crank–Nicolson runs (300 cells): at 0.05
 * the nine reference cases of temperatureDependent.test.ts are 0.02–0.14 K off (the
 * water-quenched slab, its centre crossing the cp peak, the worst), at 0.1 that slab
 * and sphere are 0.24 and 0.22 K off.
 */
const STEP_TOLERANCE_K = 0.05
/** The stepping method: three implicit stages, third order, L-stable. */
const TABLEAU = ALEXANDER_3
/** The step scales as the estimate's order plus one: (tolerance / error)^(1/(p̂ + 1)). */
const RESIZE_EXPONENT = 1 / (TABLEAU.estimateOrder + 1)
/** The default accuracy the step tolerance above is tuned for (0.2 K against a converged reference). */
const DEFAULT_ACCURACY_K = 0.2
/** Within this of the steady state the last sub-step is left open-ended. */
const OPEN_END_K = 0.5
const MAX_SUB_STEPS = 5000
/** A step shorter than this share of the body's conduction time means Newton cannot follow the stage at all. */
const SMALLEST_STEP = 1e-12
/** The first step of a stage, as a share of the fastest mode's time constant. */
const FIRST_STEP_SHARE = 0.1
/** Step growth and shrink bounds, and the safety factor on the estimate's resize. */
const MAX_GROWTH = 3
const MIN_SHRINK = 0.2
const SAFETY = 0.9
/**
 * The fewest basis functions a stage keeps, whatever its earliest reading: enough to
 * follow a field with a moving cp peak or boiling front.
 */
const MIN_MODES = 8
const MAX_MODES = 60

export const TEMPERATURE_DEPENDENT_METHOD = 'eigenmode series with stepped amplitudes (modal Galerkin, L-stable SDIRK sub-steps)'

/** A sub-step's coefficients as exponentials in time: c(τ) = steady + Σ_n e^{−rate_n τ} vector_n. */
type StepSeries = Pick<FrozenSeries, 'rates_per_s' | 'steady' | 'modeVectors'>

/** One sub-step: its history from start_s to end_s (Infinity when open-ended). */
interface SubStep {
  start_s: number
  end_s: number
  basis: ModalBasis
  series: StepSeries
}

/** k and ρc at the basis nodes from the node temperatures: the table's, or the graded profile's fixed values. */
function nodeProperties(problem: CooldownProblem, nodes: Float64Array): NodeProperties {
  const table = problem.domain.temperatureTable
  if (table) {
    const { T_C: rows, k_W_mK: ks, rhoCp_J_m3K: cs } = materialCurves(table)
    const last = rows.length - 1
    // Each node's row interval, kept from the last call: a node moves a little per call, so the search is a step or two.
    const interval = new Int32Array(nodes.length)
    return (T, k, rhoCp, rhoCpSlope) => {
      for (let i = 0; i < T.length; i++) {
        const t = T[i]
        if (t <= rows[0] || t >= rows[last]) {
          const end = t <= rows[0] ? 0 : last
          k[i] = ks[end]
          rhoCp[i] = cs[end]
          if (rhoCpSlope) rhoCpSlope[i] = 0
          continue
        }
        let j = interval[i]
        while (j > 0 && t < rows[j]) j--
        while (j < last - 1 && t >= rows[j + 1]) j++
        interval[i] = j
        const f = (t - rows[j]) / (rows[j + 1] - rows[j])
        k[i] = ks[j] + f * (ks[j + 1] - ks[j])
        rhoCp[i] = cs[j] + f * (cs[j + 1] - cs[j])
        if (rhoCpSlope) rhoCpSlope[i] = (cs[j + 1] - cs[j]) / (rows[j + 1] - rows[j])
      }
    }
  }
  const domain = scaleDomain(problem.domain)
  const k0 = Float64Array.from(nodes, (x) => propertiesAt(domain.pieces, x).k * domain.kRef_W_mK)
  const c0 = Float64Array.from(nodes, (x) => propertiesAt(domain.pieces, x).c * domain.rhoCpRef_J_m3K)
  return (_T, k, rhoCp, rhoCpSlope) => {
    k.set(k0)
    rhoCp.set(c0)
    rhoCpSlope?.fill(0)
  }
}

/** Temperatures of T = ℓ + Σ c_j φ_j at the basis nodes and at both faces. */
interface Field {
  nodes: Float64Array
  inner: number
  outer: number
}

function fieldOf(basis: ModalBasis, c: Float64Array): Field {
  return { nodes: nodeTemperatures(basis, c), inner: endTemperature(basis, c, 0), outer: endTemperature(basis, c, 1) }
}

const faceKind = (b: Boundary): FaceKind => (b.type === 'convective' ? 'convective' : b.type)
const lawOf = (b: Boundary): SurfaceLaw | null => (b.type === 'convective' ? surfaceLaw(b) : null)
const fluxOf = (law: SurfaceLaw | null) => (law ? (T: number) => surfaceFlux(law, T) : null)

export function solveTemperatureDependent(problem: CooldownProblem, options: SolveOptions = {}): CooldownSolution {
  const { domain } = problem
  const L = domain.length_m
  const scaled = scaleDomain(domain)
  const initial = problem.initial
  const initialAt = typeof initial === 'number' ? () => initial : (x: number) => profileAt(initial, x)
  const tolerance_K = (STEP_TOLERANCE_K * (options.accuracy_K ?? DEFAULT_ACCURACY_K)) / DEFAULT_ACCURACY_K
  const steps: SubStep[] = []
  const summaries: StageSummary[] = []
  const bounds = temperatureBounds(problem)
  const clamp = (T: number) => Math.min(bounds.max, Math.max(bounds.min, T))
  let start_s = 0
  let profile = initialAt
  // The time-stepping error carried along: each accepted step's estimate, decaying afterwards.
  let carried_K = 0
  problem.stages.forEach((stage, stageIndex) => {
    const last = stageIndex === problem.stages.length - 1
    const end_s = last ? Infinity : start_s + (stage.duration_s as number)
    const outerLaw = lawOf(stage.outer)
    const innerLaw = lawOf(stage.inner)
    // Basis Biot numbers from the stage's start; the face functions follow any later h.
    const kStart = kAt(problem, profile(0.5))
    const outerH = outerLaw ? outerLaw.effectiveH(profile(1)) : 0
    const innerH = innerLaw ? innerLaw.effectiveH(profile(0)) : 0
    const earliest = (Array.isArray(options.earliest_s) ? options.earliest_s[stageIndex] : options.earliest_s) ?? 0.01 * scaled.timeScale_s
    const timeScale = timeScaleAt(problem, profile(0.5))
    const tauMin = Math.max(earliest, 1e-9 * scaled.timeScale_s) / timeScale
    const count = Math.min(MAX_MODES, Math.max(MIN_MODES, options.minModes ?? 1, modesFor(tauMin, stage.inner.type === 'fixed' || stage.outer.type === 'fixed')))
    const basis = modalBasis({
      geometry: domain.geometry,
      count,
      inner: faceKind(stage.inner),
      outer: faceKind(stage.outer),
      innerBiot: (innerH * L) / kStart,
      outerBiot: (outerH * L) / kStart,
      ...(stage.inner.type === 'fixed' ? { innerFixed_C: stage.inner.T_C } : {}),
      ...(stage.outer.type === 'fixed' ? { outerFixed_C: stage.outer.T_C } : { outerAmbient_C: stage.outer.ambient_C }),
      breakpoints: [...new Set([...domain.properties.map((p) => p.x), ...(stageIndex === 0 && typeof initial !== 'number' ? initial.map((p) => p.x) : [])])],
    })
    const properties = nodeProperties(problem, basis.nodes)
    const frozenAt = freezer(problem, basis, properties, outerLaw, innerLaw, clamp)
    const stepper = new GalerkinStepper({ basis, length_m: L, properties, outerFlux: fluxOf(outerLaw), innerFlux: fluxOf(innerLaw), clamp, tableau: TABLEAU })
    let c: Float64Array = projectOnto(basis, profile)
    const startSeries = frozenAt(c)
    const ends: { t: number; c: Float64Array }[] = [{ t: start_s, c }]
    const errors: { step: number; vector: Float64Array }[] = []
    let previous: StepResult | null = null
    let t = start_s
    // The first step resolves the fastest mode (its exact decay, not the L-stable damping): right after a
    // sudden surface change the fast modes carry the field near the surface, and a damped start rings at the centre.
    let dt = Math.min(1e-3 * timeScale, FIRST_STEP_SHARE / Math.max(...startSeries.rates_per_s))
    let openEnd: FrozenSeries | null = null
    // Rejected steps add no sub-step, so the attempts are capped too: twice the sub-steps allows a rejection per step.
    for (let attempts = 0; ; attempts++) {
      options.deadline?.check()
      if (ends.length > MAX_SUB_STEPS || attempts > 2 * MAX_SUB_STEPS)
        throw new EngineLimitError(`more than ${MAX_SUB_STEPS} sub-steps; shorten the stage or soften its coefficients`, `stages.${stageIndex}`)
      // Within 1.5 steps of the stage's end, go halfway rather than leave a sliver: a
      // rejected last step must shrink, or the same step would be tried forever.
      const landing = t + dt >= end_s * (1 - 1e-12)
      const step = landing ? end_s - t : end_s - t < 1.5 * dt ? (end_s - t) / 2 : dt
      const result = stepper.step(c, previous, step, tolerance_K)
      if (result === 'non-finite') throw new EngineLimitError('a sub-step met a non-finite value', `stages.${stageIndex}`)
      if (result === 'diverged') {
        dt = step / 4
        if (dt < SMALLEST_STEP * timeScale) throw new EngineLimitError('the sub-steps shrank without end; soften the stage’s coefficients', `stages.${stageIndex}`)
        continue
      }
      const error = Math.max(result.error_K, 1e-300)
      const resize = Math.min(MAX_GROWTH, Math.max(MIN_SHRINK, SAFETY * (tolerance_K / error) ** RESIZE_EXPONENT))
      if (error > tolerance_K) {
        dt = step * resize
        continue
      }
      const moved = last ? transientSize(basis, result.c, c) : Infinity
      t = landing ? end_s : t + step
      c = result.c
      previous = result
      ends.push({ t, c })
      errors.push({ step, vector: result.errorVector })
      dt = step * resize
      if (landing) break
      // Near the steady state the coefficients barely move: the rest is one frozen series, open-ended.
      if (last && moved <= OPEN_END_K) {
        const frozen = frozenAt(c)
        if (transientSize(basis, c, frozen.steady) <= OPEN_END_K) {
          openEnd = frozen
          break
        }
      }
    }
    const endSeries = openEnd ?? frozenAt(c)
    const stageError = carryErrors(basis, startSeries, endSeries, errors, carried_K)
    carried_K = stageError.atEnd
    const firstStep = steps.length
    steps.push(...stepSeries(basis, ends))
    if (openEnd) steps.push({ start_s: t, end_s: Infinity, basis, series: openEnd })
    const stageSteps = steps.slice(firstStep)
    const lastStep = stageSteps[stageSteps.length - 1]
    const truncation = truncationOf(basis, startSeries, Math.min(earliest, end_s - start_s))
    const rates = Array.from(endSeries.rates_per_s)
    summaries.push({
      start_s,
      end_s: stage.duration_s === undefined ? null : start_s + stage.duration_s,
      modes: count,
      decayRates_per_s: rates,
      timeConstants_s: rates.map((r) => 1 / r),
      truncationError_K: truncation,
      biot: outerLaw ? (outerH * L) / kStart : null,
      ...(stage.inner.type === 'symmetry' ? {} : { innerBiot: innerLaw ? (innerH * L) / kStart : null }),
      method: TEMPERATURE_DEPENDENT_METHOD,
      estimatedError_K: stageError.largest + truncation,
      subSteps: stageSteps.length,
    })
    profile = (x) => valueAt(lastStep, Number.isFinite(lastStep.end_s) ? lastStep.end_s : lastStep.start_s, x)
    start_s = end_s
  })
  const firstEarliest = (Array.isArray(options.earliest_s) ? options.earliest_s[0] : options.earliest_s) ?? 0.01 * scaled.timeScale_s
  return new SubStepSolution(scaled, problem, initialAt, steps, summaries, firstEarliest)
}

/**
 * The stage's time-stepping error: the linearised propagation of each step's local
 * estimate, carried forward on the modes of the problem frozen at the stage's start
 * (every mode's share fading at its own rate, so an error near the surface, made of
 * fast modes, fades as fast as it does in the body), plus the error carried in from
 * earlier stages, fading at the slowest rate. The rates are scaled down when the
 * stage's slowest rate falls by its end (a body cooling in air loses radiation as it
 * cools), so the fading is never faster than the physics'. Returns the largest total
 * over the stage (the largest temperature the carried error makes at a node or face)
 * and the total at its end, in K.
 */
function carryErrors(
  basis: ModalBasis,
  startSeries: FrozenSeries,
  endSeries: FrozenSeries,
  errors: { step: number; vector: Float64Array }[],
  carriedIn_K: number,
): { largest: number; atEnd: number } {
  const slowestStart = slowestRate(startSeries)
  const slowdown = Math.min(1, slowestRate(endSeries) / slowestStart)
  const rates = Array.from(startSeries.rates_per_s, (r) => r * slowdown)
  const shapes = modeShapes(basis, startSeries)
  const carried = new Float64Array(basis.count)
  const field = new Float64Array(shapes.length / basis.count)
  let inherited = carriedIn_K
  let largest = carriedIn_K
  let total = carriedIn_K
  for (const { step, vector } of errors) {
    const amplitudes = modalAmplitudes(startSeries, vector)
    inherited *= Math.exp(-slowestStart * slowdown * step)
    field.fill(0)
    for (let j = 0; j < carried.length; j++) {
      carried[j] = carried[j] * Math.exp(-rates[j] * step) + amplitudes[j]
      const o = j * field.length
      for (let i = 0; i < field.length; i++) field[i] += carried[j] * shapes[o + i]
    }
    total = inherited
    for (let i = 0; i < field.length; i++) total = Math.max(total, inherited + Math.abs(field[i]))
    largest = Math.max(largest, total)
  }
  return { largest, atEnd: total }
}

/**
 * Rates of a sub-step's interpolant are multiples of this over the time its points
 * span: z = e^{−μτ} then stays within [e^{−½}, e^{½}] of the points, where a cubic in z
 * is nearly a cubic in time (a cubic in z over a wide z range bends away from the
 * near-linear cooling between the points), while the powers of z stay well apart
 * (the amplitudes cancel to ~1e-13 of the temperatures).
 */
const INTERPOLANT_SPAN = 0.5

/**
 * The stepped coefficients as sub-steps of exponentials: over each step [t_k, t_k+1]
 * the cubic through four neighbouring step ends (the step's own two and one on each
 * side where the stage has them), written as a cubic in z = e^{−μ(t − t_k)}, i.e.
 * steady + Σ_{n=1..3} a_n e^{−nμτ}: the form every point history has, so the floor
 * and the target search read it like any other series. Interpolating the step ends,
 * not the stages' slopes: at a stiff integrator's result the fast modes sit near,
 * not on, their slow manifold, and f(c) there carries that miss times the fast rates.
 */
function stepSeries(basis: ModalBasis, ends: { t: number; c: Float64Array }[]): SubStep[] {
  const n = basis.count
  const out: SubStep[] = []
  for (let k = 0; k + 1 < ends.length; k++) {
    const first = Math.max(0, Math.min(k - 1, ends.length - 4))
    const points = ends.slice(first, Math.min(ends.length, first + 4))
    const t0 = ends[k].t
    const rate = INTERPOLANT_SPAN / (points[points.length - 1].t - points[0].t)
    const z = points.map((p) => Math.exp(-rate * (p.t - t0)))
    const degree = points.length - 1
    const rates = Float64Array.from({ length: degree }, (_, j) => (j + 1) * rate)
    // The polynomial is linear in the values: the powers of each point's cardinal polynomial, once per step.
    const cardinals = points.map((_, k) => polynomialThrough(z, points.map((_, i) => (i === k ? 1 : 0))))
    const steady = new Float64Array(n)
    const modeVectors = new Float64Array(degree * n)
    points.forEach((point, k) => {
      const powers = cardinals[k]
      for (let a = 0; a < n; a++) {
        steady[a] += powers[0] * point.c[a]
        for (let j = 1; j <= degree; j++) modeVectors[(j - 1) * n + a] += powers[j] * point.c[a]
      }
    })
    out.push({ start_s: t0, end_s: ends[k + 1].t, basis, series: { rates_per_s: rates, steady, modeVectors } })
  }
  return out
}

/** Power coefficients p_0..p_d of the polynomial through (x_i, y_i): Newton's divided differences, expanded. */
function polynomialThrough(x: number[], y: number[]): number[] {
  const d = x.length - 1
  const diff = [...y]
  for (let level = 1; level <= d; level++)
    for (let i = d; i >= level; i--) diff[i] = (diff[i] - diff[i - 1]) / (x[i] - x[i - level])
  const p = new Array<number>(d + 1).fill(0)
  // Horner in Newton form: p ← p·(x − x_i) + diff_i from the highest.
  for (let i = d; i >= 0; i--) {
    for (let j = d; j >= 1; j--) p[j] = p[j - 1] - x[i] * p[j]
    p[0] = -x[i] * p[0] + diff[i]
  }
  return p
}

/**
 * The frozen problem at one field on a stage's basis (k and ρc node by node, each
 * face at its secant h_eff): the series of a stage's start (its truncation estimate
 * and slowest rate), end (the rates reported) and open end. Each solve starts from
 * the last one's eigenvectors.
 */
function freezer(
  problem: CooldownProblem,
  basis: ModalBasis,
  properties: NodeProperties,
  outerLaw: SurfaceLaw | null,
  innerLaw: SurfaceLaw | null,
  clamp: (T: number) => number,
): (c: Float64Array) => FrozenSeries {
  const q = basis.nodes.length
  const k = new Float64Array(q)
  const rhoCp = new Float64Array(q)
  let warmStart: Float64Array | undefined
  return (c) => {
    const field = fieldOf(basis, c)
    properties(field.nodes.map(clamp), k, rhoCp)
    const series = frozenSeries(
      basis,
      {
        length_m: problem.domain.length_m,
        k_W_mK: k,
        rhoCp_J_m3K: rhoCp,
        outerH_W_m2K: outerLaw ? outerLaw.effectiveH(clamp(field.outer)) : 0,
        outerAmbient_C: outerLaw ? outerLaw.ambient_C : 0,
        innerH_W_m2K: innerLaw ? innerLaw.effectiveH(clamp(field.inner)) : 0,
        innerAmbient_C: innerLaw ? innerLaw.ambient_C : 0,
      },
      c,
      warmStart,
    )
    warmStart = series.rotation
    return series
  }
}

/**
 * Basis size for the earliest reading τ_min (dimensionless): twice as many as a
 * constant-property series would keep (e^{−μ_N τ_min} < 1e-5 with μ_n ≈ (nπ)²), since
 * the coefficients near a suddenly changed surface are read from the truncated
 * series itself, plus the look-ahead modes that carry the truncation estimate. A
 * fixed face makes the start profile jump at the surface, so its mode amplitudes
 * fall only as 1/n (as 1/n² at a convective face) and the early field rings more:
 * three times as many there (the Kirchhoff closed form's rod and sphere at Fo ≈ 0.15
 * were 0.20 and 0.26 K off with twice as many, 0.07 and 0.10 K with three times).
 */
function modesFor(tauMin: number, fixedFace: boolean): number {
  return Math.ceil(((fixedFace ? 3 : 2) * Math.sqrt(11.5 / tauMin)) / Math.PI) + 4
}

/** The coldest and hottest temperatures in the data: start, surroundings and fixed faces. */
function temperatureBounds(problem: CooldownProblem): { min: number; max: number } {
  const initial = problem.initial
  const temps = typeof initial === 'number' ? [initial] : initial.map((p) => p.T_C)
  for (const stage of problem.stages)
    for (const b of [stage.outer, stage.inner]) {
      if (b.type === 'convective') temps.push(b.ambient_C)
      if (b.type === 'fixed') temps.push(b.T_C)
    }
  return { min: Math.min(...temps), max: Math.max(...temps) }
}

/** The frozen problem's slowest decay rate: how fast an error left in the field fades at least. */
function slowestRate(series: StepSeries): number {
  return Math.min(...series.rates_per_s)
}

/** Largest |T − T_ss| over the nodes and faces for coefficients c against steady coefficients. */
function transientSize(basis: ModalBasis, c: Float64Array, steady: Float64Array): number {
  return largestOver(basis, Float64Array.from(c, (v, j) => v - steady[j]))
}

/** The last mode's largest contribution at the earliest reading, on the series frozen at the stage's start: the truncation estimate. */
function truncationOf(basis: ModalBasis, series: FrozenSeries, earliest_s: number): number {
  const n = basis.count
  const q = basis.nodes.length
  const j = n - 1
  let peak = 0
  for (let i = 0; i < q; i++) {
    let s = 0
    for (let a = 0; a < n; a++) s += series.modeVectors[j * n + a] * basis.phi[a * q + i]
    peak = Math.max(peak, Math.abs(s))
  }
  return peak * Math.exp(-series.rates_per_s[j] * earliest_s)
}

function kAt(problem: CooldownProblem, T_C: number): number {
  const table = problem.domain.temperatureTable
  if (!table) return scaleDomain(problem.domain).kRef_W_mK
  return interpolate(table.map((r) => r.T_C), table.map((r) => r.k_W_mK), T_C)
}

/** L² ρc / k at a temperature: the body's conduction time scale there. */
function timeScaleAt(problem: CooldownProblem, T_C: number): number {
  const table = problem.domain.temperatureTable
  const scaled = scaleDomain(problem.domain)
  if (!table) return scaled.timeScale_s
  const rhoCp = interpolate(table.map((r) => r.T_C), table.map((r) => r.rhoCp_J_m3K), T_C)
  return (problem.domain.length_m ** 2 * rhoCp) / kAt(problem, T_C)
}

const basisCache = new WeakMap<ModalBasis, Map<number, Float64Array>>()

/** φ_j(x) of a basis, kept per basis (a curve reads the same few x at every sub-step). */
function cachedBasisValues(basis: ModalBasis, x: number): Float64Array {
  let perBasis = basisCache.get(basis)
  if (!perBasis) basisCache.set(basis, (perBasis = new Map()))
  let values = perBasis.get(x)
  if (!values) perBasis.set(x, (values = basisValues(basis, x)))
  return values
}

function valueAt(step: SubStep, t_s: number, x: number): number {
  const c = seriesCoefficients(step.series, t_s - step.start_s)
  const phi = cachedBasisValues(step.basis, x)
  let T = step.basis.lift0 + step.basis.liftSlope * x
  for (let j = 0; j < phi.length; j++) T += c[j] * phi[j]
  return T
}

/** Volume-mean weights of the basis, ∫x^m φ_j / ∫x^m, and of the lift. */
function meanWeights(basis: ModalBasis): { phi: Float64Array; lift: number } {
  const q = basis.nodes.length
  let total = 0
  let moment = 0
  for (let i = 0; i < q; i++) {
    total += basis.weights[i]
    moment += basis.weights[i] * basis.nodes[i]
  }
  const phi = new Float64Array(basis.count)
  for (let j = 0; j < basis.count; j++) {
    let s = 0
    for (let i = 0; i < q; i++) s += basis.weights[i] * basis.phi[j * q + i]
    phi[j] = s / total
  }
  return { phi, lift: basis.lift0 + (basis.liftSlope * moment) / total }
}

/**
 * The sub-steps as a CooldownSolution. Its `stages` are the sub-steps' series (time
 * scale 1 s, so rates are in 1/s; amplitude 1 with the amplitude in the shape); its
 * `mean` is the volume mean, the heat-content mean having no fixed weight when ρc
 * follows the temperature.
 */
class SubStepSolution implements CooldownSolution {
  readonly centreX: number
  private readonly points = new Map<string, PointStage[]>()
  private series: StageSeries[] | null = null

  constructor(
    readonly domain: ReturnType<typeof scaleDomain>,
    problem: CooldownProblem,
    readonly initialAt: (x: number) => number,
    private readonly steps: SubStep[],
    readonly summaries: StageSummary[],
    /** Earliest reading of the first stage, from which its series are accurate. */
    private readonly earliest_s: number,
  ) {
    this.centreX = problem.stages[0].inner.type === 'symmetry' ? 0 : 0.5
  }

  get stages(): StageSeries[] {
    return (this.series ??= this.steps.map((step): StageSeries => {
      const n = step.basis.count
      const steady = (x: number) => valueAtCoefficients(step.basis, step.series.steady, x)
      const modeVector = (j: number) => step.series.modeVectors.subarray(j * n, (j + 1) * n)
      const shapes = Array.from(step.series.rates_per_s, (_, j) => (x: number) => valueAtCoefficients(step.basis, modeVector(j), x, false))
      const rates = Array.from(step.series.rates_per_s)
      const weights = meanWeights(step.basis)
      return {
        start_s: step.start_s,
        end_s: step.end_s,
        timeScale_s: 1,
        steady,
        steadyMean_C: weights.lift + dot(weights.phi, step.series.steady),
        rates,
        amplitudes_K: rates.map(() => 1),
        shapes,
        modeMeans: rates.map((_, j) => dot(weights.phi, step.series.modeVectors.subarray(j * n, (j + 1) * n))),
        truncationError_K: 0,
        modes: rates.map((rate, j) => ({ rate, shape: shapes[j] })),
      }
    }))
  }

  evaluate(t_s: number, x: number): number {
    if (t_s <= 0) return this.initialAt(x)
    return valueAt(this.stepAt(t_s), t_s, x)
  }

  mean(t_s: number): number {
    if (t_s <= 0) {
      // The first sub-step's series is not converged at its start: average the start profile itself.
      const { nodes, weights } = this.steps[0].basis
      let s = 0
      let total = 0
      for (let i = 0; i < nodes.length; i++) {
        s += weights[i] * this.initialAt(nodes[i])
        total += weights[i]
      }
      return s / total
    }
    return pointValue(this.pointSeries('mean'), t_s)
  }

  pointSeries(at: PointRef): PointStage[] {
    const key = JSON.stringify(at)
    const hit = this.points.get(key)
    if (hit) return hit
    const result = this.steps.map((step): PointStage => {
      const n = step.basis.count
      let weights: Float64Array
      let lift: number
      if (at === 'mean') ({ phi: weights, lift } = meanWeights(step.basis))
      else {
        const x = at === 'centre' ? this.centreX : at === 'surface' ? 1 : at.x
        weights = cachedBasisValues(step.basis, x)
        lift = step.basis.lift0 + step.basis.liftSlope * x
      }
      const terms = Array.from(step.series.rates_per_s, (rate, j) => ({
        amplitude_K: dot(weights, step.series.modeVectors.subarray(j * n, (j + 1) * n)),
        decayRate_per_s: rate,
      }))
      return { start_s: step.start_s, ...(Number.isFinite(step.end_s) ? { end_s: step.end_s } : {}), steady_C: lift + dot(weights, step.series.steady), terms }
    })
    this.points.set(key, result)
    return result
  }

  /**
   * Before the earliest reading the first sub-steps' series still ring from the sudden
   * surface change and could cross a target falsely: the search holds the start value
   * until then and continues on the series re-based at that moment (exact: each term
   * is a e^{−μ(t − start)}), so a crossing earlier than the earliest reading is
   * reported there.
   */
  targetTime(at: PointRef, target: TargetSpec): number | null {
    const start = at === 'mean' ? this.mean(0) : this.initialAt(at === 'centre' ? this.centreX : at === 'surface' ? 1 : at.x)
    const from = this.earliest_s
    const later = this.pointSeries(at).filter((p) => (p.end_s ?? Infinity) > from)
    const [first, ...rest] = later
    const rebased: PointStage = {
      ...first,
      start_s: from,
      terms: first.terms.map(({ amplitude_K, decayRate_per_s }) => ({
        amplitude_K: amplitude_K * Math.exp(-decayRate_per_s * (from - first.start_s)),
        decayRate_per_s,
      })),
    }
    const held: PointStage[] = from > 0 ? [{ start_s: 0, end_s: from, steady_C: start, terms: [] }] : []
    return firstCrossing([...held, from > first.start_s ? rebased : first, ...rest], start, target)
  }

  private stepAt(t_s: number): SubStep {
    let lo = 0
    let hi = this.steps.length - 1
    while (lo < hi) {
      const mid = (lo + hi) >> 1
      if (t_s <= this.steps[mid].end_s) hi = mid
      else lo = mid + 1
    }
    return this.steps[lo]
  }
}

function dot(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let s = 0
  for (let j = 0; j < a.length; j++) s += a[j] * b[j]
  return s
}

function valueAtCoefficients(basis: ModalBasis, c: ArrayLike<number>, x: number, withLift = true): number {
  const phi = cachedBasisValues(basis, x)
  return (withLift ? basis.lift0 + basis.liftSlope * x : 0) + dot(phi, c)
}
