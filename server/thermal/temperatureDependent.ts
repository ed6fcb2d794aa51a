/**
 * Cooldowns with temperature-dependent physics — k(T), ρc(T) from a material table,
 * h(T_s) from a quenchant curve, radiation εσ(T_s⁴ − T∞⁴) — by eigenmode series
 * over frozen-coefficient sub-steps (the method named in the stage summaries).
 *
 * Within a sub-step [t, t + Δt] the properties are frozen (k and ρc node by node, so
 * the frozen body is graded; each face as one h_eff, surfaceCurve.ts), which makes
 * the problem linear: its Ritz modes (ritzModes.ts) give the exact series of the
 * frozen problem, the current profile is projected onto them, and the series
 * carries it to t + Δt. The frozen values are time means over the step along a
 * path of the field (its values at the start, at the two Gauss points and at the
 * end; propertyTable.ts pathMean): two-point Gauss where a node's path crosses no
 * table row, the exact mean of a path straight between those moments where it
 * crosses one, so a step across the cp peak or a kink of the h curve is averaged
 * rather than sampled on one side of it. Two passes: the first takes its path from
 * the previous sub-step's series carried on past its end (no solve; at a stage's
 * start, a series frozen at t), the second from the first pass's series, which is
 * kept. The passes' end fields differ by about the first pass's error, which
 * bounds the kept one's; the step is accepted when that is within STEP_TOLERANCE_K
 * (scaled by accuracy_K) and resized from it. Those differences, each fading after
 * its step at the frozen problem's slowest rate (a heat-conduction error decays at
 * least as the slowest mode does), summed and carried from stage to stage, give the
 * reported time-stepping error estimate: still a conservative one, since the kept
 * pass is closer than the first.
 *
 * Each sub-step is a PointStage of its own, so target times are bracketed and
 * polished by firstCrossing on the series of the sub-step where the crossing
 * occurs, and the floor can evaluate the history without the engine. The last,
 * open-ended stage ends in an open-ended sub-step once the body is within
 * OPEN_END_K of its steady state, where the coefficients no longer change.
 *
 * Cost (issue 12, the benchmark's oil-quenched steel bar, 14 basis functions on 64
 * quadrature nodes): ~390 sub-steps (was ~650 with midpoint freezing) of two frozen
 * solves each, a solve being the assembly of mass and stiffness from the node
 * coefficients (weighted sums of the basis's precomputed node products) with the
 * Cholesky products and amplitudes (~30 % of the time), a Jacobi eigen solve
 * warm-started from the last solve's eigenvectors (~25 %), and the paths and their
 * means (~15 %). The sub-step count still bounds it: within a step the series
 * follows coefficients frozen at their mean, so its error between the step's ends
 * stays second order in the step (a water-quenched rod whose centre crosses the
 * cp peak is what holds STEP_TOLERANCE_K at 0.02), and a smaller basis once the
 * fast modes have died lost 0.2 K on the ISO probe log when a boiling phase came
 * after the drop, so every sub-step of a stage keeps the stage's basis.
 *
 * solveCooldown sends only problems whose tables are not flat here; flat tables take
 * today's constant-property path unchanged. Checked against a refined finite-volume
 * solution (crankNicolsonNonlinear.ts) and the Kirchhoff closed form
 * (tests/unit/thermal/temperatureDependent.test.ts).
 */
import { pointValue, type PointStage } from '../../shared/pointSeries'
import { EngineLimitError } from './errors'
import { profileAt } from './solveCooldown'
import { GAUSS_POINTS, interpolate, materialCurves, pathMean } from './propertyTable'
import { propertiesAt, scaleDomain } from './properties'
import {
  basisValues,
  endTemperature,
  frozenSeries,
  modalBasis,
  nodeTemperatures,
  projectOnto,
  seriesCoefficients,
  type FaceKind,
  type FrozenSeries,
  type ModalBasis,
} from './ritzModes'
import type { StageSeries } from './series'
import { surfaceLaw, type SurfaceLaw } from './surfaceCurve'
import { firstCrossing, type TargetSpec } from './targetTime'
import type { Boundary, CooldownProblem, CooldownSolution, PointRef, SolveOptions, StageSummary } from './types'

/**
 * Accepted difference between the two passes per sub-step at the default accuracy,
 * tuned against converged Crank–Nicolson runs (300–400 cells): at 0.02 the
 * benchmark's oil-quenched steel bar (centre at 40 times) is 0.076 K off, the ISO
 * 9950 probe log of syntheticLogs.test.ts 0.023 K, and the water-quenched steel
 * rod of temperatureDependent.test.ts (its centre crossing the cp peak) 0.15 K; at
 * 0.04 the rod is 0.24 K off. The difference bounds the first pass's error; the
 * kept second pass, frozen along a better path, is closer.
 */
const STEP_TOLERANCE_K = 0.02
/** The default accuracy the step tolerance above is tuned for (0.2 K against a converged reference). */
const DEFAULT_ACCURACY_K = 0.2
/** Within this of the steady state the last sub-step is left open-ended. */
const OPEN_END_K = 0.5
const MAX_SUB_STEPS = 5000
/**
 * The fewest basis functions a stage keeps, whatever its earliest reading: enough to
 * follow a frozen field with a moving cp peak or boiling front. Every reference check
 * (the nine finite-volume cases, the Kirchhoff closed form, the ISO probe log, the
 * planner against Crank–Nicolson) passes with the count modesFor gives alone; the
 * benchmark bar and the demo plans' finite-difference checks move by under 0.001 K
 * from a floor of 16, which cost the bar half as much time again.
 */
const MIN_MODES = 8
const MAX_MODES = 60

export const TEMPERATURE_DEPENDENT_METHOD = 'eigenmode series, frozen-coefficient sub-steps'

/** One sub-step: a frozen series from start_s to end_s (Infinity when open-ended). */
interface SubStep {
  start_s: number
  end_s: number
  basis: ModalBasis
  series: FrozenSeries
}

/**
 * k and ρc at the basis nodes, frozen over a step: node i's time mean of the table
 * along its path through the step (pathMean), so a node crossing the cp peak within
 * the step is given the peak's average, not a one-sided sample.
 */
type NodeMaterial = (path: Path, k: Float64Array, rhoCp: Float64Array) => void

function nodeMaterial(problem: CooldownProblem, nodes: Float64Array): NodeMaterial {
  const table = problem.domain.temperatureTable
  if (table) {
    const curves = materialCurves(table)
    return ([a, g1, g2, b], k, rhoCp) => {
      for (let i = 0; i < a.nodes.length; i++) {
        const T0 = a.nodes[i]
        const Tg1 = g1.nodes[i]
        const Tg2 = g2.nodes[i]
        const T1 = b.nodes[i]
        k[i] = pathMean(curves.T_C, curves.k_W_mK, T0, Tg1, Tg2, T1)
        rhoCp[i] = pathMean(curves.T_C, curves.rhoCp_J_m3K, T0, Tg1, Tg2, T1)
      }
    }
  }
  const domain = scaleDomain(problem.domain)
  const k0 = Float64Array.from(nodes, (x) => propertiesAt(domain.pieces, x).k * domain.kRef_W_mK)
  const c0 = Float64Array.from(nodes, (x) => propertiesAt(domain.pieces, x).c * domain.rhoCpRef_J_m3K)
  return (_path, k, rhoCp) => {
    k.set(k0)
    rhoCp.set(c0)
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

/** A step's temperatures at its start, its two Gauss points and its end. */
type Path = [Field, Field, Field, Field]

/** The path of a step of `step` s from field `now`, read from a series that is `offset_s` into its run at the step's start. */
function pathAlong(basis: ModalBasis, now: Field, series: FrozenSeries, offset_s: number, step: number): Path {
  const at = (tau: number) => fieldOf(basis, seriesCoefficients(series, offset_s + tau * step))
  return [now, at(GAUSS_POINTS[0]), at(GAUSS_POINTS[1]), at(1)]
}

/** A path that stays at `now`: the coefficients frozen as they are. */
const standing = (now: Field): Path => [now, now, now, now]

const faceKind = (b: Boundary): FaceKind => (b.type === 'convective' ? 'convective' : b.type)
const lawOf = (b: Boundary): SurfaceLaw | null => (b.type === 'convective' ? surfaceLaw(b) : null)

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
  let start_s = 0
  let profile = initialAt
  // The time-stepping error carried along: each accepted step's estimate, decaying afterwards.
  let carried_K = 0
  problem.stages.forEach((stage, stageIndex) => {
    const last = stageIndex === problem.stages.length - 1
    const end_s = last ? Infinity : start_s + (stage.duration_s as number)
    const outerLaw = lawOf(stage.outer)
    const innerLaw = lawOf(stage.inner)
    // Basis Biot numbers from the stage's start; the frozen h_eff of later sub-steps enter naturally.
    const kStart = kAt(problem, profile(0.5))
    const outerH = outerLaw ? outerLaw.effectiveH(profile(1)) : 0
    const innerH = innerLaw ? innerLaw.effectiveH(profile(0)) : 0
    const earliest = (Array.isArray(options.earliest_s) ? options.earliest_s[stageIndex] : options.earliest_s) ?? 0.01 * scaled.timeScale_s
    const tauMin = Math.max(earliest, 1e-9 * scaled.timeScale_s) / timeScaleAt(problem, profile(0.5))
    const count = Math.min(MAX_MODES, Math.max(MIN_MODES, options.minModes ?? 1, modesFor(tauMin)))
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
    const frozenOver = freezer(problem, basis, outerLaw, innerLaw, bounds)
    let c = projectOnto(basis, profile)
    let t = start_s
    let dt = 1e-3 * timeScaleAt(problem, profile(0.5))
    let stageError_K = carried_K
    const firstStep = steps.length
    // Rejected steps add no sub-step, so the passes are capped too: twice the sub-steps allows a rejection per step.
    for (let passes = 0; ; passes++) {
      options.deadline?.check()
      if (steps.length - firstStep > MAX_SUB_STEPS || passes > 2 * MAX_SUB_STEPS)
        throw new EngineLimitError(`more than ${MAX_SUB_STEPS} sub-steps; shorten the stage or soften its coefficients`, `stages.${stageIndex}`)
      const now = fieldOf(basis, c)
      const previous = steps.length > firstStep ? steps[steps.length - 1] : null
      // The last sub-step's series froze the coefficients half a step ago; they barely move once near steady.
      if (last && previous && transientSize(basis, c, previous.series.steady) <= OPEN_END_K) {
        steps.push({ start_s: t, end_s: Infinity, basis, series: frozenOver(standing(now), c) })
        break
      }
      // Within 1.5 steps of the stage's end, go halfway rather than leave a sliver: a
      // rejected last step must shrink, or the same step would be tried forever.
      const landing = t + dt >= end_s * (1 - 1e-12)
      const step = landing ? end_s - t : end_s - t < 1.5 * dt ? (end_s - t) / 2 : dt
      // Predicted path: the last sub-step's series carried on (free), or at a stage's start a series frozen now.
      const predictor = previous ? previous.series : frozenOver(standing(now), c)
      const first = frozenOver(pathAlong(basis, now, predictor, previous ? t - previous.start_s : 0, step), c)
      const cFirst = seriesCoefficients(first, step)
      // The corrector re-freezes along the first pass's path: the coefficients' time mean to fourth order.
      const corrector = frozenOver(pathAlong(basis, now, first, 0, step), c)
      const cCorrected = seriesCoefficients(corrector, step)
      const error = largestDifference(basis, cCorrected, cFirst)
      // NaN would pass the tolerance test below and be kept as a step.
      if (!Number.isFinite(error)) throw new EngineLimitError('a sub-step met a non-finite value', `stages.${stageIndex}`)
      const resize = Math.min(2, Math.max(0.2, 0.9 * Math.cbrt(tolerance_K / Math.max(error, 1e-300))))
      if (error > tolerance_K) {
        dt = step * resize
        continue
      }
      const stepEnd = landing ? end_s : t + step
      steps.push({ start_s: t, end_s: stepEnd, basis, series: corrector })
      carried_K = carried_K * Math.exp(-slowestRate(corrector) * step) + error
      stageError_K = Math.max(stageError_K, carried_K)
      c = cCorrected
      t = stepEnd
      dt = step * resize
      if (landing) break
    }
    const stageSteps = steps.slice(firstStep)
    const lastStep = stageSteps[stageSteps.length - 1]
    const truncation = truncationOf(stageSteps[0], earliest)
    const rates = Array.from(lastStep.series.rates_per_s)
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
      estimatedError_K: stageError_K + truncation,
      subSteps: stageSteps.length,
    })
    profile = (x) => valueAt(lastStep, lastStep.end_s, x)
    start_s = end_s
  })
  const firstEarliest = (Array.isArray(options.earliest_s) ? options.earliest_s[0] : options.earliest_s) ?? 0.01 * scaled.timeScale_s
  return new SubStepSolution(scaled, problem, initialAt, steps, summaries, firstEarliest)
}

/**
 * The k and ρc-frozen series of a stage on one basis (the node arrays sized for it).
 * Every frozen problem on a basis is close to the one before: its eigenvectors
 * start the next eigen solve.
 */
function freezer(
  problem: CooldownProblem,
  basis: ModalBasis,
  outerLaw: SurfaceLaw | null,
  innerLaw: SurfaceLaw | null,
  bounds: { min: number; max: number },
): (path: Path, c0: Float64Array) => FrozenSeries {
  const material = nodeMaterial(problem, basis.nodes)
  const q = basis.nodes.length
  const k = new Float64Array(q)
  const rhoCp = new Float64Array(q)
  // Maximum principle: the body stays between its coldest and hottest data, so a truncated
  // series' overshoot (early on, next to a sudden surface change) must not pick coefficients.
  const clamp = (T: number) => Math.min(bounds.max, Math.max(bounds.min, T))
  // The clamped path, refilled by every solve.
  const path = Array.from({ length: 4 }, (): Field => ({ nodes: new Float64Array(q), inner: 0, outer: 0 })) as Path
  const hOver = (law: SurfaceLaw | null, face: 'inner' | 'outer', [a, g1, g2, b]: Path) => (law ? law.pathEffectiveH(a[face], g1[face], g2[face], b[face]) : 0)
  let warmStart: Float64Array | undefined
  return (raw, c0) => {
    raw.forEach((field, p) => {
      for (let i = 0; i < q; i++) path[p].nodes[i] = clamp(field.nodes[i])
      path[p].inner = clamp(field.inner)
      path[p].outer = clamp(field.outer)
    })
    material(path, k, rhoCp)
    const series = frozenSeries(
      basis,
      {
        length_m: problem.domain.length_m,
        k_W_mK: k,
        rhoCp_J_m3K: rhoCp,
        outerH_W_m2K: hOver(outerLaw, 'outer', path),
        outerAmbient_C: outerLaw ? outerLaw.ambient_C : 0,
        innerH_W_m2K: hOver(innerLaw, 'inner', path),
        innerAmbient_C: innerLaw ? innerLaw.ambient_C : 0,
      },
      c0,
      warmStart,
    )
    warmStart = series.rotation
    return series
  }
}

/**
 * Basis size for the earliest reading τ_min (dimensionless): twice as many as a
 * constant-property series would keep (e^{−μ_N τ_min} < 1e-5 with μ_n ≈ (nπ)²), since
 * the frozen field near a suddenly changed surface is itself read from the truncated
 * series, plus the look-ahead modes that carry the truncation estimate.
 */
function modesFor(tauMin: number): number {
  return Math.ceil((2 * Math.sqrt(11.5 / tauMin)) / Math.PI) + 4
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
function slowestRate(series: FrozenSeries): number {
  return Math.min(...series.rates_per_s)
}

/** Largest difference over the nodes and faces between two coefficient vectors' temperatures. */
function largestDifference(basis: ModalBasis, a: Float64Array, b: Float64Array): number {
  return transientSize(basis, a, b)
}

/** Largest |T − T_ss| over the nodes and faces for coefficients c against steady coefficients. */
function transientSize(basis: ModalBasis, c: Float64Array, steady: Float64Array): number {
  const d = Float64Array.from(c, (v, j) => v - steady[j])
  let size = 0
  const q = basis.nodes.length
  for (let i = 0; i < q; i++) {
    let s = 0
    for (let j = 0; j < basis.count; j++) s += d[j] * basis.phi[j * q + i]
    size = Math.max(size, Math.abs(s))
  }
  let s0 = 0
  let s1 = 0
  for (let j = 0; j < basis.count; j++) {
    s0 += d[j] * basis.end0[j]
    s1 += d[j] * basis.end1[j]
  }
  return Math.max(size, Math.abs(s0), Math.abs(s1))
}

/** The last mode's largest contribution at the earliest reading: the series' truncation estimate. */
function truncationOf(step: SubStep, earliest_s: number): number {
  const { basis, series } = step
  const n = basis.count
  const q = basis.nodes.length
  const j = n - 1
  let peak = 0
  for (let i = 0; i < q; i++) {
    let s = 0
    for (let a = 0; a < n; a++) s += series.modeVectors[j * n + a] * basis.phi[a * q + i]
    peak = Math.max(peak, Math.abs(s))
  }
  return peak * Math.exp(-series.rates_per_s[j] * Math.min(earliest_s, step.end_s - step.start_s))
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
      const shapes = Array.from({ length: n }, (_, j) => (x: number) => valueAtCoefficients(step.basis, modeVector(j), x, false))
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
