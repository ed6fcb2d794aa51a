/**
 * A fit made into a medium's band (server/measurements/calibratedBand.ts): the fitted
 * curve is the typical curve, the low and high curves keep the medium's own band
 * ratios at each knot, widened to the fit's ±2 standard uncertainties where those are
 * wider; the result passes the library's own rules (checkCurves' order).
 *
 * Outside references: the still-oil entry's single coefficients are the ends and middle
 * of the published still-oil range, 1000–1500 W/m²K (Totten, Bates & Clinton, Handbook
 * of Quenchants and Quenching Technology, ASM 1993, table of mean coefficients; from
 * memory), so its ratios are 1000/1250 = 0.8 and 1500/1250 = 1.2; the widened ends are
 * the closed form h·e^(±2σ/h); a ratio between curve points is the ratio of the two
 * curves' linear interpolants.
 */
import { describe, expect, it } from 'vitest'
import { bandRatios, calibratedBand, flatCurveTemperatures, type MediumBand } from '../../../server/measurements/calibratedBand'
import { DEMO_QUENCHANTS } from '../../../server/db/demo/quenchants'
import { quenchantInputSchema } from '../../../shared/schemas/quenchant'
import type { CalibrationKnot } from '../../../shared/types/calibration'

const stillOil = quenchantInputSchema.parse(DEMO_QUENCHANTS.find((q) => q.name === 'Fast quench oil, still'))
const withoutCurves: MediumBand = { ...stillOil, coolingCurves: null }

const knot = (T_C: number, h: number, uncertainty: number | null): CalibrationKnot => ({ T_C, h, uncertainty, points: 40, determined: uncertainty !== null })
const series = (measured_C: number[]) => ({ t_s: measured_C.map((_, i) => i), measured_C, fitted_C: measured_C, surface_C: measured_C })

describe('the band kept around a fitted curve', () => {
  it('keeps the published still-oil ratios 0.8 and 1.2 at every knot when the fit is tighter than the band', () => {
    const fit = { hCurve: [knot(100, 400, 8), knot(400, 1800, 20), knot(700, 900, 30)], series: series([850, 60]) }
    const band = calibratedBand(withoutCurves, fit)
    expect(band.coolingCurves.typical).toEqual([{ T_C: 100, h: 400 }, { T_C: 400, h: 1800 }, { T_C: 700, h: 900 }])
    expect(band.coolingCurves.low.map((p) => p.h)).toEqual([400 * 0.8, 1800 * 0.8, 900 * 0.8].map((h) => expect.closeTo(h, 9)))
    expect(band.coolingCurves.high.map((p) => p.h)).toEqual([400 * 1.2, 1800 * 1.2, 900 * 1.2].map((h) => expect.closeTo(h, 9)))
    // A curve fit leaves the single coefficients as they were.
    expect([band.hLow_W_m2K, band.hTypical_W_m2K, band.hHigh_W_m2K]).toEqual([1000, 1250, 1500])
  })

  it('widens a knot to h·e^(±2σ/h) where the fit is less sure than the band (σ/h = 0.2: e^0.4 = 1.4918)', () => {
    const band = calibratedBand(withoutCurves, { hCurve: [knot(100, 400, 8), knot(400, 1000, 200), knot(700, 900, null)], series: series([850, 60]) })
    expect(band.coolingCurves.high[1]!.h).toBeCloseTo(1000 * Math.exp(0.4), 6)
    expect(band.coolingCurves.low[1]!.h).toBeCloseTo(1000 * Math.exp(-0.4), 6)
    expect(band.coolingCurves.high[1]!.h).toBeCloseTo(1491.82, 2)
    // An undetermined knot has no uncertainty to widen by: the medium's ratios stand.
    expect(band.coolingCurves.low[2]!.h).toBeCloseTo(720, 9)
  })

  it('reads the ratios off the medium’s own curves, as the ratio of their interpolants between points', () => {
    const medium: MediumBand = {
      ...withoutCurves,
      coolingCurves: {
        low: [{ T_C: 100, h: 50 }, { T_C: 500, h: 450 }, { T_C: 900, h: 450 }],
        typical: [{ T_C: 100, h: 100 }, { T_C: 500, h: 500 }, { T_C: 900, h: 500 }],
        high: [{ T_C: 100, h: 300 }, { T_C: 500, h: 600 }, { T_C: 900, h: 600 }],
      },
    }
    // At 300 °C: low 250, typical 300, high 450 by linear interpolation.
    expect(bandRatios(medium, 300).low).toBeCloseTo(250 / 300, 12)
    expect(bandRatios(medium, 300).high).toBeCloseTo(1.5, 12)
    // Beyond the ends the curves hold their end values.
    expect(bandRatios(medium, 20)).toEqual({ low: 0.5, high: 3 })
  })

  it('a constant fit becomes a flat typical curve and the typical coefficient, with the band ratios kept', () => {
    const band = calibratedBand(stillOil, { h: { value: 1800, uncertainty: 9 }, series: series([848, 500, 61]) })
    // The flat curve sits at the medium's own curve points.
    expect(band.coolingCurves.typical.map((p) => p.T_C)).toEqual(stillOil.coolingCurves!.typical.map((p) => p.T_C))
    expect(new Set(band.coolingCurves.typical.map((p) => p.h))).toEqual(new Set([1800]))
    expect(band.hTypical_W_m2K).toBe(1800)
    expect(band.hLow_W_m2K).toBeCloseTo(1440, 9)
    expect(band.hHigh_W_m2K).toBeCloseTo(2160, 9)
    // A medium without curves: the log's own span, lowest, middle and highest.
    expect(flatCurveTemperatures(withoutCurves, [848, 500, 61])).toEqual([61, 454.5, 848])
  })

  it('what it builds passes the library’s rules, low ≤ typical ≤ high at every point of every curve', () => {
    for (const medium of DEMO_QUENCHANTS.map((q) => quenchantInputSchema.parse(q))) {
      const fit = { hCurve: [knot(80, 350, 3), knot(300, 900, 60), knot(550, 3200, 900), knot(800, 700, null)], series: series([850, 60]) }
      const saved = quenchantInputSchema.safeParse({ ...medium, ...calibratedBand(medium, fit), curveSource: 'calibration', emissivity: null })
      expect(saved.success, medium.name).toBe(true)
    }
  })
})
