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
  it('soak from the soak event to the furnace opening; delay and release from the quench', () => {
    // soaking 4300 s, opened 4300 + 3700 = 8000 s, quenched 8025 s, released 8025 + 1200 = 9225 s
    expect(measureTimes(plan, at({ charged: 0, soaking: 4300, furnace_opened: 8000, quenched: 8025, released: 9225 }))).toEqual({
      soak_s: 3700,
      quenchDelay_s: 25,
      quenchToRelease_s: 1200,
    })
  })

  it('without a soak event the soak starts at charge + planned heat-up; without a furnace opening it ends at the quench', () => {
    // 0 + 4200 = 4200 s soak start; quenched at 7500 s → 3300 s
    expect(measureTimes(plan, at({ charged: 0, quenched: 7500 }))).toEqual({ soak_s: 3300, quenchDelay_s: null, quenchToRelease_s: null })
  })

  it('a state entered twice counts from the first time', () => {
    const events = [...at({ quenched: 100, released: 1300 }), ...at({ quenched: 400 })]
    expect(measureTimes(plan, events).quenchToRelease_s).toBe(1200)
  })

  it('refuses an unreadable time', () => {
    expect(() => measureTimes(plan, [{ type: 'charged', at: 'yesterday' }])).toThrow('Event charged has an unreadable time: yesterday')
  })
})

describe('findDeviations', () => {
  it('a load run to plan has none', () => {
    // soak 3600 s exactly, delay 30 s exactly, release at 1000 s exactly: limits are inclusive
    expect(findDeviations(plan, at({ charged: 0, soaking: 4200, furnace_opened: 7800, quenched: 7830, released: 8830 }))).toEqual([])
  })

  it('quench delay beyond the allowance: 52 s against 30 s is 22 s over', () => {
    expect(findDeviations(plan, at({ furnace_opened: 1000, quenched: 1052 }))).toEqual([
      { rule: 'quench_delay', planned_s: 30, actual_s: 52, excess_s: 22, message: 'Quench delay 52 s, 22 s over the allowed 30 s' },
    ])
  })

  it('release before the predicted handling time: 12 min 30 s against 16 min 40 s is 4 min 10 s early', () => {
    expect(findDeviations(plan, at({ quenched: 0, released: 750 }))).toEqual([
      {
        rule: 'early_release',
        planned_s: 1000,
        actual_s: 750,
        excess_s: 250,
        message: 'Released 12 min 30 s after the quench, 4 min 10 s before the predicted handling time of 16 min 40 s',
      },
    ])
  })

  it('soak shorter than planned from the soak event: 50 min against 1 h is 10 min short', () => {
    expect(findDeviations(plan, at({ soaking: 5000, furnace_opened: 8000, quenched: 8010 }))).toEqual([
      { rule: 'short_soak', planned_s: 3600, actual_s: 3000, excess_s: 600, message: 'Soak 50 min 00 s, 10 min 00 s shorter than the planned 1 h 00 min' },
    ])
  })

  it('soak shorter than planned from charge + heat-up when core-at-temperature was not recorded', () => {
    // charged 0, soak from 4200 s, quenched at 7000 s → 2800 s, 800 s short
    const [deviation] = findDeviations(plan, at({ charged: 0, quenched: 7000 }))
    expect(deviation).toMatchObject({ rule: 'short_soak', actual_s: 2800, excess_s: 800 })
  })

  it('reports every broken rule in process order', () => {
    const found = findDeviations(plan, at({ charged: 0, soaking: 4200, furnace_opened: 7000, quenched: 7045, released: 7645 }))
    expect(found.map((deviation) => [deviation.rule, deviation.excess_s])).toEqual([
      ['short_soak', 800],
      ['quench_delay', 15],
      ['early_release', 400],
    ])
  })

  it('skips the soak rule for a plan without soak planning and a rule whose events are missing', () => {
    const noSoak: DeviationPlan = { ...plan, heatUp_s: null, minimumSoak_s: null }
    expect(findDeviations(noSoak, at({ charged: 0, quenched: 60, released: 100 }))).toEqual([
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
    expect(deviationPlanFromSummary({ ...summary, soak: null }, 45)).toEqual({ heatUp_s: null, minimumSoak_s: null, quenchDelayAllowance_s: 45, quenchToHandling_s: 979.5 })
  })
})
