import { describe, expect, it } from 'vitest'
import { DEMO_PLANS } from '../../server/db/demo/plans'
import { computePlan, quenchCase } from '../../server/planning/computePlan'
import { runCase } from '../../server/thermal/runCase'
import { handlingBasis, safeToHandle_s } from '../../shared/safeHandling'
import { DEFAULT_SHOP_SETTINGS, deriveSlots, slotDurations } from '../../shared/schedule'
import { resolveDemo } from '../support/demoPlans'

const times = { quenchToHandling_s: 1000, slowEndToHandling_s: 1400 }

describe('safe to handle sits toward the slow end of the quench band', () => {
  it.each([
    [100, 1400],
    [0, 1000],
    [50, 1200],
    [25, 1100],
  ])('at %d %% of the way the booked time is %d s (headline + share × (slow end − headline))', (pct, expected) => {
    expect(safeToHandle_s(times, pct)).toBeCloseTo(expected, 9)
  })

  it('a summary saved before the slow end was kept books its headline', () => {
    expect(safeToHandle_s({ quenchToHandling_s: 1000 }, 100)).toBe(1000)
  })

  it.each([
    [1400, 'safe-to-handle at the slow end of the quench band'],
    [1400.4, 'safe-to-handle at the slow end of the quench band'],
    [1000, 'safe-to-handle at the headline estimate, as the shop set'],
    [1300, 'safe-to-handle 75 % of the way from the headline estimate to the slow end of the quench band, as the shop set'],
  ])('a booked %d s reads “%s”', (booked, words) => {
    expect(handlingBasis(booked, times)).toBe(words)
  })
})

describe('the demo drive pin books the slow end the engine computes for the same case', () => {
  const pin = resolveDemo(DEMO_PLANS.find((p) => p.name.startsWith('Drive pin'))!)
  const { summary } = computePlan(pin)
  // The band's slow end straight from the engine: every stage at its low coefficient.
  const slowEnd_s = runCase(quenchCase(pin, 'low')).targetTime_s as number

  it('the summary keeps the slow end, later than the headline', () => {
    expect(summary.slowEndToHandling_s).toBeCloseTo(slowEnd_s, 6)
    expect(slowEnd_s).toBeGreaterThan(summary.quenchToHandling_s)
  })

  it('by default the booking, and so the floor’s safe-to-handle moment, is the slow end', () => {
    const durations = slotDurations(summary, DEFAULT_SHOP_SETTINGS)
    expect(durations.quenchToHandling_s).toBeCloseTo(slowEnd_s, 6)
    const slots = deriveSlots(Date.UTC(2026, 0, 5, 6), durations)
    expect((slots.handlingAt - slots.quenchStart) / 1000).toBeCloseTo(slowEnd_s, 3)
    expect(handlingBasis((slots.handlingAt - slots.quenchStart) / 1000, summary)).toBe('safe-to-handle at the slow end of the quench band')
  })

  it('a shop that sets 0 % books the headline', () => {
    expect(slotDurations(summary, { ...DEFAULT_SHOP_SETTINGS, safeHandlingTowardSlowEnd_pct: 0 }).quenchToHandling_s).toBe(summary.quenchToHandling_s)
  })
})
