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

export const DEVIATION_RULES = ['short_heat_up', 'short_soak', 'quench_delay', 'early_release', 'above_band_at_release', 'slow_cooling'] as const
export type DeviationRule = (typeof DEVIATION_RULES)[number]

export interface Deviation {
  rule: DeviationRule
  /**
   * The plan's limit: the predicted heat-up, the planned soak, the allowance, or the safe-to-handle time.
   * For `above_band_at_release`, the moment judged: quench to release.
   */
  planned_s: number
  /** What the recorded events (or, for `slow_cooling`, the measured trace) give for the same span. */
  actual_s: number
  /** How far past the limit, always positive; 0 for `above_band_at_release`, whose excess is in kelvin. */
  excess_s: number
  /** The measured trace a trace rule judged ("file · channel"). */
  trace?: string
  /** `above_band_at_release`: the band's slow end and the measured reading at the release tap. */
  limit_C?: number
  measured_C?: number
  message: string
}

/**
 * One channel of a load's log on its record: seconds from the recorded quench tap
 * (negative before it), °C. `alignment` says in words how log time met the tap.
 */
export interface MeasuredTrace {
  logId: number
  fileName: string
  sha256: string
  channel: string
  label: string
  /** Log time (s from the log's first row) at which the quench tap was recorded. */
  quenchAtLog_s: number
  alignment: string
  /** Thinned for display; the rules judged every logged row. */
  points: CurvePoint[]
  comparison: TraceComparison
}

/** The measured trace against the plan, the numbers the sheet's comparison line gives. */
export interface TraceComparison {
  /** Measured at the release tap; null when the log does not cover it. */
  atRelease_C: number | null
  /** The band's slow end at the release tap; null without a band. */
  slowEndAtRelease_C: number | null
  /** First time at or below the handling temperature after the quench; null when the log never gets there. */
  reachedHandling_s: number | null
  /** Predicted quench to handling (the booked time the record shows). */
  predictedHandling_s: number
  /** The log's last row, seconds after the quench. */
  logEnd_s: number
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

/** The handling point with every quenchant at the band's ends: `slow` is the hotter of the two at each time. */
export interface PredictedBand {
  slow: CurvePoint[]
  fast: CurvePoint[]
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
  /** The quench band's slow and fast ends at the handling point, when the record has measured traces. */
  predictedBand?: PredictedBand
  /** Measured traces of the load's logs, each with its comparison line. */
  measuredTraces?: MeasuredTrace[]
  events: RecordEvent[]
  /** Floor moments the record expected but nobody tapped (e.g. the door opening): said, never derived. */
  notRecorded: RecordEventType[]
  deviations: Deviation[]
  cautions: string[]
  generatedAt: string
  /** Where QA signs the record off; absent on a sample sheet, which has no record. */
  signOffUrl?: string
}
