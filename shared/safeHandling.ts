/**
 * "Safe to handle" errs on the slow side. A plan's headline time uses the typical
 * coefficients; the quench band's slow end (the low coefficients, the longest time) is
 * what a hand on the part should wait for unless the shop decides otherwise. The shop
 * sets how far toward the slow end to go (100 % by default, 0 % = the headline); the
 * floor card and the hold-time sheet say which was used and keep the headline beside it.
 */
import type { PlanSummary } from './types/plan'

export const DEFAULT_TOWARD_SLOW_END_PCT = 100

type Times = Pick<PlanSummary, 'quenchToHandling_s' | 'slowEndToHandling_s'>

/** The quench-to-handling time to book: headline + share × (slow end − headline). */
export function safeToHandle_s(summary: Times, towardSlowEnd_pct: number): number {
  const slowEnd = summary.slowEndToHandling_s
  if (slowEnd === undefined) return summary.quenchToHandling_s
  return summary.quenchToHandling_s + (towardSlowEnd_pct / 100) * (slowEnd - summary.quenchToHandling_s)
}

/**
 * Which basis a booked time stands on, in words for the card and the sheet; read back
 * from the time itself, so a later change of the shop's setting cannot mislabel a load
 * booked before it. Times within a second count as equal (bookings store whole ms).
 */
export function handlingBasis(booked_s: number, summary: Times): string {
  const slowEnd = summary.slowEndToHandling_s
  const headline = summary.quenchToHandling_s
  if (slowEnd === undefined) return 'safe-to-handle at the headline estimate (the plan revision predates the quench band’s slow end)'
  if (Math.abs(booked_s - slowEnd) < 1) return 'safe-to-handle at the slow end of the quench band'
  if (Math.abs(booked_s - headline) < 1) return 'safe-to-handle at the headline estimate, as the shop set'
  const share = Math.round((100 * (booked_s - headline)) / (slowEnd - headline))
  return `safe-to-handle ${share} % of the way from the headline estimate to the slow end of the quench band, as the shop set`
}
