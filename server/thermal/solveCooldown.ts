/**
 * Multi-stage cooldown (or heat-up) by eigenfunction series.
 *
 * Each stage has its own modes and steady state; the temperature at the end of a
 * stage is projected onto the next stage's modes (series.ts), which is exact up to
 * quadrature and truncation: a second stage identical to the first reproduces the
 * single-stage answer (tests/unit/thermal/stages.test.ts).
 */
import { modeFamily } from './modeFamily'
import { pointValue, type PointStage } from '../../shared/pointSeries'
import { scaleDomain, weightedRule, type ScaledDomain } from './properties'
import { buildStageSeries, seriesValue, stageEarliest_s, truncationTolerance, type ModalStart, type StageSeries } from './series'
import { FINE_SHOOTING, shootingAccuracy } from './shooting'
import { steadyProfile, type ScaledEnd } from './steadyState'
import { firstCrossing } from './targetTime'
import type { Boundary, CooldownProblem, CooldownSolution, PointRef, SolveOptions, StageSummary, TemperaturePoint } from './types'
import { solveUniformSymmetric } from './uniformSolution'
import { constantLimit } from './constantLimit'
import { solveTemperatureDependent } from './temperatureDependent'

const MAX_MODES_ANALYTIC = 400
const MAX_MODES_SHOOTING = 60

export function scaledEnd(boundary: Boundary, domain: ScaledDomain): ScaledEnd {
  if (boundary.type === 'symmetry') return { biot: 0, temperature_C: Number.NaN }
  if (boundary.type === 'fixed') return { biot: Infinity, temperature_C: boundary.T_C }
  return { biot: (boundary.h_W_m2K * domain.length_m) / domain.kRef_W_mK, temperature_C: boundary.ambient_C }
}

/** The state at its end of a stage with a symmetric centre (so a uniform steady state), as its own modes. */
function modalEnd(stage: StageSeries): ModalStart {
  const tau = (stage.end_s - stage.start_s) / stage.timeScale_s
  return {
    steady_C: stage.steady(0),
    terms: stage.modes.map((mode, j) => ({ amplitude_K: stage.amplitudes_K[j] * Math.exp(-stage.rates[j] * tau), mode })),
  }
}

/** Linear interpolation in a temperature table; at a repeated x the later point wins. */
export function profileAt(points: TemperaturePoint[], x: number): number {
  let j = 0
  while (j + 2 < points.length && points[j + 1].x <= x) j++
  const a = points[j]
  const b = points[j + 1]
  if (b.x === a.x) return b.T_C
  return a.T_C + ((Math.min(Math.max(x, a.x), b.x) - a.x) / (b.x - a.x)) * (b.T_C - a.T_C)
}

/**
 * Uniform bodies with a symmetric centre and a uniform start take the fast path
 * (uniformSolution.ts), which gives the same result with less set-up; every other
 * body the general one below. Temperature-dependent tables go to the sub-step
 * series of temperatureDependent.ts; flat ones are constants and stay here.
 */
export function solveCooldown(problem: CooldownProblem, options: SolveOptions = {}): CooldownSolution {
  const accuracy = options.accuracy_K
  if (accuracy !== undefined && !(accuracy > 0 && Number.isFinite(accuracy))) throw new RangeError('accuracy_K: must be a positive number of kelvin')
  const linear = constantLimit(problem)
  if (!linear) return solveTemperatureDependent(problem, options)
  const domain = scaleDomain(linear.domain)
  problem = linear
  return solveUniformSymmetric(problem, domain, options, MAX_MODES_ANALYTIC) ?? solveBySeries(problem, domain, options)
}

function solveBySeries(problem: CooldownProblem, domain: ScaledDomain, options: SolveOptions): CooldownSolution {
  const geometry = problem.domain.geometry
  const initial = problem.initial
  const initialAt = typeof initial === 'number' ? () => initial : (x: number) => profileAt(initial, x)
  const stages: StageSeries[] = []
  const summaries: StageSummary[] = []
  const accuracy = options.accuracy_K
  const shooting = accuracy === undefined ? FINE_SHOOTING : shootingAccuracy(accuracy)
  let start_s = 0
  problem.stages.forEach((stage, i) => {
    const last = i === problem.stages.length - 1
    const end_s = last ? Infinity : start_s + (stage.duration_s as number)
    const inner = scaledEnd(stage.inner, domain)
    const outer = scaledEnd(stage.outer, domain)
    const family = modeFamily(geometry, domain, inner.biot, outer.biot, shooting)
    const previous = stages[i - 1]
    const series = buildStageSeries({
      domain,
      family,
      steady: steadyProfile(domain.pieces, inner, outer),
      start: previous
        ? (x: number) => seriesValue(previous, previous.end_s - previous.start_s, x)
        : typeof initial === 'number'
          ? initial
          : initialAt,
      ...(previous && problem.stages[i - 1].inner.type === 'symmetry' ? { startModes: modalEnd(previous) } : {}),
      breakpoints: i === 0 && typeof initial !== 'number' ? initial.map((p) => p.x) : [],
      symmetricUniformSteady: inner.biot === 0,
      earliest_s: stageEarliest_s(options.earliest_s, i, domain.timeScale_s),
      minModes: options.minModes ?? 1,
      truncationTolerance_K: truncationTolerance(accuracy),
      maxModes: family.analytic ? MAX_MODES_ANALYTIC : MAX_MODES_SHOOTING,
      start_s,
      end_s,
      deadline: options.deadline,
    })
    stages.push(series)
    const rates = series.rates.map((r) => r / domain.timeScale_s)
    const finiteBiot = (b: number) => (b === Infinity ? null : b)
    summaries.push({
      start_s,
      end_s: stage.duration_s === undefined ? null : start_s + stage.duration_s,
      modes: rates.length,
      decayRates_per_s: rates,
      timeConstants_s: rates.map((r) => 1 / r),
      truncationError_K: series.truncationError_K,
      biot: finiteBiot(outer.biot),
      ...(stage.inner.type === 'symmetry' ? {} : { innerBiot: finiteBiot(inner.biot) }),
    })
    start_s = end_s
  })

  const centreX = problem.stages[0].inner.type === 'symmetry' ? 0 : 0.5
  const xOf = (at: Exclude<PointRef, 'mean'>) => (at === 'centre' ? centreX : at === 'surface' ? 1 : at.x)
  const cache = new Map<string, PointStage[]>()
  const pointSeries = (at: PointRef): PointStage[] => {
    const key = JSON.stringify(at)
    const hit = cache.get(key)
    if (hit) return hit
    const result = stages.map((s): PointStage => {
      const x = at === 'mean' ? Number.NaN : xOf(at)
      const terms = s.rates.map((r, j) => ({
        amplitude_K: s.amplitudes_K[j] * (at === 'mean' ? s.modeMeans[j] : s.shapes[j](x)),
        decayRate_per_s: r / s.timeScale_s,
      }))
      return {
        start_s: s.start_s,
        ...(Number.isFinite(s.end_s) ? { end_s: s.end_s } : {}),
        steady_C: at === 'mean' ? s.steadyMean_C : s.steady(x),
        terms,
      }
    })
    cache.set(key, result)
    return result
  }
  // The first stage's series at τ = 0 is not converged; average the start profile directly.
  const initialMean = (() => {
    if (typeof initial === 'number') return initial
    const rule = weightedRule(domain, 1 / 32, initial.map((p) => p.x))
    let num = 0
    let den = 0
    rule.x.forEach((x, i) => {
      num += rule.w[i] * initialAt(x)
      den += rule.w[i]
    })
    return num / den
  })()
  const stageAt = (t_s: number) => stages.find((s) => t_s <= s.end_s) ?? stages[stages.length - 1]
  return {
    domain,
    stages,
    summaries,
    centreX,
    initialAt,
    evaluate: (t_s, x) => {
      if (t_s <= 0) return initialAt(x)
      const stage = stageAt(t_s)
      return seriesValue(stage, t_s - stage.start_s, x)
    },
    mean: (t_s) => (t_s <= 0 ? initialMean : pointValue(pointSeries('mean'), t_s)),
    pointSeries,
    targetTime: (at, target) => {
      const start = at === 'mean' ? initialMean : initialAt(xOf(at))
      return firstCrossing(pointSeries(at), start, target)
    },
  }
}
