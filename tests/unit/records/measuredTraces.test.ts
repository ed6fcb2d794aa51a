import { describe, expect, it } from 'vitest'
import { DEMO_PLANS } from '../../../server/db/demo/plans'
import { computePlan, isTemperatureDependent } from '../../../server/planning/computePlan'
import { alignedTraces, alignment, comparisonLine, thinPoints, type LoadLog } from '../../../server/records/measuredTraces'
import { bandCurves, bandSeriesOf, slowEndAt } from '../../../server/records/predictedBand'
import { pointValue } from '../../../shared/pointSeries'
import { resolveDemo } from '../../support/demoPlans'

const quenchTap_ms = Date.parse('2026-03-04T06:15:00Z')
const log = (overrides: Partial<LoadLog> = {}): LoadLog => ({
  id: 7,
  fileName: 'kb-load.csv',
  sha256: 'ab'.repeat(32),
  startedAt: null,
  quenchAtLog_s: null,
  t_s: [0, 10, 20],
  channels: [{ name: 'TC1', T_C: [850, 600, 400] }, { name: 'TC2', T_C: [850, 700, 500] }],
  ...overrides,
})

describe('alignment on the quench tap', () => {
  it('the uploader\'s offset wins: the quench tapped 95 s into the log', () => {
    expect(alignment(log({ quenchAtLog_s: 95 }), quenchTap_ms)).toEqual({ quenchAtLog_s: 95, alignment: 'the quench tap is 1 min 35 s into the log, as the uploader gave it' })
  })

  it('a start time gives the tap\'s log time: started 06:12:30, tapped 06:15:00, so 150 s in', () => {
    expect(alignment(log({ startedAt: new Date('2026-03-04T06:12:30Z') }), quenchTap_ms)).toEqual({
      quenchAtLog_s: 150,
      alignment: 'the log started at 2026-03-04 06:12:30 UTC, so the quench tap is 2 min 30 s into the log',
    })
    // A logger started after the tap: its rows sit after the quench.
    expect(alignment(log({ startedAt: new Date('2026-03-04T06:15:40Z') }), quenchTap_ms).quenchAtLog_s).toBe(-40)
  })

  it('neither given: the first row is the tap', () => {
    expect(alignment(log(), quenchTap_ms).quenchAtLog_s).toBe(0)
  })

  it('puts every channel of every log on the quench clock', () => {
    const traces = alignedTraces([log({ quenchAtLog_s: 10 })], quenchTap_ms)
    expect(traces.map((t) => [t.label, t.t_s])).toEqual([
      ['kb-load.csv · TC1', [-10, 0, 10]],
      ['kb-load.csv · TC2', [-10, 0, 10]],
    ])
  })
})

describe('thinPoints', () => {
  it('keeps every stride-th point and the last, at most the maximum', () => {
    const points = Array.from({ length: 1001 }, (_, i) => ({ t_s: i, T_C: 1000 - i }))
    const kept = thinPoints(points, 300)
    expect(kept.length).toBeLessThanOrEqual(300)
    expect(kept[0]).toEqual({ t_s: 0, T_C: 1000 })
    expect(kept.at(-1)).toEqual({ t_s: 1000, T_C: 0 })
    expect(thinPoints(points.slice(0, 10), 300)).toHaveLength(10)
  })
})

describe('comparisonLine', () => {
  it('says the reading at release against the slow end and the crossing against the prediction', () => {
    const comparison = { atRelease_C: 99.33, slowEndAtRelease_C: 91.75, reachedHandling_s: 894.95, predictedHandling_s: 800, logEnd_s: 1800 }
    expect(comparisonLine({ label: 'kb-load.csv · TC1', comparison }, 100)).toBe(
      'kb-load.csv · TC1: 99.3 °C at the release (slow end of the band 91.8 °C); below 100.0 °C 14 min 55 s after the quench (predicted 13 min 20 s).',
    )
    expect(comparisonLine({ label: 'TC1', comparison: { ...comparison, atRelease_C: null, reachedHandling_s: null } }, 100)).toBe(
      'TC1: the log does not cover the release; not below 100.0 °C by the end of the log, 30 min 00 s after the quench (predicted 13 min 20 s).',
    )
  })
})

describe('the band on the record', () => {
  const temperatureDependent = DEMO_PLANS.filter((p) => isTemperatureDependent(resolveDemo(p)))
  const constantProperty = DEMO_PLANS.filter((p) => !temperatureDependent.includes(p))
  // The same low and high runs the planner draws as its band (computePlan), kept as series so the release tap can be read anywhere.
  it.each(constantProperty.map((p) => [p.name, p] as const))(
    '%s: matches the planner\'s band and its slow end crosses the handling temperature at the summary\'s slow-end time',
    (_name, demo) => {
      const plan = resolveDemo(demo)
      const result = computePlan(plan)
      const band = bandSeriesOf(plan)!
      result.curve.t_s.forEach((t, i) => {
        if (t <= 0) return
        expect(pointValue(band.low, t)).toBeCloseTo(result.band.low.handling_C[i]!, 6)
        expect(pointValue(band.high, t)).toBeCloseTo(result.band.high.handling_C[i]!, 6)
      })
      expect(slowEndAt(band, result.summary.slowEndToHandling_s!)).toBeCloseTo(plan.handling.below_C, 1)
      const curves = bandCurves(band, 1000, 10)
      expect(curves.slow).toHaveLength(11)
      curves.slow.forEach((p, i) => expect(p.T_C).toBeGreaterThanOrEqual(curves.fast[i]!.T_C))
    },
    30_000,
  )

  it.each(temperatureDependent.map((p) => [p.name, p] as const))('%s, temperature-dependent: read from its summary, the same runs compacted, no engine run on the request thread', (_name, demo) => {
    const plan = resolveDemo(demo)
    const result = computePlan(plan)
    const stored = result.summary.bandPointSeries!
    // Spec unreadable on purpose: a band that came from the spec would be null.
    const band = bandSeriesOf({ name: 'not a plan' }, result.summary)!
    expect(band).toBe(stored)
    // Within the compaction's 0.1 K of the planner's own band runs, wherever the planner drew them (0.2 K allowed between check points).
    result.curve.t_s.forEach((t, i) => {
      if (t <= 0) return
      expect(Math.abs(pointValue(band.low, t) - result.band.low.handling_C[i]!)).toBeLessThan(0.2)
      expect(Math.abs(pointValue(band.high, t) - result.band.high.handling_C[i]!)).toBeLessThan(0.2)
    })
    // Exact at the band's own handling moments (compaction knots).
    expect(slowEndAt(band, result.summary.slowEndToHandling_s!)).toBeCloseTo(plan.handling.below_C, 6)
  }, 60_000)

  it('is null for a spec the engine cannot run again', () => {
    expect(bandSeriesOf({ name: 'not a plan' })).toBeNull()
  })
})
