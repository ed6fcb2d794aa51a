/**
 * The constant-h fit against the closed-form series: logs of the centre excess
 * ratio θ = Σ C_n exp(−λ_n² Fo) of a uniform start (six terms; the roots λ_n and
 * coefficients C_n computed with mpmath by scripts/reference/generate.py), for a
 * body of constant properties at a Biot number of the reference grid. The fit must
 * return h = Bi·k/L.
 */
import { describe, expect, it } from 'vitest'
import { fitCase, fitCoolingLog, type FitProgress } from '../../../server/measurements/fit'
import { parseFit } from '../../../server/measurements/fitSchema'
import { biotRoots } from '../../support/referenceValues'
import { gaussianNoise } from './noise'
import type { Geometry } from '../../../server/thermal/types'

const k = 26
const rhoCp = 7650 * 620
const alpha = k / rhoCp
const INITIAL_C = 850
const BATH_C = 60

function seriesLog(geometry: Geometry, bi: number, size_m: number) {
  const row = biotRoots.find((r) => r.geometry === geometry && r.bi === bi)
  if (!row) throw new Error(`no reference roots for ${geometry} at Bi = ${bi}`)
  // Fo from 0.05 (six terms are then exact to 1e-6) to 1.5, 300 points.
  const fo = Array.from({ length: 300 }, (_, i) => 0.05 + (i * 1.45) / 299)
  const theta = fo.map((f) => row.roots.reduce((sum, lambda, n) => sum + row.coefficients[n] * Math.exp(-lambda * lambda * f), 0))
  return { t_s: fo.map((f) => (f * size_m * size_m) / alpha), T_C: theta.map((th) => BATH_C + (INITIAL_C - BATH_C) * th) }
}

const cases: { geometry: Geometry; bi: number; size_m: number }[] = [
  { geometry: 'slab', bi: 1, size_m: 0.01 }, // generate.py biotRoots, slab row Bi = 1
  { geometry: 'rod', bi: 2, size_m: 0.0125 }, // generate.py biotRoots, rod row Bi = 2
  { geometry: 'sphere', bi: 5, size_m: 0.02 }, // generate.py biotRoots, sphere row Bi = 5
]

describe.each(cases)('constant h of a $geometry at Bi = $bi (closed-form series)', ({ geometry, bi, size_m }) => {
  const trueH = (bi * k) / size_m
  const input = (T_C: number[], t_s: number[]) => ({
    geometry,
    size_m,
    material: { k, rho: 7650, cp: 620 },
    initial_C: INITIAL_C,
    ambient_C: BATH_C,
    at: 'centre' as const,
    log: { t_s, T_C },
    model: { kind: 'constant' as const },
  })

  it('recovers h = Bi·k/L within 0.5 % from the exact log', () => {
    const log = seriesLog(geometry, bi, size_m)
    const fit = fitCoolingLog(input(log.T_C, log.t_s))
    expect(Math.abs((fit.h?.value as number) / trueH - 1)).toBeLessThan(0.005)
    expect(fit.rms_K).toBeLessThan(0.1)
  })

  it('with 0.3 K of noise: within 0.5 K rms, h within 2 % and within three standard uncertainties', () => {
    const log = seriesLog(geometry, bi, size_m)
    const noise = gaussianNoise(0.3, 7)
    const fit = fitCoolingLog(input(log.T_C.map((T) => T + noise()), log.t_s))
    const h = fit.h as { value: number; uncertainty: number }
    expect(fit.rms_K).toBeLessThan(0.5)
    expect(Math.abs(h.value / trueH - 1)).toBeLessThan(0.02)
    expect(Math.abs(h.value - trueH)).toBeLessThan(3 * h.uncertainty + 0.005 * trueH)
  })
})

describe('a knot the log cannot reach', () => {
  it('is reported undetermined, with no uncertainty, not as a confident number', () => {
    const log = seriesLog('rod', 2, 0.0125)
    const fit = fitCoolingLog({
      geometry: 'rod',
      size_m: 0.0125,
      material: { k, rho: 7650, cp: 620 },
      initial_C: INITIAL_C,
      ambient_C: BATH_C,
      at: 'centre',
      log,
      model: { kind: 'curve', knots_C: [60, 300, 600, 850, 1000] },
    })
    const top = fit.hCurve?.find((knot) => knot.T_C === 1000)
    expect(top).toMatchObject({ determined: false, uncertainty: null, points: 0 })
    expect(fit.warnings.some((w) => w.startsWith('knot at 1000 °C is not determined by the log'))).toBe(true)
    expect(fit.hCurve?.filter((knot) => knot.T_C < 700).every((knot) => knot.determined)).toBe(true)
  })
})

describe('progress of a fit', () => {
  it('is told once per accepted step, its misfit never rising, ending at the result', () => {
    const log = seriesLog('slab', 1, 0.01)
    const steps: FitProgress[] = []
    const material = { k, rho: 7650, cp: 620 }
    const fit = fitCase(parseFit({ geometry: 'slab', size_m: 0.01, material, initial_C: INITIAL_C, ambient_C: BATH_C, at: 'centre', log, model: { kind: 'constant' } }), (p) => steps.push(p))
    expect(steps.map((s) => s.iteration)).toEqual(Array.from({ length: fit.iterations }, (_, i) => i + 1))
    steps.slice(1).forEach((s, i) => expect(s.rms_K).toBeLessThanOrEqual(steps[i]!.rms_K))
    // A constant model has no smoothness rows, so the last step's misfit is the result's.
    expect(steps.at(-1)!.rms_K).toBeCloseTo(fit.rms_K, 12)
  })
})
