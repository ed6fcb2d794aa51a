/**
 * A temperature-dependent quench comes out of the engine as a hundred or more
 * sub-step series (one PointStage of three terms each, the open end's of a dozen or
 * more): too much to store with every plan revision and to send to the floor
 * tablet. This rewrites such a history as a few one-term segments
 *
 *   T(t) = a + (T_i − a)·e^{−r (t − t_i)}   on [t_i, t_j],
 *
 * each through the history's own values at its two ends (so it is exact at every
 * knot, and monotone between them), with a the stage's surroundings when the segment
 * approaches them, else a point beyond T_j on the same side (a gentle, nearly linear
 * segment). Knots are the sub-steps' ends, kept greedily as long as a segment stays
 * within `tolerance_K` of the history at every sub-step end and quarter point it spans;
 * stage boundaries and the must-keep times (the handling moment) are always knots,
 * and an open-ended last sub-step is kept as it is. So the compact history is within
 * tolerance_K of the engine's at every sub-step end and quarter point, and exact at
 * the knots; between those points the bends of the two curves may add a little.
 */
import { pointValues, type PointStage } from '../../shared/pointSeries'

/** What the floor may be off by between knots, K: a tenth of a degree, well inside the engine's own error estimate. */
export const COMPACT_TOLERANCE_K = 0.1

export interface StageSpan {
  start_s: number
  /** null for the open-ended last stage. */
  end_s: number | null
  /** The surroundings the part cools (or warms) towards in this stage. */
  ambient_C: number
}

/** The segment from (t0, T0) to (t1, T1), approaching `ambient_C` when it lies beyond T1. */
function segment(t0: number, T0: number, t1: number, T1: number, ambient_C: number): PointStage {
  if (T0 === T1) return { start_s: t0, end_s: t1, steady_C: T0, terms: [] }
  const cooling = T1 < T0
  const beyond = cooling ? ambient_C < T1 : ambient_C > T1
  // Four times the segment's own change past its end: a curvature far below any sub-step's.
  const a = beyond ? ambient_C : T1 - 4 * (T0 - T1)
  const rate = Math.log((T0 - a) / (T1 - a)) / (t1 - t0)
  return { start_s: t0, end_s: t1, steady_C: a, terms: [{ amplitude_K: T0 - a, decayRate_per_s: rate }] }
}

function segmentValue(s: PointStage, t: number): number {
  const term = s.terms[0]
  return term ? s.steady_C + term.amplitude_K * Math.exp(-term.decayRate_per_s * (t - s.start_s)) : s.steady_C
}

/** Knots from `from` to `until`: both ends and every sub-step end between them. */
function knotsBetween(history: PointStage[], from: number, until: number): number[] {
  const ends = history.map((s) => s.end_s).filter((t): t is number => t !== undefined && t > from && t < until)
  return [from, ...ends, until]
}

/** Halvings of one knot interval at most: 2⁸ pieces of a sub-step is far finer than any bend in it. */
const MAX_SPLITS = 8

/**
 * The knots with each interval halved until one segment spans it within tolerance at its
 * check points: right after a change of medium the history can bend more within one
 * sub-step than a single one-term segment follows (the centre still falling while the
 * surface turns), and the greedy pass below never splits an interval itself.
 */
function refinedKnots(history: PointStage[], knots: number[], ambient_C: number, tolerance_K: number): number[] {
  const out = [knots[0]!]
  const split = (t0: number, t1: number, depth: number) => {
    const times = [t0, ...CHECKS.map((f) => t0 + f * (t1 - t0)), t1]
    const values = pointValues(history, times)
    const s = segment(t0, values[0]!, t1, values[times.length - 1]!, ambient_C)
    if (depth < MAX_SPLITS && CHECKS.some((_, c) => Math.abs(segmentValue(s, times[c + 1]!) - values[c + 1]!) > tolerance_K)) {
      split(t0, (t0 + t1) / 2, depth + 1)
      split((t0 + t1) / 2, t1, depth + 1)
    } else out.push(t1)
  }
  for (let i = 1; i < knots.length; i++) split(knots[i - 1]!, knots[i]!, 0)
  return out
}

/** One stage up to `until`, split first at the kept times so each of them ends a segment. */
function compactSpan(history: PointStage[], from: number, until: number, keep: number[], ambient_C: number, tolerance_K: number): PointStage[] {
  const cuts = [from, ...keep.filter((t) => t > from && t < until).sort((x, y) => x - y), until]
  return cuts.slice(1).flatMap((end, i) => {
    const knots = refinedKnots(history, knotsBetween(history, cuts[i]!, end), ambient_C, tolerance_K)
    return compactStage(history, knots, ambient_C, tolerance_K)
  })
}

/** Where each knot interval is checked: its quarter, mid and three-quarter points. */
const CHECKS = [0.25, 0.5, 0.75]

/** Greedy one-term segments over the knots, each within tolerance at the knots and check points it spans. */
function compactStage(history: PointStage[], knots: number[], ambient_C: number, tolerance_K: number): PointStage[] {
  const checks = knots.slice(1).flatMap((t, i) => CHECKS.map((f) => knots[i]! + f * (t - knots[i]!)))
  const atKnots = pointValues(history, knots)
  const atChecks = pointValues(history, checks)
  const fits = (i: number, j: number) => {
    const s = segment(knots[i]!, atKnots[i]!, knots[j]!, atKnots[j]!, ambient_C)
    for (let m = i; m < j; m++) {
      if (m > i && Math.abs(segmentValue(s, knots[m]!) - atKnots[m]!) > tolerance_K) return false
      for (let c = m * CHECKS.length; c < (m + 1) * CHECKS.length; c++) if (Math.abs(segmentValue(s, checks[c]!) - atChecks[c]!) > tolerance_K) return false
    }
    return true
  }
  const out: PointStage[] = []
  let i = 0
  while (i < knots.length - 1) {
    let j = i + 1
    while (j + 1 < knots.length && fits(i, j + 1)) j++
    out.push(segment(knots[i]!, atKnots[i]!, knots[j]!, atKnots[j]!, ambient_C))
    i = j
  }
  return out
}

/**
 * The compact history of `history` (the engine's sub-step series, in time order) over
 * the plan's stages; `keep` are times that must be knots (the handling moment).
 */
export function compactHistory(history: PointStage[], stages: StageSpan[], keep: number[], tolerance_K = COMPACT_TOLERANCE_K): PointStage[] {
  const open = history.at(-1)?.end_s === undefined ? history.at(-1) : undefined
  return stages.flatMap((stage) => {
    if (stage.end_s !== null) return compactSpan(history, stage.start_s, stage.end_s, keep, stage.ambient_C, tolerance_K)
    const until = open ? open.start_s : Math.max(...keep, stage.start_s)
    const head = until > stage.start_s ? compactSpan(history, stage.start_s, until, keep, stage.ambient_C, tolerance_K) : []
    return open ? [...head, open] : head
  })
}
