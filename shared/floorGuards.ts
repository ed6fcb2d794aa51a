/**
 * Guarded taps: a floor move that comes before the plan says it should. The server
 * refuses such a tap until the operator confirms the shortfall a second time, and
 * records the shortfall with the event; the floor card shows the same sentence.
 * Pure; instants are epoch milliseconds.
 */
import { formatDuration } from './duration'
import type { BatchState } from './schedule'

export interface GuardTimes {
  chargedAt: number | null
  /** The planned end of soak (core at heat + minimum soak, or charge + furnace time). */
  furnaceEnd: number
  /** The booked safe-to-handle moment (the band's slow end unless the shop set otherwise), not the headline. */
  handlingAt: number
  /** Charge to core at heat as booked; null when the plan does no soak planning. */
  heatUp_s: number | null
  /** Null when the plan does no soak planning: the shop's default furnace time is no minimum. */
  minimumSoak_s: number | null
}

export type ShortfallRule = 'early_core_at_heat' | 'early_out_of_soak' | 'early_release'

export interface Shortfall {
  rule: ShortfallRule
  /** How much earlier than the plan, in seconds (always positive). */
  short_s: number
  message: string
}

/** The booked heat-up of a batch: its furnace time less the minimum soak, when the plan planned a soak. */
export function bookedHeatUp_s(batch: { furnace_s: number; minimumSoak_s: number | null; furnaceIsDefault: boolean }): number | null {
  return batch.minimumSoak_s === null || batch.furnaceIsDefault ? null : batch.furnace_s - batch.minimumSoak_s
}

/** What a tap to `to` at `now` cuts short, or null when it comes on time. */
export function tapShortfall(from: BatchState, to: BatchState, times: GuardTimes, now: number): Shortfall | null {
  const span = formatDuration
  if (to === 'soaking' && times.heatUp_s !== null && times.chargedAt !== null) {
    const elapsed_s = (now - times.chargedAt) / 1000
    const short_s = times.heatUp_s - elapsed_s
    if (short_s > 0) {
      return { rule: 'early_core_at_heat', short_s, message: `Core at heat ${span(elapsed_s)} after charging, ${span(short_s)} before the predicted heat-up of ${span(times.heatUp_s)}.` }
    }
  }
  // The door tap is the moment the soak ends; a quench straight from soak (door tap missed) ends it too.
  const endsSoak = to === 'unloaded' || (to === 'quenched' && from === 'soaking')
  if (endsSoak && times.minimumSoak_s !== null && now < times.furnaceEnd) {
    const short_s = (times.furnaceEnd - now) / 1000
    const what = to === 'unloaded' ? 'Out of the furnace' : 'Quench started'
    return { rule: 'early_out_of_soak', short_s, message: `${what} with ${span(short_s)} of the ${span(times.minimumSoak_s)} minimum soak still to run.` }
  }
  if (to === 'released' && now < times.handlingAt) {
    const short_s = (times.handlingAt - now) / 1000
    return { rule: 'early_release', short_s, message: `Release ${span(short_s)} before the safe-to-handle time.` }
  }
  return null
}
