/**
 * Deviation rules: recorded event times against the plan. Pure functions; the
 * events are the instants a load entered each state (shared/types/records.ts).
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

const seconds = (ms: number) => ms / 1000

/**
 * The spans the rules judge:
 * - soak: from the soak start (the `soaking` event, or charge + predicted heat-up when
 *   the core-at-temperature moment was not recorded) to the load leaving the furnace
 *   (`furnace_opened`, or `quenched` when the transfer was not recorded);
 * - quench delay: `furnace_opened` → `quenched`;
 * - quench to release: `quenched` → `released`.
 */
export function measureTimes(plan: DeviationPlan, events: readonly TimedEvent[]): MeasuredTimes {
  const charged = firstAt(events, 'charged')
  const soaking = firstAt(events, 'soaking')
  const opened = firstAt(events, 'furnace_opened')
  const quenched = firstAt(events, 'quenched')
  const released = firstAt(events, 'released')

  const soakStart = soaking ?? (charged !== null && plan.heatUp_s !== null ? charged + plan.heatUp_s * 1000 : null)
  const soakEnd = opened ?? quenched
  return {
    soak_s: soakStart !== null && soakEnd !== null ? seconds(soakEnd - soakStart) : null,
    quenchDelay_s: opened !== null && quenched !== null ? seconds(quenched - opened) : null,
    quenchToRelease_s: quenched !== null && released !== null ? seconds(released - quenched) : null,
  }
}

/** Every rule the recorded events break, in process order (soak, quench delay, release). */
export function findDeviations(plan: DeviationPlan, events: readonly TimedEvent[]): Deviation[] {
  const measured = measureTimes(plan, events)
  const found: Deviation[] = []

  if (plan.minimumSoak_s !== null && measured.soak_s !== null && measured.soak_s < plan.minimumSoak_s) {
    found.push({
      rule: 'short_soak',
      planned_s: plan.minimumSoak_s,
      actual_s: measured.soak_s,
      excess_s: plan.minimumSoak_s - measured.soak_s,
      message: `Soak ${formatSpan(measured.soak_s)}, ${formatSpan(plan.minimumSoak_s - measured.soak_s)} shorter than the planned ${formatSpan(plan.minimumSoak_s)}`,
    })
  }
  if (measured.quenchDelay_s !== null && measured.quenchDelay_s > plan.quenchDelayAllowance_s) {
    found.push({
      rule: 'quench_delay',
      planned_s: plan.quenchDelayAllowance_s,
      actual_s: measured.quenchDelay_s,
      excess_s: measured.quenchDelay_s - plan.quenchDelayAllowance_s,
      message: `Quench delay ${formatSpan(measured.quenchDelay_s)}, ${formatSpan(measured.quenchDelay_s - plan.quenchDelayAllowance_s)} over the allowed ${formatSpan(plan.quenchDelayAllowance_s)}`,
    })
  }
  if (measured.quenchToRelease_s !== null && measured.quenchToRelease_s < plan.quenchToHandling_s) {
    found.push({
      rule: 'early_release',
      planned_s: plan.quenchToHandling_s,
      actual_s: measured.quenchToRelease_s,
      excess_s: plan.quenchToHandling_s - measured.quenchToRelease_s,
      message: `Released ${formatSpan(measured.quenchToRelease_s)} after the quench, ${formatSpan(plan.quenchToHandling_s - measured.quenchToRelease_s)} before the predicted handling time of ${formatSpan(plan.quenchToHandling_s)}`,
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
