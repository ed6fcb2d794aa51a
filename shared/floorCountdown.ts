/**
 * What a floor card shows at a moment: the state the clock has reached, the
 * countdown that matters in that state and, after the quench, the predicted core
 * temperature from the plan's point series. Pure, so the browser can run it every
 * second and tests can check it against the engine.
 */
import { pointValue } from './pointSeries'
import { batchFlags, nextFloorMove, stateByClock, type BatchFlags, type BatchState } from './schedule'
import type { PlanSummary } from './types/plan'

export interface CountdownInput {
  state: BatchState
  furnaceStart: number
  furnaceEnd: number
  quenchEnd: number
  handlingAt: number
  quenchedAt: number | null
  quenchDelayAllowance_s: number
  /** The curve may still be on its way to the floor (it is fetched once per plan revision): no core estimate until then. */
  summary: Pick<PlanSummary, 'handling_C'> & Partial<Pick<PlanSummary, 'handlingPointSeries'>>
}

export interface CountdownView {
  state: BatchState
  /** Seconds to the moment that matters now (negative once passed); null when nothing is counted. */
  seconds: number | null
  caption: string
  /** True once the counted moment has passed: the card shows its "done" look. */
  reached: boolean
  coreNow_C: number | null
  next: BatchState | null
  flags: BatchFlags
}

/** `formatTemperature` writes a °C value in the reader's unit for the captions. */
export function floorCountdown(
  b: CountdownInput,
  now: number,
  temperWithin_s: number,
  formatTemperature: (value_C: number) => string = (value_C) => `${value_C} °C`,
): CountdownView {
  const state = stateByClock(b.state, b, now)
  const slots = {
    furnaceStart: b.furnaceStart,
    furnaceEnd: b.furnaceEnd,
    quenchStart: b.quenchedAt ?? b.furnaceEnd,
    quenchEnd: b.quenchEnd,
    handlingAt: b.handlingAt,
  }
  const flags = batchFlags(state, slots, now, b.quenchDelayAllowance_s, temperWithin_s)
  const until = (t: number) => (t - now) / 1000
  let seconds: number | null = null
  let caption = ''
  let coreNow_C: number | null = null
  switch (state) {
    case 'planned':
      seconds = until(b.furnaceStart)
      caption = seconds >= 0 ? 'until the planned charge' : 'past the planned charge'
      break
    case 'charged':
    case 'soaking':
      seconds = until(b.furnaceEnd)
      caption = seconds >= 0 ? 'until core at heat plus minimum soak' : 'Soak complete: quench now'
      break
    case 'unloaded':
      // The door is open: what counts is the allowance from the door to the bath.
      seconds = until(b.furnaceEnd + b.quenchDelayAllowance_s * 1000)
      caption = seconds >= 0 ? 'left of the quench delay allowance: into the bath' : 'Quench delay allowance passed: quench now'
      break
    case 'quenched':
    case 'cooling':
      seconds = until(b.handlingAt)
      caption = seconds > 0 ? `until the core is below ${formatTemperature(b.summary.handling_C)}` : `Core below ${formatTemperature(b.summary.handling_C)}: lift out when the quench stage ends`
      coreNow_C = coreAt(b, now)
      break
    case 'ready':
      // Safe to handle: what counts now is getting the load to the temper furnace.
      seconds = until(b.handlingAt + temperWithin_s * 1000)
      caption = seconds >= 0 ? 'until tempering is overdue' : 'Tempering overdue'
      coreNow_C = coreAt(b, now)
      break
    default:
      break
  }
  return { state, seconds, caption, reached: seconds !== null && seconds <= 0, coreNow_C, next: nextFloorMove(state), flags }
}

function coreAt(b: CountdownInput, now: number): number | null {
  const series = b.summary.handlingPointSeries
  return b.quenchedAt !== null && series ? pointValue(series, (now - b.quenchedAt) / 1000) : null
}
