import type { PointStage } from '../pointSeries'

/**
 * Headline results of one plan revision, stored with it (plan_revisions.summary) so
 * lists, the schedule and the floor countdown need not re-run the engine.
 * All times in seconds, temperatures in °C.
 */
export interface PlanSummary {
  /** From the start of the quench until the handling point is below the handling temperature. */
  quenchToHandling_s: number
  /**
   * The same at the slow end of the quench band (the low coefficients, the longest
   * time): what "safe to handle" books by default (shared/safeHandling.ts). Absent in
   * summaries saved before it was kept.
   */
  slowEndToHandling_s?: number
  handling_C: number
  /** Soak planning, when the plan asks for it. */
  soak: {
    furnace_C: number
    /** Charge to "core within tolerance of the furnace temperature". */
    heatUp_s: number
    /** The shop's minimum soak after the core is at temperature. */
    minimumSoak_s: number
    /** heatUp_s + minimumSoak_s: charge to ready-to-quench. */
    total_s: number
  } | null
  /** Core (handling point) temperature after the quench starts: evaluate with shared/pointSeries.ts. */
  handlingPointSeries: PointStage[]
  /** The same for the furnace heat-up, when soak planning is on (time from charge). */
  heatUpSeries: PointStage[] | null
  /**
   * When the first quench stage ends (null: the plan has one stage). A temperature-dependent
   * history has several segments per stage, so the series alone no longer says it;
   * absent in summaries saved before, whose series has one segment per stage.
   */
  firstStageEnd_s?: number | null
  /**
   * The handling point's history at each end of the quench band, compacted like
   * handlingPointSeries: kept for temperature-dependent plans, whose band takes seconds to
   * run again, so a record that compares a measured trace reads it instead. Absent for
   * constant-property plans (their band reruns in milliseconds) and older summaries.
   */
  bandPointSeries?: { low: PointStage[]; high: PointStage[] }
}
