import type { BatchFlags, BatchState, ShopSettings } from '../schedule'
import type { FurnaceKind } from '../schemas/schedule'
import type { QuenchantKind } from '../schemas/quenchant'
import type { PointStage } from '../pointSeries'
import type { PlanSummary } from './plan'

export interface Furnace {
  id: number
  name: string
  kind: FurnaceKind
  maxTemp_C: number
  capacity_kg: number
  zoneWidth_mm: number
  zoneDepth_mm: number
  zoneHeight_mm: number
  active: boolean
  stationIds: number[]
}

export interface QuenchStation {
  id: number
  name: string
  kind: QuenchantKind
  maxTemp_C: number
  capacity_kg: number
  active: boolean
}

/** A batch as the API returns it; times are epoch milliseconds (compact for thousands of rows). */
export interface BatchView {
  id: number
  loadNumber: string
  planRevisionId: number
  furnaceId: number
  stationId: number
  partCount: number
  mass_kg: number
  reference: string
  /** The state now, including moves the clock has made since the last recorded event. */
  state: BatchState
  plannedCharge: number
  furnaceStart: number
  furnaceEnd: number
  quenchStart: number
  quenchEnd: number
  handlingAt: number
  chargedAt: number | null
  soakingAt: number | null
  unloadedAt: number | null
  quenchedAt: number | null
  furnaceIsDefault: boolean
  conflictWith: string | null
  conflictNote: string | null
  flags: BatchFlags
}

export interface BatchEventView {
  id: number
  fromState: BatchState
  toState: BatchState
  /** The corrected time when the tap was corrected, else the tapped time. */
  at: string
  actorId: number | null
  actorName: string | null
  /** Set when the tap was confirmed before the plan said it should come. */
  shortfallNote: string | null
  /** The time first tapped, when corrected. */
  originalAt: string | null
  corrections: { at: string; reason: string; by: string; madeAt: string }[]
}

export interface BatchDetail extends BatchView {
  planName: string
  revision: number
  furnaceName: string
  stationName: string
  summary: PlanSummary
  durations: {
    furnace_s: number
    minimumSoak_s: number | null
    transfer_s: number
    quench_s: number
    quenchToHandling_s: number
    quenchDelayAllowance_s: number
  }
  events: BatchEventView[]
}

export interface ScheduleResponse {
  serverNow: number
  batches: BatchView[]
}

/**
 * What one floor card needs, and no more: the poll repeats it every few seconds for
 * every load on the floor. Flags and the clock's moves are derived in the browser
 * (shared/floorCountdown.ts); the curve comes once per plan revision from
 * GET /api/floor/curves; the conflict pair is present only when there is one.
 */
export interface FloorBatch
  extends Pick<
    BatchView,
    'id' | 'loadNumber' | 'planRevisionId' | 'partCount' | 'mass_kg' | 'reference' | 'state' | 'furnaceStart' | 'furnaceEnd' | 'quenchEnd' | 'handlingAt' | 'quenchedAt'
  > {
  planName: string
  furnaceName: string
  stationName: string
  /** The plan's handling temperature (°C), for the countdown's caption. */
  handling_C: number
  /** Which moment the booked handling time stands on (shared/safeHandling.ts), and the headline estimate beside it. */
  handlingBasis: string
  headlineToHandling_s: number
  quenchDelayAllowance_s: number
  conflictWith?: string
  conflictNote?: string | null
  /** Taps a person made on the floor (what the card offers to correct); other events stay on the batch's page. */
  taps: FloorTap[]
}

/** What a floor card needs of a tap to offer its correction; who tapped and why stay on the batch's page. */
export type FloorTap = Pick<BatchEventView, 'id' | 'toState' | 'at' | 'originalAt'>

export interface FloorResponse {
  serverNow: number
  settings: ShopSettings
  batches: FloorBatch[]
}

/** What a plan revision says once for all of its loads on the floor. */
export interface FloorPlanFacts {
  planName: string
  handling_C: number
  quenchToHandling_s: number
  slowEndToHandling_s?: number
}

/** A card as the poll sends it: the plan revision's facts travel once, in FloorPoll.plans. */
export interface FloorCardWire extends Omit<FloorBatch, 'planName' | 'handling_C' | 'handlingBasis' | 'headlineToHandling_s'> {
  /** The booked quench-to-handling time (s, to 0.1 s), from which the card words its basis. */
  bookedToHandling_s: number
}

/** GET /api/floor as sent; shared/floorPoll.ts expands it into a FloorResponse. */
export interface FloorPoll {
  serverNow: number
  settings: ShopSettings
  plans: Record<number, FloorPlanFacts>
  batches: FloorCardWire[]
}

/** GET /api/floor/curves: each plan revision's handling-point series (a revision never changes). */
export interface FloorCurve {
  planRevisionId: number
  handlingPointSeries: PointStage[]
}

export interface PlanOption {
  planRevisionId: number
  planName: string
  revision: number
  /** The plan's newest computed revision. */
  latest: boolean
  /** The first stage's medium: the kind of station the load needs. */
  quenchKind: QuenchantKind | null
  quenchToHandling_s: number
  furnace_s: number | null
  furnace_C: number | null
}

/** What the last tap on a floor card led to: shown on that card, beside the button that was tapped. */
export interface FloorCardFeedback {
  kind: 'ok' | 'error' | 'shortfall'
  text: string
  /** For a shortfall: the move that waits for the second confirmation. */
  to?: BatchState
}
