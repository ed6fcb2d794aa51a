/**
 * The data of one load's hold-time sheet: what the e-mailed HTML, the PDF and the
 * curve CSV are rendered from (server/records/). Times in seconds, temperatures in °C,
 * instants as ISO 8601 strings in UTC.
 */

/**
 * Moments recorded for a load. Each is the instant the load entered that state;
 * `furnace_opened` is the load leaving the furnace, which starts the quench delay.
 */
export const RECORD_EVENT_TYPES = ['charged', 'soaking', 'furnace_opened', 'quenched', 'cooling', 'ready_to_handle', 'released'] as const
export type RecordEventType = (typeof RECORD_EVENT_TYPES)[number]

export const RECORD_EVENT_LABELS: Record<RecordEventType, string> = {
  charged: 'Charged into furnace',
  soaking: 'Core at temperature, soak started',
  furnace_opened: 'Out of the furnace (door open)',
  quenched: 'In the quench',
  cooling: 'Out of the quench, cooling',
  ready_to_handle: 'Ready to handle',
  released: 'Released',
}

/** A recorded event as the deviation rules need it. */
export interface TimedEvent {
  type: RecordEventType
  at: string
}

/** A later correction of a tapped time, kept beside the original. */
export interface EventCorrection {
  /** The time before this correction and the corrected time. */
  from: string
  to: string
  reason: string
  by: string
  /** When the correction was made. */
  madeAt: string
}

/**
 * "recorded": tapped on the floor by a person; "predicted": a moment the plan's clock
 * gives from recorded ones (out of the quench, ready to handle), never a floor entry.
 */
export type EventSource = 'recorded' | 'predicted'

/** An event as the sheet shows it: also who recorded it, or that the plan predicted it. */
export interface RecordEvent extends TimedEvent {
  by: string
  source: EventSource
  note?: string
  /** The tap came before the plan said it should and was confirmed anyway: the shortfall in words. */
  shortfall?: string
  /** The time first tapped, when the event was corrected since (`at` is the corrected time). */
  originalAt?: string
  corrections?: EventCorrection[]
}

/** The plan figures the deviation rules compare against. */
export interface DeviationPlan {
  /** Charge to core at temperature (predicted). Null when the plan does no soak planning. */
  heatUp_s: number | null
  /** Minimum soak once the core is at temperature. Null when the plan does no soak planning. */
  minimumSoak_s: number | null
  /** Longest allowed time from leaving the furnace to being in the quench. */
  quenchDelayAllowance_s: number
  /** Quench start to the handling point below the handling temperature (predicted). */
  quenchToHandling_s: number
}

export const DEVIATION_RULES = ['short_heat_up', 'short_soak', 'quench_delay', 'early_release'] as const
export type DeviationRule = (typeof DEVIATION_RULES)[number]

export interface Deviation {
  rule: DeviationRule
  /** The plan's limit: the predicted heat-up, the planned soak, the allowance, or the safe-to-handle time. */
  planned_s: number
  /** What the recorded events give for the same span. */
  actual_s: number
  /** How far past the limit, always positive. */
  excess_s: number
  message: string
}

/** Spans measured from the recorded events; null where the events needed are missing. */
export interface MeasuredTimes {
  heatUp_s: number | null
  soak_s: number | null
  quenchDelay_s: number | null
  quenchToRelease_s: number | null
}

export interface CurvePoint {
  /** Seconds from the start of the quench. */
  t_s: number
  T_C: number
}

export interface HoldTimeSheet {
  shopName: string
  loadNumber: string
  part: { name: string; number: string; quantity: number; section: string }
  material: string
  furnace: string
  quenchStation: string
  quenchant: string
  plan: { name: string; revision: number }
  planned: DeviationPlan & { furnace_C: number; handling_C: number }
  /** Which basis the predicted handling time stands on and the headline beside it; null on records made before it was kept. */
  handlingNote: string | null
  measured: MeasuredTimes
  /** Predicted handling-point temperature after the quench starts. */
  predictedCurve: CurvePoint[]
  events: RecordEvent[]
  /** Floor moments the record expected but nobody tapped (e.g. the door opening): said, never derived. */
  notRecorded: RecordEventType[]
  deviations: Deviation[]
  cautions: string[]
  generatedAt: string
  /** Where QA signs the record off; absent on a sample sheet, which has no record. */
  signOffUrl?: string
}
