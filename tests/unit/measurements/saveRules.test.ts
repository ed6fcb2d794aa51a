/**
 * When a fit may be saved as a medium's curve (server/measurements/saveRules.ts). The
 * limit, 5 K rms, is twice the ±2.5 K tolerance of a class 2 type K thermocouple
 * (IEC 60584-1, from memory).
 */
import { describe, expect, it } from 'vitest'
import { MAX_SAVE_RMS_K, saveProblems } from '../../../server/measurements/saveRules'

const knot = (T_C: number, determined: boolean) => ({ T_C, h: 900, uncertainty: determined ? 10 : null, points: determined ? 30 : 1.5, determined })
const fit = (rms_K: number, converged = true, hCurve?: ReturnType<typeof knot>[]) => ({ rms_K, converged, iterations: 12, hCurve })

describe('saving a fit', () => {
  it('takes a settled fit within the limit, twice the class 2 type K tolerance of ±2.5 K', () => {
    expect(MAX_SAVE_RMS_K).toBe(2 * 2.5)
    expect(saveProblems(fit(4.99), false)).toEqual([])
  })

  it('refuses a fit that misses the log by more than 5 K rms, naming the model', () => {
    expect(saveProblems(fit(5.01), false)).toEqual([{ field: 'model', message: expect.stringContaining('misses the log by 5.01 K rms, more than the 5 K') }])
  })

  it('refuses a fit that never settled', () => {
    expect(saveProblems(fit(0.3, false), false)).toEqual([{ field: 'model', message: expect.stringContaining('stopped after 12 iterations without settling') }])
  })

  it('refuses each undetermined knot by its place in the list unless the person confirms', () => {
    const curve = [knot(60, true), knot(400, true), knot(1000, false)]
    expect(saveProblems(fit(0.3, true, curve), false)).toEqual([{ field: 'model.knots_C.2', message: expect.stringContaining('does not determine the knot at 1000 °C') }])
    expect(saveProblems(fit(0.3, true, curve), true)).toEqual([])
  })
})
