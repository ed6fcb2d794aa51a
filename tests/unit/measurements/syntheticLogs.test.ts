/**
 * Calibration figures on synthetic logs: the eigenmode engine (runCase, the
 * product's own temperature-dependent path) cools a body with a known h(T_s) curve,
 * seeded Gaussian noise of 0.3 K standard deviation is added, and the fit must
 * reproduce the log within 0.5 K rms; the fitted curve must then re-predict a
 * different part (another size and material) within 2 % of the time the true curve
 * gives. The logs come from probes of the standard probe's alloy (Inconel 600) in
 * three shapes and sizes; the re-predicted part is steel. The fit's own forward
 * model (Crank–Nicolson, 32 cells) is checked against the engine here as well.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { fitCoolingLog, type FitResult } from '../../../server/measurements/fit'
import { forwardTemperatures } from '../../../server/measurements/forwardModel'
import { parseFit } from '../../../server/measurements/fitSchema'
import { ISO_9950_PROBE } from '../../../server/measurements/probes'
import { caseToProblem, parseCase } from '../../../server/thermal/caseSchema'
import { solveCrankNicolsonNonlinear } from '../../../server/thermal/crankNicolsonNonlinear'
import { runCase } from '../../../server/thermal/runCase'
import { STEEL_K, STEEL_RHO_CP } from '../thermal/quenchFixtures'
import { gaussianNoise } from './noise'

/** The part re-predicted: steel of constant properties near 850 °C (the engine tests' own). */
const steel = { k: STEEL_K, rho: 7650, cp: STEEL_RHO_CP / 7650 }
const probeAlloy = ISO_9950_PROBE.material

interface SyntheticCase {
  name: string
  geometry: 'slab' | 'rod' | 'sphere'
  size_m: number
  material: unknown
  at: 'centre' | { x: number }
  ambient_C: number
  knots_C: number[]
  h: number[]
  t_s: number[]
}

const every = (n: number, step: number) => Array.from({ length: n }, (_, i) => i * step)

// Curve shapes of the trade (common practice, from memory): an oil with a vapour
// blanket above ~700 °C and a boiling peak near 500 °C; a polymer solution with a
// higher, earlier peak.
const CASES: SyntheticCase[] = [
  {
    name: 'standard probe (ISO 9950 Inconel rod) in an oil, centre thermocouple',
    geometry: 'rod',
    size_m: ISO_9950_PROBE.size_m,
    material: ISO_9950_PROBE.material,
    at: 'centre',
    ambient_C: 60,
    knots_C: [60, 200, 350, 500, 650, 750, 850],
    h: [300, 800, 2500, 3500, 2000, 700, 500],
    t_s: every(400, 0.15),
  },
  {
    name: 'Inconel 600 ball of radius 8 mm in a polymer solution, centre thermocouple',
    geometry: 'sphere',
    size_m: 0.008,
    material: probeAlloy,
    at: 'centre',
    ambient_C: 40,
    knots_C: [40, 150, 300, 450, 600, 750, 850],
    h: [900, 2500, 5500, 4500, 2500, 1200, 900],
    // The ball's surface falls through the vapour phase in half a second: a fast logger.
    t_s: every(500, 0.05),
  },
  {
    name: 'Inconel 600 plate 10 mm thick in an oil, thermocouple half-way to the face',
    geometry: 'slab',
    size_m: 0.005,
    material: probeAlloy,
    at: { x: 0.5 },
    ambient_C: 60,
    knots_C: [60, 250, 450, 600, 750, 850],
    h: [350, 1500, 3200, 2200, 800, 550],
    t_s: every(300, 0.2),
  },
]

const hCurveOf = (c: SyntheticCase, h: number[]) => c.knots_C.map((T_C, i) => ({ T_C, h: h[i] }))

function engineLog(c: SyntheticCase): number[] {
  const result = runCase({
    geometry: c.geometry,
    size_m: c.size_m,
    material: c.material,
    initial_C: 850,
    stages: [{ surface: { hCurve: hCurveOf(c, c.h), ambient_C: c.ambient_C } }],
    times_s: c.t_s,
    points: [c.at === 'centre' ? 0 : c.at.x],
  })
  return result.table.T_C.map((row) => row[0])
}

/**
 * Time for the centre of a steel rod of radius 15 mm to cool from 850 °C to 200 °C
 * with the given curve: the engine's fine-grid check (400 cells, the grid its own
 * tests refine to convergence), read every 0.05 s and interpolated; the eigenmode
 * path would take minutes on a shared machine for six of these.
 */
function steelRodTime(hCurve: { T_C: number; h: number }[], ambient_C: number): number {
  const problem = caseToProblem(parseCase({ geometry: 'rod', size_m: 0.015, material: steel, initial_C: 850, stages: [{ surface: { hCurve, ambient_C } }] }))
  const times = every(2401, 0.05)
  const centre = solveCrankNicolsonNonlinear(problem, { times_s: times, points: [0], cells: 400, rampRate: 0.01 }).T_C.map((row) => row[0])
  const i = centre.findIndex((T) => T < 200)
  if (i < 1) throw new Error('the rod did not reach 200 °C within 120 s')
  return times[i - 1] + ((centre[i - 1] - 200) / (centre[i - 1] - centre[i])) * (times[i] - times[i - 1])
}

describe.each(CASES)('a synthetic log: $name', (c) => {
  let clean: number[]
  let fit: FitResult
  beforeAll(() => {
    clean = engineLog(c)
    const noise = gaussianNoise(0.3, 20261202)
    const logged = clean.map((T, i) => (i === 0 ? T : T + noise()))
    fit = fitCoolingLog({ geometry: c.geometry, size_m: c.size_m, material: c.material, initial_C: 850, ambient_C: c.ambient_C, at: c.at, log: { t_s: c.t_s, T_C: logged }, model: { kind: 'curve', knots_C: c.knots_C } })
  }, 240_000)

  it('the fit reproduces the log within 0.5 K rms, every knot determined', () => {
    expect(fit.rms_K).toBeLessThan(0.5)
    expect(fit.hCurve?.every((k) => k.determined)).toBe(true)
    expect(fit.warnings).toEqual([])
  })

  it('each fitted knot lies within three standard uncertainties (or 3 %) of the true curve', () => {
    fit.hCurve?.forEach((k, i) => expect(Math.abs(k.h - c.h[i])).toBeLessThan(Math.max(3 * (k.uncertainty as number), 0.03 * c.h[i])))
  })

  it('the fit forward model stays within 0.25 K of the eigenmode engine on the true curve', () => {
    const fc = parseFit({ geometry: c.geometry, size_m: c.size_m, material: c.material, initial_C: 850, ambient_C: c.ambient_C, at: c.at, log: { t_s: c.t_s, T_C: clean }, model: { kind: 'curve', knots_C: c.knots_C } })
    const model = forwardTemperatures(fc.problem, fc.x, fc.ambient_C, { hCurve: c.knots_C.map((T_C, i) => ({ T_C, h_W_m2K: c.h[i] })) }, c.t_s)
    const worst = Math.max(...clean.map((T, i) => Math.abs(model.thermocouple_C[i] - T)))
    expect(worst).toBeLessThan(0.25)
  })

  it('the fitted curve re-predicts a steel rod of radius 15 mm within 2 % of the true curve', () => {
    const trueTime = steelRodTime(hCurveOf(c, c.h), c.ambient_C)
    const fittedTime = steelRodTime((fit.hCurve ?? []).map((k) => ({ T_C: k.T_C, h: k.h })), c.ambient_C)
    expect(Math.abs(fittedTime - trueTime) / trueTime).toBeLessThan(0.02)
  }, 240_000)
})
