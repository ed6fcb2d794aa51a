import type { PlanSummary } from './plan'
import type { PlanWarning } from '../planWarnings'
import type { PartShape, PlanSpec, ResolvedPlan } from '../schemas/plan'

/** One row of the per-mode table: T − T∞ carries e^{−rate·t} of each mode. */
export interface PlanMode {
  label: string
  decayRate_per_s: number
  timeConstant_s: number
}

export interface PlanStageResult {
  index: number
  quenchantName: string
  h_W_m2K: number
  /** Lowest and highest coefficient the surface saw in this stage when the medium's curve was used, else null. */
  hSeen_W_m2K: { min: number; max: number } | null
  ambient_C: number
  start_s: number
  end_s: number | null
  /** h·L/k with L the half-thickness or radius (the smallest half-size for product shapes). */
  biot: number
  /** h·(V/A)/k: below 0.1 the part cools nearly uniformly (lumped estimate). */
  biotLumped: number
  modes: PlanMode[]
  truncationError_K: number
  /** Which method the engine ran for this stage, and its error estimate (K). */
  method: string
  estimatedError_K: number
}

/** The editor's result panel: everything computed for one plan spec. SI and °C throughout. */
export interface PlanResult {
  method: 'series' | 'product'
  shape: PartShape
  handling: PlanSpec['handling']
  quenchToHandling_s: number
  /** α·t/L² at the handling time (L as for the Biot number). */
  fourierAtHandling: number
  /** The one-term estimate is within about 2 % once Fo > 0.2 (textbook rule). */
  oneTermValid: boolean
  truncationError_K: number
  stages: PlanStageResult[]
  material: { name: string; graded: boolean; k_W_mK: number; rhoCp_J_m3K: number; diffusivity_m2_s: number }
  curve: { t_s: number[]; centre_C: number[]; surface_C: number[]; mean_C: number[] }
  stageBoundaries_s: number[]
  /** The coefficient the surface saw at each curve time: h(T_s) plus radiation, or the stage's single h. */
  surfaceCoefficient_W_m2K: number[]
  /** Which physics gave the headline and, when the library's tables or curves did, the single-value estimate beside it. */
  physics: {
    temperatureDependent: boolean
    /** The engine's method(s), as its stage summaries name them. */
    method: string
    /** The largest stage error estimate (sub-step estimate or series truncation), K. */
    estimatedError_K: number
    /** The constant-property estimate (single k, ρ, cₚ and h per medium); null when that is the headline. */
    constantPropertyToHandling_s: number | null
    propertyTableSource: string | null
    curveSources: string[]
  }
  /** The handling point with every quenchant at its low and its high coefficient. */
  band: {
    low: { quenchToHandling_s: number; handling_C: number[] }
    high: { quenchToHandling_s: number; handling_C: number[] }
  }
  /** Centre (x = 0) to surface (x = 1) at a few times, for the time slider. */
  profiles: { x: number[]; depth_m: number; along: string; t_s: number[]; T_C: number[][] }
  soak: {
    furnace_C: number
    charge_C: number
    tolerance_K: number
    furnaceH_W_m2K: number
    /** 'spec' when the metallurgist set it, else the common-practice estimate. */
    furnaceHFrom: 'spec' | 'common-practice'
    heatUp_s: number
    minimumSoak_s: number
    total_s: number
  } | null
  summary: PlanSummary
  /** What a metallurgist should look at before trusting the figures (server/planning/warnings.ts). */
  warnings: PlanWarning[]
}

export interface PlanCheckResult {
  maxDifference_K: number
  /** For product shapes: the bound Σ over directions of each 1-D factor's difference. */
  how: string
}

export interface PlanListItem {
  id: number
  name: string
  latestRevision: number
  shape: PartShape
  materialName: string
  quenchToHandling_s: number | null
  soakTotal_s: number | null
  handling_C: number | null
  updatedAt: string
  archived: boolean
}

export interface PlanRevisionListItem {
  revision: number
  note: string | null
  createdAt: string
  createdBy: string | null
  quenchToHandling_s: number | null
}

export interface PlanDetail {
  id: number
  name: string
  latestRevision: number
  revision: number
  /** The revision's row id: what a booking on the schedule refers to. */
  planRevisionId: number
  note: string | null
  spec: ResolvedPlan
  result: PlanResult
  revisions: PlanRevisionListItem[]
}
