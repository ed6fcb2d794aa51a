import { runCase } from '../thermal/runCase'
import type { PlanSummary } from '../../shared/types/plan'

export interface SummaryCases {
  /** Cooldown from the start of the quench; its target (below_C at the handling point) is the handling temperature. */
  quench: Record<string, unknown> & { target: { below_C: number; at?: unknown } }
  /** Optional furnace heat-up from charge; its target (above_C) is "core within tolerance of the furnace". */
  heatUp?: Record<string, unknown> & { target: { above_C: number; at?: unknown } }
  furnace_C?: number
  minimumSoak_s?: number
}

/**
 * A PlanSummary computed by the engine, for demo data, tests and benchmarks: the
 * same numbers the planner stores when a revision is saved from the editor.
 */
export function summaryFromCases(cases: SummaryCases): PlanSummary {
  const quench = runCase(cases.quench)
  if (quench.targetTime_s === null) throw new Error('the quench case never reaches its handling temperature')
  let soak: PlanSummary['soak'] = null
  let heatUpSeries: PlanSummary['heatUpSeries'] = null
  if (cases.heatUp) {
    const heat = runCase(cases.heatUp)
    if (heat.targetTime_s === null) throw new Error('the heat-up case never reaches its target')
    const minimumSoak_s = cases.minimumSoak_s ?? 0
    soak = { furnace_C: cases.furnace_C ?? cases.heatUp.target.above_C, heatUp_s: heat.targetTime_s, minimumSoak_s, total_s: heat.targetTime_s + minimumSoak_s }
    heatUpSeries = heat.stages.map((stage) => stage.pointSeries)
  }
  return {
    quenchToHandling_s: quench.targetTime_s,
    handling_C: cases.quench.target.below_C,
    soak,
    handlingPointSeries: quench.stages.map((stage) => stage.pointSeries),
    heatUpSeries,
  }
}
