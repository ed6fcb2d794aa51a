import { describe, expect, it } from 'vitest'
import { deviationPlanFromSummary, findDeviations, measureTimes } from '../../../server/records/deviations'
import type { DeviationPlan, TimedEvent } from '../../../shared/types/records'
import type { PlanSummary } from '../../../shared/types/plan'

// Plan: heat-up 1 h 10 min, soak at least 1 h, transfer at most 30 s, handling 16 min 40 s after the quench.
const plan: DeviationPlan = { heatUp_s: 4200, minimumSoak_s: 3600, quenchDelayAllowance_s: 30, quenchToHandling_s: 1000 }

/** Events at offsets in seconds from 06:00:00 UTC. */
function at(offsets: Partial<Record<TimedEvent['type'], number>>): TimedEvent[] {
  const base = Date.parse('2026-03-04T06:00:00Z')
  return Object.entries(offsets).map(([type, s]) => ({ type: type as TimedEvent['type'], at: new Date(base + s! * 1000).toISOString() }))
}

describe('measureTimes', () => {
  it('heat-up from charge to core at heat, soak to the door opening, delay door to quench, release from the quench', () => {
    // heat-up 4300 − 0; soak 8000 − 4300 = 3700; delay 8025 − 8000 = 25; release 9225 − 8025 = 1200
    expect(measureTimes(at({ charged: 0, soaking: 4300, furnace_opened: 8000, quenched: 8025, released: 9225 }))).toEqual({
      heatUp_s: 4300,
      soak_s: 3700,
      quenchDelay_s: 25,
      quenchToRelease_s: 1200,
    })
  })

  it('derives nothing from the plan: without core at heat no heat-up or soak; without the door tap no quench delay', () => {
    expect(measureTimes(at({ charged: 0, quenched: 7500 }))).toEqual({ heatUp_s: null, soak_s: null, quenchDelay_s: null, quenchToRelease_s: null })
  })

  it('without the door tap the soak ends at the quench, the latest moment the load can have left', () => {
    // 7500 − 4200 = 3300
    expect(measureTimes(at({ charged: 0, soaking: 4200, quenched: 7500 }))).toMatchObject({ soak_s: 3300, quenchDelay_s: null })
  })

  it('a state entered twice counts from the first time', () => {
    const events = [...at({ quenched: 100, released: 1300 }), ...at({ quenched: 400 })]
    expect(measureTimes(events).quenchToRelease_s).toBe(1200)
  })

  it('refuses an unreadable time', () => {
    expect(() => measureTimes([{ type: 'charged', at: 'yesterday' }])).toThrow('Event charged has an unreadable time: yesterday')
  })
})

describe('findDeviations', () => {
  it('a load run to plan has none', () => {
    // heat-up 4200 s, soak 3600 s, delay 30 s, release at 1000 s, each exactly at its limit: limits are inclusive
    expect(findDeviations(plan, at({ charged: 0, soaking: 4200, furnace_opened: 7800, quenched: 7830, released: 8830 }))).toEqual([])
  })

  it('a span within the records\' 1 ms resolution of its limit meets it: instants are whole milliseconds, plan figures are not', () => {
    const fractional: DeviationPlan = { heatUp_s: 4200.0004, minimumSoak_s: 3600.0009, quenchDelayAllowance_s: 29.9995, quenchToHandling_s: 1000.0008 }
    expect(findDeviations(fractional, at({ charged: 0, soaking: 4200, furnace_opened: 7800, quenched: 7830, released: 8830 }))).toEqual([])
    // One millisecond more than the resolution is a deviation again: 4200 s against 4200.0011 s.
    expect(findDeviations({ ...fractional, heatUp_s: 4200.0011 }, at({ charged: 0, soaking: 4200 })).map((d) => d.rule)).toEqual(['short_heat_up'])
  })

  it('heat-up shorter than predicted: core at heat 14 s after charging against 2 min 39 s is 2 min 25 s sooner', () => {
    // An early tap seen on a tablet: 159 − 14 = 145 s = 2 min 25 s
    const shortPlan: DeviationPlan = { heatUp_s: 159, minimumSoak_s: 120, quenchDelayAllowance_s: 20, quenchToHandling_s: 600 }
    expect(findDeviations(shortPlan, at({ charged: 0, soaking: 14 }))).toEqual([
      {
        rule: 'short_heat_up',
        planned_s: 159,
        actual_s: 14,
        excess_s: 145,
        message: 'Core at heat recorded 14 s after charging, 2 min 25 s sooner than the predicted heat-up of 2 min 39 s, so the soak may have been counted before the core was at temperature.',
      },
    ])
  })

  it('a load tapped early: early core-at-heat, 20 s soak to a quench with no door tap, no quench delay derived', () => {
    // heat-up 14 s (145 s short); soak 34 − 14 = 20 s against 120 s (100 s = 1 min 40 s short); door missing: no delay rule
    const shortPlan: DeviationPlan = { heatUp_s: 159, minimumSoak_s: 120, quenchDelayAllowance_s: 20, quenchToHandling_s: 600 }
    const found = findDeviations(shortPlan, at({ charged: 0, soaking: 14, quenched: 34, released: 700 }))
    expect(found.map((d) => [d.rule, d.actual_s, d.excess_s])).toEqual([
      ['short_heat_up', 14, 145],
      ['short_soak', 20, 100],
    ])
    expect(found[1]!.message).toBe('Soak 20 s from core at heat to the quench (door opening not recorded), 1 min 40 s shorter than the planned minimum of 2 min 00 s.')
  })

  it('quench delay is furnace door to quench: 52 s against 30 s is 22 s over', () => {
    expect(findDeviations(plan, at({ furnace_opened: 1000, quenched: 1052 }))).toEqual([
      { rule: 'quench_delay', planned_s: 30, actual_s: 52, excess_s: 22, message: 'Quench delay 52 s from the furnace door opening to the quench, 22 s over the allowed 30 s.' },
    ])
  })

  it('release before the safe-to-handle time: 12 min 30 s against 16 min 40 s is 4 min 10 s early', () => {
    expect(findDeviations(plan, at({ quenched: 0, released: 750 }))).toEqual([
      {
        rule: 'early_release',
        planned_s: 1000,
        actual_s: 750,
        excess_s: 250,
        message: 'Released 12 min 30 s after the quench, 4 min 10 s before the safe-to-handle time of 16 min 40 s.',
      },
    ])
  })

  it('soak shorter than planned to the door opening: 50 min against 1 h is 10 min short', () => {
    expect(findDeviations(plan, at({ soaking: 5000, furnace_opened: 8000, quenched: 8010 }))).toEqual([
      { rule: 'short_soak', planned_s: 3600, actual_s: 3000, excess_s: 600, message: 'Soak 50 min 00 s from core at heat to the load out of the furnace, 10 min 00 s shorter than the planned minimum of 1 h 00 min.' },
    ])
  })

  it('reports every broken rule in process order', () => {
    // heat-up 4000 (200 short), soak 7000 − 4000 = 3000 (600 short), delay 45 (15 over), release 600 (400 early)
    const found = findDeviations(plan, at({ charged: 0, soaking: 4000, furnace_opened: 7000, quenched: 7045, released: 7645 }))
    expect(found.map((deviation) => [deviation.rule, deviation.excess_s])).toEqual([
      ['short_heat_up', 200],
      ['short_soak', 600],
      ['quench_delay', 15],
      ['early_release', 400],
    ])
  })

  it('skips the heat-up and soak rules for a plan without soak planning and a rule whose events are missing', () => {
    const noSoak: DeviationPlan = { ...plan, heatUp_s: null, minimumSoak_s: null }
    expect(findDeviations(noSoak, at({ charged: 0, soaking: 10, quenched: 60, released: 100 }))).toEqual([
      expect.objectContaining({ rule: 'early_release', excess_s: 960 }),
    ])
    expect(findDeviations(plan, at({ furnace_opened: 0 }))).toEqual([])
  })
})

describe('deviationPlanFromSummary', () => {
  const summary: PlanSummary = {
    quenchToHandling_s: 979.5,
    handling_C: 120,
    soak: { furnace_C: 850, heatUp_s: 4200, minimumSoak_s: 3600, total_s: 7800 },
    handlingPointSeries: [],
    heatUpSeries: null,
  }
  it('takes heat-up, soak and handling time from the stored summary and the allowance from the shop', () => {
    expect(deviationPlanFromSummary(summary, 30)).toEqual({ heatUp_s: 4200, minimumSoak_s: 3600, quenchDelayAllowance_s: 30, quenchToHandling_s: 979.5 })
    expect(deviationPlanFromSummary({ ...summary, soak: null }, 45))
      .toEqual({ heatUp_s: null, minimumSoak_s: null, quenchDelayAllowance_s: 45, quenchToHandling_s: 979.5 })
  })
})
