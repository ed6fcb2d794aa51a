/**
 * A plan's quench stages on the quench's clock (t = 0 when the part enters the first
 * medium). One rule says which stage a curve time belongs to, so the coefficient the
 * surface saw, the range of it each stage shows and the warnings about each stage's
 * curve all split the curve alike; and the stages' spans, which the compacted histories
 * keep as knots. Framework-free, like the rest of the planner's core.
 */
import type { PlanStageResult } from '../../shared/types/planResult'
import type { StageSpan } from './compactSeries'

/**
 * The index of the stage in force at t_s, from each stage's end (null for the open-ended
 * last stage). A boundary instant belongs to the earlier stage, as in pointValue: the curve's
 * value there is that stage's converged end. t = 0 belongs to the first stage; after a finite
 * last stage its conditions continue, so later times belong to it.
 */
export function stageAt(t_s: number, stageEnds_s: readonly (number | null)[]): number {
  const stage = stageEnds_s.findIndex((end) => end === null || t_s <= end)
  return stage === -1 ? stageEnds_s.length - 1 : stage
}

/** The stages as compactHistory needs them: where each starts and ends and what it cools towards. */
export function stageSpans(stages: PlanStageResult[]): StageSpan[] {
  return stages.map((s) => ({ start_s: s.start_s, end_s: s.end_s, ambient_C: s.ambient_C }))
}
