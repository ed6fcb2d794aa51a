/**
 * The quench band at the handling point, for records that carry a measured trace: the
 * plan revision's quench run again with every quenchant at its low and at its high
 * coefficient, the same two runs the planner draws as the band (computePlan.ts), kept
 * here as point series so the band can be read at any moment, the release tap
 * included. A temperature-dependent plan stored its band with its summary (those runs
 * take seconds), which is read instead of run. Framework-free; used only when a load has a log.
 */
import { COMPUTE_BUDGET_MS, Deadline } from '../thermal/deadline'
import { runCase } from '../thermal/runCase'
import { runProduct } from '../thermal/productSolution'
import { pointValue, type PointStage } from '../../shared/pointSeries'
import { resolvedPlanSchema, type CoefficientChoice } from '../../shared/schemas/plan'
import type { PlanSummary } from '../../shared/types/plan'
import type { CurvePoint, PredictedBand } from '../../shared/types/records'
import { productInput, quenchCase } from '../planning/computePlan'
import { engineBody } from '../planning/shapes'

export interface BandSeries {
  low: PointStage[]
  high: PointStage[]
}

/** The handling point's history with every stage at the band's `choice` end. */
function bandRun(spec: unknown, choice: CoefficientChoice, deadline: Deadline): PointStage[] {
  const plan = resolvedPlanSchema.parse(spec)
  if (engineBody(plan.part).kind === 'series') return runCase(quenchCase(plan, choice), { deadline }).stages.map((stage) => stage.pointSeries)
  return runProduct(productInput(plan, choice), { deadline }).series
}

/** Both ends of the band for a stored revision (its summary's, or run within one engine budget); null when the spec cannot be run. */
export function bandSeriesOf(spec: unknown, summary?: Pick<PlanSummary, 'bandPointSeries'> | null): BandSeries | null {
  if (summary?.bandPointSeries) return summary.bandPointSeries
  const deadline = new Deadline(COMPUTE_BUDGET_MS)
  try {
    return { low: bandRun(spec, 'low', deadline), high: bandRun(spec, 'high', deadline) }
  } catch {
    // A revision the engine cannot run again (an old spec, a budget spent) leaves the record without a band, said so on it.
    return null
  }
}

/** The slow end at time t: the hotter of the two ends, whichever coefficient it comes from. */
export function slowEndAt(band: BandSeries, t_s: number): number {
  return Math.max(pointValue(band.low, t_s), pointValue(band.high, t_s))
}

/** The band sampled at `count` + 1 even steps over [0, span_s], rounded like the predicted curve. */
export function bandCurves(band: BandSeries, span_s: number, count = 120): PredictedBand {
  const slow: CurvePoint[] = []
  const fast: CurvePoint[] = []
  const round = (value: number, places: number) => Math.round(value * 10 ** places) / 10 ** places
  for (let i = 0; i <= count; i++) {
    const t = (i * span_s) / count
    const low = pointValue(band.low, t)
    const high = pointValue(band.high, t)
    slow.push({ t_s: round(t, 3), T_C: round(Math.max(low, high), 2) })
    fast.push({ t_s: round(t, 3), T_C: round(Math.min(low, high), 2) })
  }
  return { slow, fast }
}
