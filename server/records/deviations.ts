/**
 * Deviation rules: recorded moments against the plan. Pure functions. The events
 * passed in are the moments people tapped on the floor (corrected times where a tap
 * was corrected); predicted moments never reach these rules, so a span the floor
 * did not record stays unmeasured rather than being filled in from the plan.
 */
import type { PlanSummary } from '../../shared/types/plan'
import { formatSpan } from './format'
import type { Deviation, DeviationPlan, MeasuredTimes, RecordEventType, TimedEvent, TraceComparison } from '../../shared/types/records'

/** Instant of the first event of a type, in ms; a state entered twice counts from the first time. */
function firstAt(events: readonly TimedEvent[], type: RecordEventType): number | null {
  let first: number | null = null
  for (const event of events) {
    if (event.type !== type) continue
    const at = Date.parse(event.at)
    if (Number.isNaN(at)) throw new Error(`Event ${type} has an unreadable time: ${event.at}`)
    if (first === null || at < first) first = at
  }
  return first
}

/**
 * Recorded instants are whole milliseconds while plan figures are not, so a span
 * within a millisecond of its limit meets it rather than deviating by rounding.
 */
const RESOLUTION_S = 0.001

const between = (start: number | null, end: number | null) => (start !== null && end !== null ? (end - start) / 1000 : null)

/**
 * The spans the rules judge, each from two recorded moments:
 * - heat-up: `charged` → `soaking` (core at heat);
 * - soak: `soaking` → the load out of the furnace (`furnace_opened`), or → `quenched`
 *   when the door tap is missing: the load was out by then, so the soak was no longer;
 * - quench delay: `furnace_opened` → `quenched` (furnace door to bath, the trade's
 *   meaning); null without the door tap;
 * - quench to release: `quenched` → `released`.
 */
export function measureTimes(events: readonly TimedEvent[]): MeasuredTimes {
  const charged = firstAt(events, 'charged')
  const soaking = firstAt(events, 'soaking')
  const opened = firstAt(events, 'furnace_opened')
  const quenched = firstAt(events, 'quenched')
  const released = firstAt(events, 'released')
  return {
    heatUp_s: between(charged, soaking),
    soak_s: between(soaking, opened ?? quenched),
    quenchDelay_s: between(opened, quenched),
    quenchToRelease_s: between(quenched, released),
  }
}

/** Every rule the recorded moments break, in process order, each explained in one sentence with its numbers. */
export function findDeviations(plan: DeviationPlan, events: readonly TimedEvent[]): Deviation[] {
  const measured = measureTimes(events)
  const doorRecorded = firstAt(events, 'furnace_opened') !== null
  const found: Deviation[] = []
  const span = formatSpan

  if (plan.heatUp_s !== null && measured.heatUp_s !== null && measured.heatUp_s < plan.heatUp_s - RESOLUTION_S) {
    const short = plan.heatUp_s - measured.heatUp_s
    found.push({
      rule: 'short_heat_up',
      planned_s: plan.heatUp_s,
      actual_s: measured.heatUp_s,
      excess_s: short,
      message: `Core at heat recorded ${span(measured.heatUp_s)} after charging, ${span(short)} sooner than the predicted heat-up of ${span(plan.heatUp_s)}, so the soak may have been counted before the core was at temperature.`,
    })
  }
  if (plan.minimumSoak_s !== null && measured.soak_s !== null && measured.soak_s < plan.minimumSoak_s - RESOLUTION_S) {
    const short = plan.minimumSoak_s - measured.soak_s
    const end = doorRecorded ? 'the load out of the furnace' : 'the quench (door opening not recorded)'
    found.push({
      rule: 'short_soak',
      planned_s: plan.minimumSoak_s,
      actual_s: measured.soak_s,
      excess_s: short,
      message: `Soak ${span(measured.soak_s)} from core at heat to ${end}, ${span(short)} shorter than the planned minimum of ${span(plan.minimumSoak_s)}.`,
    })
  }
  if (measured.quenchDelay_s !== null && measured.quenchDelay_s > plan.quenchDelayAllowance_s + RESOLUTION_S) {
    const over = measured.quenchDelay_s - plan.quenchDelayAllowance_s
    found.push({
      rule: 'quench_delay',
      planned_s: plan.quenchDelayAllowance_s,
      actual_s: measured.quenchDelay_s,
      excess_s: over,
      message: `Quench delay ${span(measured.quenchDelay_s)} from the furnace door opening to the quench, ${span(over)} over the allowed ${span(plan.quenchDelayAllowance_s)}.`,
    })
  }
  if (measured.quenchToRelease_s !== null && measured.quenchToRelease_s < plan.quenchToHandling_s - RESOLUTION_S) {
    const early = plan.quenchToHandling_s - measured.quenchToRelease_s
    found.push({
      rule: 'early_release',
      planned_s: plan.quenchToHandling_s,
      actual_s: measured.quenchToRelease_s,
      excess_s: early,
      message: `Released ${span(measured.quenchToRelease_s)} after the quench, ${span(early)} before the safe-to-handle time of ${span(plan.quenchToHandling_s)}.`,
    })
  }
  return found
}

/** The rule inputs from a stored plan summary and the shop's quench-delay allowance. */
export function deviationPlanFromSummary(summary: PlanSummary, quenchDelayAllowance_s: number): DeviationPlan {
  return {
    heatUp_s: summary.soak?.heatUp_s ?? null,
    minimumSoak_s: summary.soak?.minimumSoak_s ?? null,
    quenchDelayAllowance_s,
    quenchToHandling_s: summary.quenchToHandling_s,
  }
}

/** A measured trace as the rules read it: every logged row, seconds from the recorded quench tap (ascending), °C. */
export interface TraceToJudge {
  label: string
  t_s: readonly number[]
  T_C: readonly number[]
}

/** What a measured trace is judged against. */
export interface TracePlan {
  handling_C: number
  /** Predicted quench to handling: the booked time the record shows as "ready to handle". */
  quenchToHandling_s: number
  /** Recorded quench to release tap; null when either tap is missing. */
  quenchToRelease_s: number | null
  /** The quench band's slow end at the handling point, s after the quench → °C; null when the band could not be computed. */
  slowEnd_C: ((t_s: number) => number) | null
}

/** The trace at time t by straight lines between logged rows; null outside the logged span. */
export function temperatureAt(trace: TraceToJudge, t: number): number | null {
  const { t_s, T_C } = trace
  if (t_s.length === 0 || t < t_s[0]! || t > t_s[t_s.length - 1]!) return null
  let lo = 0
  let hi = t_s.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (t_s[mid]! <= t) lo = mid
    else hi = mid
  }
  if (hi === lo) return T_C[lo]!
  const f = (t - t_s[lo]!) / (t_s[hi]! - t_s[lo]!)
  return T_C[lo]! + f * (T_C[hi]! - T_C[lo]!)
}

/**
 * When the trace first reaches the handling temperature after the quench: the first
 * logged row at or after the tap (t ≥ 0) that reads at or below `handling_C`, with the
 * crossing placed by a straight line from the row before it when that row read above.
 * Rows before the tap never count (a logger started cold, before the charge, reads
 * below the handling point long before the quench). Null when no row gets there.
 */
export function reachedHandling_s(trace: TraceToJudge, handling_C: number): number | null {
  const { t_s, T_C } = trace
  for (let i = 0; i < t_s.length; i++) {
    if (t_s[i]! < 0 || T_C[i]! > handling_C) continue
    if (i === 0 || T_C[i - 1]! <= handling_C) return t_s[i]!
    const f = (T_C[i - 1]! - handling_C) / (T_C[i - 1]! - T_C[i]!)
    return Math.max(0, t_s[i - 1]! + f * (t_s[i]! - t_s[i - 1]!))
  }
  return null
}

/**
 * The tolerance of "cooling slower than planned": 5 % of the predicted time to handling,
 * and never less than 30 s. Our own choice, not a standard: the quench tap is a person
 * tapping a tablet as the load goes in, and a logger samples every few seconds, so the
 * measured crossing carries tens of seconds of timing noise; on long quenches the band's
 * own spread is larger still, and 5 % keeps the rule from firing on that noise.
 */
export function slowCoolingTolerance_s(predicted_s: number): number {
  return Math.max(30, 0.05 * predicted_s)
}

/** The numbers the record and the sheet compare for one trace. */
export function compareTrace(plan: TracePlan, trace: TraceToJudge): TraceComparison {
  const release = plan.quenchToRelease_s
  return {
    atRelease_C: release === null ? null : temperatureAt(trace, release),
    slowEndAtRelease_C: release === null || plan.slowEnd_C === null ? null : plan.slowEnd_C(release),
    reachedHandling_s: reachedHandling_s(trace, plan.handling_C),
    predictedHandling_s: plan.quenchToHandling_s,
    logEnd_s: trace.t_s[trace.t_s.length - 1] ?? 0,
  }
}

const kelvin = (K: number) => `${K.toFixed(1)} K`
const celsius = (T: number) => `${T.toFixed(1)} °C`

/**
 * The rules on measured traces, each trace judged on its own, in the order of the traces:
 * - `above_band_at_release`: at the release tap the trace reads above the quench band's
 *   slow end (the hotter end of the band at that moment). No tolerance: the slow end is
 *   already the pessimistic prediction. Not judged when the log does not cover the
 *   release or the band is unknown.
 * - `slow_cooling`: the trace reaches the handling temperature (reachedHandling_s) later
 *   than the predicted time to handling plus slowCoolingTolerance_s; or it never gets
 *   there and the log runs past that limit still above it. A log that ends sooner,
 *   still above, is not judged: it cannot say when the part got there.
 */
export function findTraceDeviations(plan: TracePlan, traces: readonly TraceToJudge[]): Deviation[] {
  const found: Deviation[] = []
  const span = formatSpan
  for (const trace of traces) {
    const c = compareTrace(plan, trace)
    if (plan.quenchToRelease_s !== null && c.atRelease_C !== null && c.slowEndAtRelease_C !== null && c.atRelease_C > c.slowEndAtRelease_C) {
      found.push({
        rule: 'above_band_at_release',
        planned_s: plan.quenchToRelease_s,
        actual_s: plan.quenchToRelease_s,
        excess_s: 0,
        trace: trace.label,
        limit_C: c.slowEndAtRelease_C,
        measured_C: c.atRelease_C,
        message: `${trace.label} read ${celsius(c.atRelease_C)} at the release, ${span(plan.quenchToRelease_s)} after the quench: ${kelvin(c.atRelease_C - c.slowEndAtRelease_C)} above the slow end of the predicted band (${celsius(c.slowEndAtRelease_C)}).`,
      })
    }
    const limit = plan.quenchToHandling_s + slowCoolingTolerance_s(plan.quenchToHandling_s)
    const allowance = span(slowCoolingTolerance_s(plan.quenchToHandling_s))
    if (c.reachedHandling_s !== null && c.reachedHandling_s > limit) {
      const late = c.reachedHandling_s - plan.quenchToHandling_s
      found.push({
        rule: 'slow_cooling',
        planned_s: plan.quenchToHandling_s,
        actual_s: c.reachedHandling_s,
        excess_s: late,
        trace: trace.label,
        message: `${trace.label} reached the handling temperature of ${celsius(plan.handling_C)} ${span(c.reachedHandling_s)} after the quench, ${span(late)} later than the predicted ${span(plan.quenchToHandling_s)} (tolerance ${allowance}).`,
      })
    } else if (c.reachedHandling_s === null && c.logEnd_s > limit) {
      const late = c.logEnd_s - plan.quenchToHandling_s
      found.push({
        rule: 'slow_cooling',
        planned_s: plan.quenchToHandling_s,
        actual_s: c.logEnd_s,
        excess_s: late,
        trace: trace.label,
        message: `${trace.label} was still above the handling temperature of ${celsius(plan.handling_C)} when the log ended ${span(c.logEnd_s)} after the quench, already ${span(late)} later than the predicted ${span(plan.quenchToHandling_s)} (tolerance ${allowance}).`,
      })
    }
  }
  return found
}
