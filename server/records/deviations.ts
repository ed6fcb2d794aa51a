/**
 * Deviation rules: recorded moments against the plan. Pure functions. The events
 * passed in are the moments people tapped on the floor (corrected times where a tap
 * was corrected); predicted moments never reach these rules, so a span the floor
 * did not record stays unmeasured rather than being filled in from the plan.
 */
import type { PlanSummary } from '../../shared/types/plan'
import { formatSpan } from './format'
import type { Deviation, DeviationPlan, MeasuredTimes, RecordEventType, TimedEvent } from '../../shared/types/records'

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
