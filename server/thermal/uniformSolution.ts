/**
 * Fast path of solveCooldown for the commonest case: a uniform body with a
 * symmetric centre (slab mid-plane, rod, sphere) from a uniform start, through any
 * number of stages with a convective or fixed surface.
 *
 * It computes what the general path computes for such a body — the roots of the
 * same functions in the same brackets as eigenRoots.ts, the closed-form
 * coefficients of series.ts (∫x^m f / ∫x^m f², i.e. C_n, from the uniform start,
 * Green's identity from the previous stage's modes after that), the same
 * truncation rule and so the same modes — but keeps each mode as its root and
 * surface values instead of a Mode object with a shape closure, and makes the StageSeries,
 * summaries and point series only when they are read. For these
 * bodies the arithmetic is a few dozen trigonometric or Bessel calls, so the
 * general path's per-call set-up, closures and per-mode objects were most of the
 * time; a planner re-solves on every edit. tests/unit/thermal/uniformSolution.test.ts
 * holds it to the general path to 1e-9 K.
 *
 * The solution is a class: its methods live on the prototype (no closures per
 * solve), so they must be called on the solution (`solution.evaluate(t, x)`), as
 * every caller does.
 */
import { pointValue, type PointStage } from '../../shared/pointSeries'
import { besselJ0, besselJ0Zero, besselJ1, besselJ1Zero } from './bessel'
import { surfaceValues, uniformAmplitude, uniformMass, uniformShape, type SurfaceValues, type UniformTerm } from './eigenRoots'
import type { ScaledDomain } from './properties'
import type { Deadline } from './deadline'
import { EngineLimitError } from './errors'
import { MODE_ROUNDS, firstModeGuess, modesToCompute, stageEarliest_s, truncate, truncationTolerance, type StageSeries } from './series'
import { firstCrossing, type TargetSpec } from './targetTime'
import type { CooldownProblem, CooldownSolution, Geometry, PointRef, SolveOptions, StageSummary } from './types'

/**
 * The fast solution, or null when the problem is not a uniform symmetric body from
 * a uniform start with 0 < Bi ≤ ∞ in every stage (the general path then solves it).
 * options.accuracy_K must already have been checked.
 */
export function solveUniformSymmetric(problem: CooldownProblem, domain: ScaledDomain, options: SolveOptions, maxModes: number): CooldownSolution | null {
  const initial = problem.initial
  if (typeof initial !== 'number' || !domain.uniform) return null
  const stages = problem.stages
  const biots: number[] = []
  for (let i = 0; i < stages.length; i++) {
    const { inner, outer } = stages[i]
    if (inner.type !== 'symmetry') return null
    const biot = outer.type === 'fixed' ? Infinity : (outer.h_W_m2K * domain.length_m) / domain.kRef_W_mK
    if (!(biot > 0)) return null
    biots.push(biot)
  }

  const geometry = problem.domain.geometry
  const m = domain.m
  const timeScale_s = domain.timeScale_s
  const tolerance_K = truncationTolerance(options.accuracy_K)
  const minModes = options.minModes ?? 1
  const modes: UniformStage[] = []
  let start_s = 0
  for (let i = 0; i < stages.length; i++) {
    const stage = stages[i]
    const outer = stage.outer
    const last = i === stages.length - 1
    const end_s = last ? Infinity : start_s + (stage.duration_s as number)
    const earliest = stageEarliest_s(options.earliest_s, i, timeScale_s)
    const steady_C = outer.type === 'fixed' ? outer.T_C : outer.ambient_C
    const summaryEnd_s = stage.duration_s === undefined ? null : start_s + stage.duration_s
    const tauMin = Math.max(earliest, 0) / timeScale_s
    const previous = modes[i - 1]
    const built = new UniformStage(start_s, end_s, summaryEnd_s, steady_C, biots[i])
    built.fit(m, previous ?? initial, timeScale_s, tauMin, minModes, maxModes, tolerance_K, options.deadline)
    modes.push(built)
    start_s = end_s
  }
  return new UniformSolution(domain, geometry, initial, modes)
}

/**
 * One stage's modes (roots with surface values), amplitudes and tails as parallel arrays, index j for the (j + 1)-th mode: plain
 * arrays, because a handful of modes is typical and allocating a typed array per
 * field cost more than everything else in a solve.
 */
class UniformStage {
  readonly start_s: number
  /** Infinity for the last stage. */
  readonly end_s: number
  /** The stage's own end for its summary: null for an open-ended last stage. */
  readonly summaryEnd_s: number | null
  readonly steady_C: number
  readonly biot: number
  /** Modes kept; the arrays also hold the few computed past the cut. */
  count = 0
  /** Roots λ with f(1), f′(1) for the closed-form integrals; the dimensionless decay rates are λ². */
  readonly surfaces: SurfaceValues[] = []
  readonly amp: number[] = []
  /** Σ_{k ≥ j} |a_k| over the kept modes: with |f| ≤ 1 and rates rising, e^{−μ_j τ} times it bounds what is left of a sum. */
  readonly ampTail: number[] = []
  truncationError_K = 0

  constructor(start_s: number, end_s: number, summaryEnd_s: number | null, steady_C: number, biot: number) {
    this.start_s = start_s
    this.end_s = end_s
    this.summaryEnd_s = summaryEnd_s
    this.steady_C = steady_C
    this.biot = biot
  }

  /**
   * Modes and amplitudes from a uniform start temperature or from the previous
   * stage's modes, as many as series.ts would keep (same guess, same doubling, same cut).
   */
  fit(
    m: 0 | 1 | 2,
    start: number | UniformStage,
    timeScale_s: number,
    tauMin: number,
    minModes: number,
    maxModes: number,
    tolerance_K: number,
    deadline?: Deadline,
  ): void {
    // The previous stage's amplitudes at its end (series.ts, modalEnd).
    // Amplitudes below rounding of the largest are dropped: |∫x^m g f| ≤ 1, so their
    // share of any projection is too, and after a long stage most of them are.
    const carried: UniformTerm[] = []
    if (typeof start !== 'number') {
      const tau = (start.end_s - start.start_s) / timeScale_s
      let largest = 0
      for (let j = 0; j < start.count; j++) {
        const surface = start.surfaces[j]
        const amplitude_K = start.amp[j] * Math.exp(-surface.lam * surface.lam * tau)
        carried.push({ amplitude_K, surface })
        largest = Math.max(largest, Math.abs(amplitude_K))
      }
      while (carried.length > 1 && Math.abs(carried[carried.length - 1].amplitude_K) < 1e-17 * largest) carried.pop()
    }
    const startExcess_K = (typeof start === 'number' ? start : start.steady_C) - this.steady_C
    // The truncation terms |a_n| e^{−μ_n τ_min}.
    const terms: number[] = []
    let computedSoFar = 0
    let n = firstModeGuess(tauMin, minModes, maxModes)
    for (let round = 0; round < MODE_ROUNDS; round++) {
      deadline?.check()
      const computed = modesToCompute(n, maxModes)
      for (let j = computedSoFar; j < computed; j++) {
        const surface = symmetricRootFrom(m, j + 1, this.biot, j === 0 ? Number.NaN : this.surfaces[j - 1].lam)
        const lam = surface.lam
        const a = uniformAmplitude(m, startExcess_K, carried, surface)
        this.surfaces.push(surface)
        this.amp.push(a)
        // |f| ≤ f(0) = 1 for cos, J0 and sin(λx)/(λx).
        terms.push(Math.abs(a) * Math.exp(-lam * lam * tauMin))
      }
      computedSoFar = computed
      const kept = truncate(terms, computed, minModes, maxModes, tolerance_K)
      if (kept) {
        this.count = kept.cut
        this.truncationError_K = kept.truncationError_K
        let tail = 0
        for (let j = kept.cut - 1; j >= 0; j--) this.ampTail[j] = tail += Math.abs(this.amp[j])
        return
      }
      n = Math.min(2 * n, maxModes)
    }
    throw new EngineLimitError(`the mode count did not settle in ${MODE_ROUNDS} rounds`)
  }
}

/** f(x) of a symmetric uniform mode: cos λx, J0(λx), sin(λx)/(λx); 1 at the centre. */
function shapeAt(m: 0 | 1 | 2, lam: number, x: number): number {
  if (x === 0) return 1
  if (m === 0) return Math.cos(lam * x)
  if (m === 1) return besselJ0(lam * x)
  return Math.sin(lam * x) / (lam * x)
}

/**
 * n-th root for a symmetric centre and surface Biot number 0 < bi ≤ ∞: the function
 * and bracket of slabRoot, rodRoot and sphereRoot (eigenRoots.ts), solved by
 * Halley's method (Newton corrected for the curvature, which costs nothing here:
 * the second derivative comes from the same J0, J1 or sin, cos) kept inside the
 * shrinking bracket, bisecting whenever a step would leave it or fails to halve the
 * one before (as rtsafe in Press et al., Numerical Recipes, 3rd ed., §9.4), so it
 * can neither miss the bracket's one root nor stall. Starts: for n ≥ 2 one step of
 * the equation's phase form from previous + π, which lies past the root; for n = 1
 * a blend of the small-Bi limit λ² ≈ (m + 1) Bi and the Bi → ∞ root U,
 * λ² ≈ (m + 1) Bi U² / ((m + 1) Bi + U²). Two or three evaluations per root.
 * Returns the root with f(1) and f′(1), which fall out of its last evaluation.
 */
function symmetricRootFrom(m: 0 | 1 | 2, n: number, bi: number, previous: number): SurfaceValues {
  if (bi === Infinity) return surfaceValues(GEOMETRY_OF[m], m === 0 ? (n - 0.5) * Math.PI : m === 1 ? besselJ0Zero(n) : n * Math.PI)
  const offset = (n - 1) * Math.PI
  let lo = m === 1 ? (n === 1 ? 0 : besselJ1Zero(n - 1)) : offset
  let hi = m === 1 ? besselJ0Zero(n) : n * Math.PI
  // Orient the function so that it is negative at lo and positive at hi.
  const sign = m === 0 ? 1 : m === 1 ? (n % 2 === 1 ? 1 : -1) : n % 2 === 1 ? -1 : 1
  let x: number
  if (n === 1) {
    const limit = m === 0 ? 0.5 * Math.PI : m === 1 ? hi : Math.PI
    const small = (m + 1) * bi
    x = Math.sqrt((small * limit * limit) / (small + limit * limit))
  } else {
    // λ = offset + phase(λ): exact for the slab (atan(Bi/λ)) and the sphere (tan λ = λ/(1 − Bi)),
    // for the rod from J0, J1 ~ cos, sin(λ − π/4) at large λ.
    const above = previous + Math.PI
    x =
      m === 0
        ? offset + Math.atan(bi / above)
        : m === 1
          ? lo + (hi - lo) * (2 / Math.PI) * Math.atan(bi / above)
          : offset + Math.atan2(above, 1 - bi)
  }
  if (!(x > lo && x < hi)) x = 0.5 * (lo + hi)
  let step = hi - lo
  for (let iteration = 0; iteration < 100; iteration++) {
    let g: number
    let dg: number
    let d2g: number
    // Values at x kept for f(1), f′(1): J0, J1 for the rod, sin, cos, sin(x)/x and its slope for the sphere.
    let a = 0
    let b = 0
    let c = 0
    let e = 0
    if (m === 0) {
      const q = x * x + bi * bi
      g = x - Math.atan2(bi, x) - offset
      dg = 1 + bi / q
      d2g = (-2 * bi * x) / (q * q)
    } else if (m === 1) {
      a = besselJ0(x)
      b = besselJ1(x)
      g = sign * (x * b - bi * a)
      dg = sign * (x * a + bi * b)
      d2g = sign * (a - x * b + bi * (a - b / x))
    } else {
      a = Math.sin(x)
      b = Math.cos(x)
      c = a / x
      e = (b - c) / x
      g = sign * (b + (bi - 1) * c)
      dg = sign * (-a + (bi - 1) * e)
      d2g = sign * (-b + (bi - 1) * (-c - (2 * e) / x))
    }
    const newton = g / dg
    const halley = 1 - (0.5 * newton * d2g) / dg
    const cubic = halley > 0.5
    const d = cubic ? newton / halley : newton
    // A Halley step triples the digits: after one of 1e-7 relative the root x − d is exact
    // to rounding, and f(1), f′(1) there follow from the values at x to second order in d
    // (the neglected d³ is below rounding too). That saves the rod a pair of J0, J1 calls.
    if (Math.abs(d) <= (cubic ? 1e-7 : 1e-13) * x) {
      const lam = x - d
      const h = 0.5 * d * d
      if (m === 0) {
        // At the root tan(λ − (n − 1)π) = Bi/λ, so cos λ and sin λ are (−1)^(n−1) (λ, Bi)/√(λ² + Bi²).
        const r = (n % 2 === 1 ? 1 : -1) / Math.sqrt(lam * lam + bi * bi)
        return { lam, f1: lam * r, df1: -lam * bi * r }
      }
      if (m === 1) {
        return { lam, f1: a + b * d + (-a + b / x) * h, df1: -lam * (b - (a - b / x) * d + (-b - a / x + (2 * b) / (x * x)) * h) }
      }
      const f1 = c - e * d + (-c - (2 * e) / x) * h
      return { lam, f1, df1: b + a * d - b * h - f1 }
    }
    if (g < 0) lo = x
    else hi = x
    const next = x - d
    if (!(next > lo && next < hi) || Math.abs(2 * d) > Math.abs(step)) {
      step = 0.5 * (hi - lo)
      x = lo + step
      if (step <= 1e-14 * x) return surfaceValues(GEOMETRY_OF[m], x)
    } else {
      step = -d
      x = next
    }
  }
  throw new EngineLimitError(`uniform root ${n} (m = ${m}, Bi = ${bi}) did not converge in 100 iterations`)
}

/** The geometry whose radial weight is x^m. */
const GEOMETRY_OF: Record<0 | 1 | 2, Geometry> = { 0: 'slab', 1: 'rod', 2: 'sphere' }

class UniformSolution implements CooldownSolution {
  readonly centreX = 0
  readonly domain: ScaledDomain
  private readonly geometry: Geometry
  private readonly m: 0 | 1 | 2
  private readonly initial_C: number
  private readonly timeScale_s: number
  private readonly modes: UniformStage[]
  private series: StageSeries[] | null = null
  private stageSummaries: StageSummary[] | null = null
  private points: Map<string, PointStage[]> | null = null

  constructor(domain: ScaledDomain, geometry: Geometry, initial_C: number, modes: UniformStage[]) {
    this.domain = domain
    this.geometry = geometry
    this.m = domain.m
    this.initial_C = initial_C
    this.timeScale_s = domain.timeScale_s
    this.modes = modes
  }

  /** The stages as the general path's StageSeries (closures and all), made when first read. */
  get stages(): StageSeries[] {
    return (this.series ??= this.modes.map((s): StageSeries => {
      const lam = s.surfaces.slice(0, s.count).map((surface) => surface.lam)
      const steady_C = s.steady_C
      const shapes = lam.map((l) => uniformShape(this.geometry, l, 0))
      return {
        start_s: s.start_s,
        end_s: s.end_s,
        timeScale_s: this.timeScale_s,
        steady: () => steady_C,
        steadyMean_C: steady_C,
        rates: lam.map((l) => l * l),
        amplitudes_K: s.amp.slice(0, s.count),
        shapes,
        modeMeans: s.surfaces.slice(0, s.count).map((surface) => (this.m + 1) * uniformMass(surface)),
        truncationError_K: s.truncationError_K,
        modes: lam.map((l, j) => ({ rate: l * l, shape: shapes[j], surface: surfaceValues(this.geometry, l) })),
      }
    }))
  }

  get summaries(): StageSummary[] {
    return (this.stageSummaries ??= this.modes.map((s) => {
      const rates = s.surfaces.slice(0, s.count).map(({ lam }) => (lam * lam) / this.timeScale_s)
      return {
        start_s: s.start_s,
        end_s: s.summaryEnd_s,
        modes: s.count,
        decayRates_per_s: rates,
        timeConstants_s: rates.map((r) => 1 / r),
        truncationError_K: s.truncationError_K,
        biot: s.biot === Infinity ? null : s.biot,
      }
    }))
  }

  initialAt(): number {
    return this.initial_C
  }

  evaluate(t_s: number, x: number): number {
    if (t_s <= 0) return this.initial_C
    const modes = this.modes
    let s = modes[modes.length - 1]
    for (let i = 0; i < modes.length; i++) {
      if (t_s <= modes[i].end_s) {
        s = modes[i]
        break
      }
    }
    const tau = (t_s - s.start_s) / this.timeScale_s
    let T = s.steady_C
    for (let j = 0; j < s.count; j++) {
      const lam = s.surfaces[j].lam
      const decay = Math.exp(-lam * lam * tau)
      // The terms left add less than 1e-15 K, below rounding: most readings need a mode or two.
      if (decay * s.ampTail[j] < 1e-15) break
      T += s.amp[j] * shapeAt(this.m, lam, x) * decay
    }
    return T
  }

  mean(t_s: number): number {
    return t_s <= 0 ? this.initial_C : pointValue(this.pointSeries('mean'), t_s)
  }

  pointSeries(at: PointRef): PointStage[] {
    const key = JSON.stringify(at)
    const points = (this.points ??= new Map())
    const hit = points.get(key)
    if (hit) return hit
    const x = at === 'mean' ? Number.NaN : at === 'centre' ? 0 : at === 'surface' ? 1 : at.x
    const result = this.modes.map((s): PointStage => {
      const terms = []
      for (let j = 0; j < s.count; j++) {
        const surface = s.surfaces[j]
        const weight = at === 'mean' ? (this.m + 1) * uniformMass(surface) : shapeAt(this.m, surface.lam, x)
        terms.push({ amplitude_K: s.amp[j] * weight, decayRate_per_s: (surface.lam * surface.lam) / this.timeScale_s })
      }
      return { start_s: s.start_s, ...(Number.isFinite(s.end_s) ? { end_s: s.end_s } : {}), steady_C: s.steady_C, terms }
    })
    points.set(key, result)
    return result
  }

  targetTime(at: PointRef, target: TargetSpec): number | null {
    // A uniform start: the centre, the surface and the mean all start at it.
    return firstCrossing(this.pointSeries(at), this.initial_C, target)
  }
}
