import { describe, expect, it } from 'vitest'
import { compareTrace, findTraceDeviations, reachedHandling_s, slowCoolingTolerance_s, temperatureAt, type TracePlan, type TraceToJudge } from '../../../server/records/deviations'

/**
 * Synthetic traces from a closed form: a lumped body (Bi ≪ 0.1) quenched from 850 °C
 * into a 60 °C bath cools as T(t) = 60 + 790·e^(−t/τ) (Newton cooling, the exponential
 * solution of ρcV dT/dt = −hA(T − T∞)). Its handling-temperature crossing is
 * t = τ·ln(790 / (T_h − 60)), exact; the rules must find it from sampled rows.
 */
const bath_C = 60
const lumped = (tau_s: number) => (t: number) => bath_C + 790 * Math.exp(-t / tau_s)
const crossing = (tau_s: number, handling_C: number) => tau_s * Math.log(790 / (handling_C - bath_C))

/** Rows every `step_s` from `from_s` to `to_s` seconds after the quench; before the tap the logger reads the furnace. */
function sampled(label: string, tau_s: number, from_s: number, to_s: number, step_s = 5): TraceToJudge {
  const t_s: number[] = []
  const T_C: number[] = []
  for (let t = from_s; t <= to_s + 1e-9; t += step_s) {
    t_s.push(t)
    T_C.push(t < 0 ? 850 : lumped(tau_s)(t))
  }
  return { label, t_s, T_C }
}

const plan = (overrides: Partial<TracePlan> = {}): TracePlan => ({
  handling_C: 100,
  quenchToHandling_s: 800,
  quenchToRelease_s: 900,
  slowEnd_C: lumped(320),
  ...overrides,
})

describe('temperatureAt and reachedHandling_s', () => {
  it('finds the closed-form crossing τ·ln(790/40) = 894.95 s for τ = 300 s from rows 5 s apart, within 0.1 s', () => {
    const trace = sampled('TC1', 300, -60, 1800)
    expect(crossing(300, 100)).toBeCloseTo(894.95, 2)
    expect(reachedHandling_s(trace, 100)).toBeCloseTo(crossing(300, 100), 1)
  })

  it('reads between rows by straight lines: at 902.5 s, midway between the rows at 900 and 905 s', () => {
    const trace = sampled('TC1', 300, 0, 1800)
    const expected = (lumped(300)(900) + lumped(300)(905)) / 2
    expect(temperatureAt(trace, 902.5)).toBeCloseTo(expected, 10)
    // Linear reading of e^(−t/τ) over 5 s is within Δt²/8 · |T''| = 25/8 · 39.3/300² ≈ 0.0014 K of the closed form.
    expect(Math.abs(temperatureAt(trace, 902.5)! - lumped(300)(902.5))).toBeLessThan(0.002)
    expect(temperatureAt(trace, 1800.5)).toBeNull()
    expect(temperatureAt(trace, -1)).toBeNull()
  })

  it('ignores rows before the quench tap: a logger started cold reads below the handling point long before the quench', () => {
    const cold: TraceToJudge = { label: 'TC1', t_s: [-7200, -3600, -5, 0, 600, 1200], T_C: [20, 500, 850, 850, lumped(300)(600), lumped(300)(1200)] }
    // The crossing lies between 600 s (171 °C) and 1200 s (74.5 °C) by a straight line: 600 + 600·(171−100)/(171−74.5).
    const T600 = lumped(300)(600)
    const T1200 = lumped(300)(1200)
    expect(reachedHandling_s(cold, 100)).toBeCloseTo(600 + (600 * (T600 - 100)) / (T600 - T1200), 9)
  })

  it('is null when no row after the quench reaches the handling temperature', () => {
    expect(reachedHandling_s(sampled('TC1', 600, 0, 700), 100)).toBeNull()
  })
})

describe('slowCoolingTolerance_s', () => {
  it.each([
    // 5 % of the predicted time, never under 30 s (the rule's stated tolerance)
    [100, 30],
    [600, 30],
    [800, 40],
    [3600, 180],
  ])('predicted %d s: %d s', (predicted, tolerance) => {
    expect(slowCoolingTolerance_s(predicted)).toBeCloseTo(tolerance, 9)
  })
})

describe('findTraceDeviations', () => {
  it('cooling slower than planned: the trace reaches 100 °C at 894.9 s against a predicted 800 s (limit 840 s)', () => {
    const trace = sampled('kb-log.csv · TC1', 300, -60, 1800)
    const [slow] = findTraceDeviations(plan({ slowEnd_C: null }), [trace])
    expect(slow).toMatchObject({ rule: 'slow_cooling', planned_s: 800, trace: 'kb-log.csv · TC1' })
    expect(slow!.actual_s).toBeCloseTo(crossing(300, 100), 1)
    expect(slow!.excess_s).toBeCloseTo(crossing(300, 100) - 800, 1)
    expect(slow!.message).toBe(
      'kb-log.csv · TC1 reached the handling temperature of 100.0 °C 14 min 55 s after the quench, 1 min 35 s later than the predicted 13 min 20 s (tolerance 40 s).',
    )
  })

  it('a crossing within the tolerance is no deviation: 894.9 s against a predicted 870 s (limit 913.5 s)', () => {
    expect(findTraceDeviations(plan({ quenchToHandling_s: 870, slowEnd_C: null }), [sampled('TC1', 300, 0, 1800)])).toEqual([])
  })

  it('a log that ends above the handling temperature after the limit is slow; one that ends sooner is not judged', () => {
    // τ = 600 s: 60 + 790·e^(−2) = 166.9 °C at 1200 s, still above 100 °C
    const long = findTraceDeviations(plan({ slowEnd_C: null }), [sampled('TC1', 600, 0, 1200)])
    expect(long).toMatchObject([{ rule: 'slow_cooling', planned_s: 800, actual_s: 1200, excess_s: 400 }])
    expect(long[0]!.message).toContain('was still above the handling temperature of 100.0 °C when the log ended 20 min 00 s after the quench')
    expect(findTraceDeviations(plan({ slowEnd_C: null }), [sampled('TC1', 600, 0, 835)])).toEqual([])
  })

  it('measured core above the band at release: 99.3 °C at 900 s against a slow end (τ 280 s) of 91.7 °C', () => {
    // Measured: 60 + 790·e^(−3) = 99.33 °C; slow end: 60 + 790·e^(−900/280) = 91.75 °C; 7.6 K above.
    const trace = sampled('TC1', 300, 0, 1800)
    const found = findTraceDeviations(plan({ quenchToHandling_s: 900, slowEnd_C: lumped(280) }), [trace])
    expect(found.map((d) => d.rule)).toEqual(['above_band_at_release'])
    expect(found[0]!.measured_C).toBeCloseTo(lumped(300)(900), 9)
    expect(found[0]!.limit_C).toBeCloseTo(lumped(280)(900), 12)
    expect(found[0]!.measured_C).toBeCloseTo(99.33, 2)
    expect(found[0]!.limit_C).toBeCloseTo(91.75, 2)
    expect(found[0]!.message).toBe('TC1 read 99.3 °C at the release, 15 min 00 s after the quench: 7.6 K above the slow end of the predicted band (91.7 °C).')
  })

  it('below the slow end at release (τ 320 s gives 107.4 °C) is no deviation; nor is a release the log does not cover', () => {
    const trace = sampled('TC1', 300, 0, 1800)
    expect(findTraceDeviations(plan({ quenchToHandling_s: 900, slowEnd_C: lumped(320) }), [trace])).toEqual([])
    expect(findTraceDeviations(plan({ quenchToHandling_s: 900, slowEnd_C: lumped(280) }), [sampled('TC1', 300, 0, 880)])).toEqual([])
  })

  it('judges each trace on its own and compares with the numbers the sheet prints', () => {
    const core = sampled('core', 300, 0, 1800)
    const coupon = sampled('coupon', 200, 0, 1800)
    const p = plan({ quenchToHandling_s: 900, slowEnd_C: lumped(280) })
    // The coupon (τ 200 s) reads 60 + 790·e^(−4.5) = 68.8 °C at 900 s and crosses 100 °C at 596.6 s: within the plan.
    expect(findTraceDeviations(p, [core, coupon]).map((d) => `${d.trace}:${d.rule}`)).toEqual(['core:above_band_at_release'])
    const c = compareTrace(p, coupon)
    expect(c.atRelease_C).toBeCloseTo(lumped(200)(900), 9)
    expect(c.reachedHandling_s).toBeCloseTo(crossing(200, 100), 0)
    expect(c).toMatchObject({ predictedHandling_s: 900, logEnd_s: 1800 })
  })
})
