/**
 * First time a point's temperature crosses a target: T(t) ≤ below_C (cooling)
 * or T(t) ≥ above_C (heating).
 *
 * The history may cross non-monotonically (a surface first heats, a centre first
 * lags), so each stage is sampled coarsely on a mixed logarithmic/linear grid,
 * the first sample past the target brackets the crossing with the sample before
 * it, and Brent polishes the root of the series in t. An open-ended stage is
 * searched until the slowest mode has brought the point within half the
 * remaining distance of its steady value (or ten time constants if the steady
 * value never reaches the target).
 */
import { pointStageValue, type PointStage } from '../../shared/pointSeries'
import { brent } from './roots'

export type TargetSpec = { below_C: number } | { above_C: number }

const SAMPLES = 48

export function firstCrossing(stages: PointStage[], start_C: number, target: TargetSpec): number | null {
  // gap > 0 while the target is not yet reached.
  const gap = 'below_C' in target ? (T: number) => T - target.below_C : (T: number) => target.above_C - T
  let prevT = 0
  let prevGap = gap(start_C)
  if (prevGap <= 0) return 0
  for (let i = 0; i < stages.length; i++) {
    const stage = stages[i]
    const span = i === stages.length - 1 ? openHorizon_s(stage, gap) : (stage.end_s as number) - stage.start_s
    if (!(span > 0)) continue
    const taus = new Set<number>()
    for (let j = 1; j <= SAMPLES; j++) {
      taus.add((span * j) / SAMPLES)
      taus.add(span * 10 ** (-6 * (1 - j / SAMPLES)))
    }
    for (const tau of [...taus].sort((a, b) => a - b)) {
      const t = stage.start_s + tau
      const g = gap(pointStageValue(stage, t))
      if (g <= 0) {
        const f = (s: number) => gap(pointStageValue(stage, s))
        // At a stage start the carried-over value is exact but the stage's truncated series
        // may already disagree (a fixed surface jumps at once): bracket with the series itself.
        const fa = prevT > stage.start_s ? prevGap : f(prevT)
        if (fa <= 0) return prevT
        return brent(f, prevT, t, { fa, fb: g, rtol: 1e-13 })
      }
      prevT = t
      prevGap = g
    }
  }
  return null
}

function openHorizon_s(stage: PointStage, gap: (T: number) => number): number {
  if (stage.terms.length === 0) return 0
  const slowest = Math.min(...stage.terms.map((t) => t.decayRate_per_s))
  const transient = stage.terms.reduce((s, t) => s + Math.abs(t.amplitude_K), 0)
  const steadyGap = gap(stage.steady_C)
  if (steadyGap < 0) return Math.max(1, Math.log(transient / (0.5 * -steadyGap))) * 1.5 / slowest
  return 10 / slowest
}
