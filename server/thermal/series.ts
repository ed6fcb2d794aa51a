/**
 * Eigenfunction series of one stage:
 *     T(x, τ) = T_ss(x) + Σ a_n f_n(x) e^{−μ_n τ},
 *     a_n = ∫ w (T_start − T_ss) f_n dx / ∫ w f_n² dx,   w = ρc x^m,
 * the modes being orthogonal in that weight (Sturm–Liouville). Coefficients come,
 * first that applies: for a uniform symmetric body in closed form, C_n (T₀ − T∞) from
 * a uniform start (Incropera et al., §5.5–5.6) and Green's identity from the previous
 * stage's modes (closedFormProjection); for any body with a symmetric centre from the
 * start-independent mode integrals of modeIntegrals.ts (cachedIntegralProjection);
 * otherwise by composite Gauss–Legendre quadrature of the start profile.
 *
 * The number of modes is chosen for the earliest time the stage is evaluated at:
 * terms |a_n| max|f_n| e^{−μ_n τ_min} are summed beyond a cut until at least three
 * terms past it have been computed; the cut is the first whose tail is < 0.01 K
 * (or the caller's looser truncationTolerance_K),
 * and that tail is reported (μ_n grows like n², so the computed next terms bound
 * the rest).
 */
import type { Deadline } from './deadline'
import { EngineLimitError } from './errors'
import type { Mode, ModeFamily } from './modeFamily'
import { maxCapacityRatio, weightedRule, type ScaledDomain } from './properties'
import { heatCapacity, modeIntegrals, modeOverlap } from './modeIntegrals'
import { uniformAmplitude, uniformMass, type SurfaceValues } from './eigenRoots'

export const TRUNCATION_TOLERANCE_K = 0.01

export interface StageSeries {
  start_s: number
  /** Infinity for an open-ended last stage. */
  end_s: number
  timeScale_s: number
  steady: (x: number) => number
  steadyMean_C: number
  /** Dimensionless decay rates of the modes used. */
  rates: number[]
  amplitudes_K: number[]
  shapes: ((x: number) => number)[]
  /** ∫ w f_n / ∫ w: each mode's contribution to the heat-content mean. */
  modeMeans: number[]
  truncationError_K: number
  /** The modes used (rates and shapes above are theirs), for projecting the next stage. */
  modes: Mode[]
}

/** A start given as a previous stage's modes over its uniform steady state: T = steady_C + Σ amplitude_K f_j. */
export interface ModalStart {
  steady_C: number
  terms: { amplitude_K: number; mode: Mode }[]
}

export interface SeriesInput {
  domain: ScaledDomain
  family: ModeFamily
  steady: (x: number) => number
  /** Temperature at the stage start: a function of x, or a uniform value. */
  start: number | ((x: number) => number)
  /** The same start as modes, when the previous stage has a symmetric centre (a uniform steady state). */
  startModes?: ModalStart
  /** Extra quadrature breakpoints (kinks of an initial profile). */
  breakpoints: number[]
  /** True when T_ss is uniform and the centre symmetric (closed-form C_n apply). */
  symmetricUniformSteady: boolean
  earliest_s: number
  minModes: number
  maxModes: number
  /** Tail allowed at the earliest time (TRUNCATION_TOLERANCE_K unless a looser accuracy was asked for). */
  truncationTolerance_K?: number
  start_s: number
  end_s: number
  /** Checked between rounds and modes; absent, the series takes the time it needs. */
  deadline?: Deadline
}

/** Terms computed past the guess: the three truncate() needs to bound the tail. */
const LOOKAHEAD = 3

/** Without a caller's earliest_s, a stage's series is accurate from this Fourier number on. */
const DEFAULT_EARLIEST_FO = 0.01

/** Earliest time after stage i's start its series must be accurate at: the caller's (one value or one per stage), else DEFAULT_EARLIEST_FO. */
export function stageEarliest_s(earliest_s: number | number[] | undefined, i: number, timeScale_s: number): number {
  return (Array.isArray(earliest_s) ? earliest_s[i] : earliest_s) ?? DEFAULT_EARLIEST_FO * timeScale_s
}

/** Tail allowed at the earliest time: 0.01 K, or 80 % of a caller's accuracy_K. */
export function truncationTolerance(accuracy_K: number | undefined): number {
  return accuracy_K === undefined ? TRUNCATION_TOLERANCE_K : 0.8 * accuracy_K
}

/**
 * Rounds of doubling the mode count: from one mode the cap (≤ 400) is reached in nine,
 * so more means the count stopped growing, and the search is refused rather than repeated.
 */
export const MODE_ROUNDS = 16

/**
 * First guess at the mode count: the first mode with e^{−μ τ_min} < 1e-4, with μ_n ≈ (nπ)².
 * A NaN τ_min (a time scale that under- or overflowed) would make every later count NaN
 * and the doubling endless, so it is refused here.
 */
export function firstModeGuess(tauMin: number, minModes: number, maxModes: number): number {
  if (!(tauMin >= 0)) throw new EngineLimitError(`the earliest time to resolve is not a number (τ = ${tauMin}); the case's time scale is out of range`)
  const n = Math.ceil(Math.sqrt(9.2 / Math.max(tauMin, 1e-12)) / Math.PI)
  return Math.min(Math.max(n, minModes), maxModes)
}

/** Modes to compute for a guess n: a few past it, so the tail beyond the cut is bounded by computed terms. */
export function modesToCompute(n: number, maxModes: number): number {
  return Math.min(n + LOOKAHEAD, maxModes)
}

/**
 * Where to cut the first `computed` terms (each |a_n| max|f_n| e^{−μ_n τ_min}) and the
 * tail left out, or null when fewer than three computed terms lie past the cut and
 * more modes are needed (double the guess and compute again).
 */
export function truncate(
  terms: ArrayLike<number>,
  computed: number,
  minModes: number,
  maxModes: number,
  tolerance_K: number,
): { cut: number; truncationError_K: number } | null {
  let cut = computed
  let tail = 0
  while (cut > minModes && tail + terms[cut - 1] < tolerance_K) {
    tail += terms[cut - 1]
    cut--
  }
  if (computed - cut >= 3) return { cut, truncationError_K: tail }
  // At the mode cap with too few terms past the cut, the last computed term stands in for the tail.
  if (computed >= maxModes) return { cut, truncationError_K: tail + terms[computed - 1] }
  return null
}

export function buildStageSeries(input: SeriesInput): StageSeries {
  const { domain, family } = input
  const tauMin = Math.max(input.earliest_s, 0) / domain.timeScale_s
  let n = firstModeGuess(tauMin, input.minModes, input.maxModes)
  for (let round = 0; round < MODE_ROUNDS; round++) {
    input.deadline?.check()
    const computed = modesToCompute(n, input.maxModes)
    const modes: Mode[] = []
    for (let j = 1; j <= computed; j++) modes.push(family.mode(j, input.deadline))
    const { amplitudes, means, terms, steadyMean } =
      closedFormProjection(input, modes, tauMin) ?? cachedIntegralProjection(input, modes, tauMin) ?? quadratureProjection(input, modes, tauMin)
    const kept = truncate(terms, computed, input.minModes, input.maxModes, input.truncationTolerance_K ?? TRUNCATION_TOLERANCE_K)
    if (kept) {
      const { cut } = kept
      return {
        start_s: input.start_s,
        end_s: input.end_s,
        timeScale_s: domain.timeScale_s,
        steady: input.steady,
        steadyMean_C: steadyMean,
        rates: modes.slice(0, cut).map((m) => m.rate),
        amplitudes_K: amplitudes.slice(0, cut),
        shapes: modes.slice(0, cut).map((m) => m.shape),
        modeMeans: means.slice(0, cut),
        truncationError_K: kept.truncationError_K,
        modes: modes.slice(0, cut),
      }
    }
    n = Math.min(2 * n, input.maxModes)
  }
  throw new EngineLimitError(`the mode count did not settle in ${MODE_ROUNDS} rounds`)
}

interface Projection {
  amplitudes: number[]
  /** ∫ w f_n / ∫ w per mode. */
  means: number[]
  /** Bound |a_n| max|f_n| e^{−μ_n τ_min} of each term at the earliest time. */
  terms: number[]
  steadyMean: number
}

/**
 * Symmetric uniform modes from a uniform start (the closed forms C_n) or from the
 * previous stage's modes (Green's identity), with no quadrature: uniformAmplitude
 * in eigenRoots.ts, as the fast path uses it.
 * |f_n| ≤ f_n(0) = 1 for cos, J0 and sin(λx)/(λx). Null when they do not apply.
 */
function closedFormProjection(input: SeriesInput, modes: Mode[], tauMin: number): Projection | null {
  if (!input.symmetricUniformSteady || !modes.every((mode) => mode.surface)) return null
  if (typeof input.start !== 'number' && !input.startModes?.terms.every((term) => term.mode.surface)) return null
  const m = input.domain.m
  const steady = input.steady(0)
  const start = typeof input.start === 'number' ? { steady_C: input.start, terms: [] } : (input.startModes as ModalStart)
  const startTerms = start.terms.map((term) => ({ amplitude_K: term.amplitude_K, surface: term.mode.surface as SurfaceValues }))
  const amplitudes: number[] = []
  const means: number[] = []
  const terms: number[] = []
  for (const mode of modes) {
    const surface = mode.surface as SurfaceValues
    const a = uniformAmplitude(m, start.steady_C - steady, startTerms, surface)
    amplitudes.push(a)
    means.push((m + 1) * uniformMass(surface))
    terms.push(Math.abs(a) * Math.exp(-mode.rate * tauMin))
  }
  return { amplitudes, means, terms, steadyMean: steady }
}

/**
 * Any modes over a uniform steady state (a symmetric centre), from a uniform start or
 * from a previous stage's modes, through the start-independent integrals of
 * modeIntegrals.ts (kept with the modes, so a re-solve of the same families reuses them):
 *     a_n = ((T_start − T_ss) ∫w f_n + Σ_j A_j ∫w g_j f_n) / ∫w f_n².
 * Null when the start is a profile table or the steady state is not uniform.
 */
function cachedIntegralProjection(input: SeriesInput, modes: Mode[], tauMin: number): Projection | null {
  if (!input.symmetricUniformSteady) return null
  if (typeof input.start !== 'number' && !input.startModes) return null
  const { domain } = input
  const steady = input.steady(0)
  const capacity = heatCapacity(domain)
  const startSteady = typeof input.start === 'number' ? input.start : (input.startModes as ModalStart).steady_C
  const amplitudes: number[] = []
  const means: number[] = []
  const terms: number[] = []
  for (const mode of modes) {
    input.deadline?.check()
    const { mass, norm, peak } = modeIntegrals(domain, mode)
    let projection = (startSteady - steady) * mass
    if (typeof input.start !== 'number') for (const term of (input.startModes as ModalStart).terms) projection += term.amplitude_K * modeOverlap(domain, term.mode, mode)
    const a = projection / norm
    amplitudes.push(a)
    means.push(mass / capacity)
    terms.push(Math.abs(a) * peak * Math.exp(-mode.rate * tauMin))
  }
  return { amplitudes, means, terms, steadyMean: steady }
}

/** Composite Gauss–Legendre projection of the start onto any modes, resolving the fastest one. */
function quadratureProjection(input: SeriesInput, modes: Mode[], tauMin: number): Projection {
  const { domain } = input
  const startAt = typeof input.start === 'number' ? () => input.start as number : input.start
  const lamMax = Math.sqrt(modes[modes.length - 1].rate * maxCapacityRatio(domain.pieces))
  const rule = weightedRule(domain, Math.min(1 / 16, 1.5 / lamMax), input.breakpoints)
  const nodes = rule.x.length
  const excess = new Float64Array(nodes)
  let totalWeight = 0
  let steadyMean = 0
  for (let i = 0; i < nodes; i++) {
    const steady = input.steady(rule.x[i])
    excess[i] = startAt(rule.x[i]) - steady
    totalWeight += rule.w[i]
    steadyMean += rule.w[i] * steady
  }
  const amplitudes: number[] = []
  const means: number[] = []
  const terms: number[] = []
  for (const mode of modes) {
    input.deadline?.check()
    const shape = mode.shape
    let norm = 0
    let projection = 0
    let mean = 0
    let peak = Math.abs(shape(1))
    for (let i = 0; i < nodes; i++) {
      const f = shape(rule.x[i])
      const wf = rule.w[i] * f
      norm += wf * f
      projection += wf * excess[i]
      mean += wf
      peak = Math.max(peak, Math.abs(f))
    }
    const a = projection / norm
    amplitudes.push(a)
    means.push(mean / totalWeight)
    terms.push(Math.abs(a) * peak * Math.exp(-mode.rate * tauMin))
  }
  return { amplitudes, means, terms, steadyMean: steadyMean / totalWeight }
}

/** Temperature of a stage series at time τ after the stage start. */
export function seriesValue(series: StageSeries, tau_s: number, x: number): number {
  const tau = tau_s / series.timeScale_s
  let T = series.steady(x)
  for (let j = 0; j < series.rates.length; j++) T += series.amplitudes_K[j] * series.shapes[j](x) * Math.exp(-series.rates[j] * tau)
  return T
}
