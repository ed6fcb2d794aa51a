import { describe, expect, it } from 'vitest'
import { caseToProblem, parseCase } from '../../../server/thermal/caseSchema'
import { solveCrankNicolsonNonlinear } from '../../../server/thermal/crankNicolsonNonlinear'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import { solveTemperatureDependent } from '../../../server/thermal/temperatureDependent'
import type { CooldownProblem, Geometry, Stage } from '../../../server/thermal/types'
import { bisect } from '../../support/bisect'
import { kirchhoffExact, kirchhoffProblem } from './kirchhoff'
import { OIL_CURVE, STEEL_K, STEEL_RHO_CP, steelQuench } from './quenchFixtures'

const oil: Stage['outer'] = { type: 'convective', h_W_m2K: OIL_CURVE[0].h_W_m2K, ambient_C: 60, hCurve: OIL_CURVE }
const airWithRadiation: Stage['outer'] = { type: 'convective', h_W_m2K: 12, ambient_C: 25, emissivity: 0.8 }
const plainWater: Stage['outer'] = { type: 'convective', h_W_m2K: 1500, ambient_C: 30 }

describe('constant-property limit', () => {
  // A flat table, a flat curve and zero emissivity must take today's path: the same numbers to the bit.
  it.each<Geometry>(['slab', 'rod', 'sphere'])('%s: flat tables equal the constant-property series to 1e-9 K', (geometry) => {
    const plain = steelQuench(geometry, 0.02, { type: 'convective', h_W_m2K: 800, ambient_C: 60 })
    const flat: CooldownProblem = {
      ...plain,
      domain: { ...plain.domain, temperatureTable: [20, 500, 900].map((T_C) => ({ T_C, k_W_mK: STEEL_K, rhoCp_J_m3K: STEEL_RHO_CP })) },
      stages: [{ inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 1, ambient_C: 60, emissivity: 0, hCurve: [0, 400, 900].map((T_C) => ({ T_C, h_W_m2K: 800 })) } }],
    }
    const a = solveCooldown(plain, { earliest_s: 0.5 })
    const b = solveCooldown(flat, { earliest_s: 0.5 })
    for (const t of [0.5, 5, 30, 120, 600]) for (const x of [0, 0.5, 1]) expect(Math.abs(a.evaluate(t, x) - b.evaluate(t, x))).toBeLessThan(1e-9)
    expect(b.targetTime('centre', { below_C: 100 })).toBeCloseTo(a.targetTime('centre', { below_C: 100 }) as number, 9)
  })

  // The sub-step engine itself on a constant problem: its basis modes are then the exact modes and the
  // stepped amplitudes decouple, so it follows the closed-form series (checked against Incropera Table 5.1
  // in eigenRoots.test.ts) to its time-stepping accuracy, which its own estimate bounds, and closer as
  // the accuracy asked for tightens.
  it.each<Geometry>(['slab', 'rod', 'sphere'])('%s: the sub-step engine on constant properties follows the series within its estimate', (geometry) => {
    const problem = steelQuench(geometry, 0.025, { type: 'convective', h_W_m2K: 2000, ambient_C: 60 })
    problem.stages = [{ ...problem.stages[0], duration_s: 60 }, { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 20, ambient_C: 25 } }]
    const series = solveCooldown(problem, { earliest_s: 5 })
    const worstAt = (accuracy_K: number) => {
      const steps = solveTemperatureDependent(problem, { earliest_s: 5, accuracy_K })
      let worst = 0
      for (const t of [5, 20, 60, 100, 500, 2000]) for (const x of [0, 0.5, 1]) worst = Math.max(worst, Math.abs(series.evaluate(t, x) - steps.evaluate(t, x)))
      return { worst, estimate: Math.max(...steps.summaries.map((s) => s.estimatedError_K ?? 0)) }
    }
    const standard = worstAt(0.2)
    expect(standard.worst).toBeLessThan(0.05)
    expect(standard.estimate).toBeGreaterThan(standard.worst)
    expect(worstAt(0.02).worst).toBeLessThan(0.01)
  })
})

describe('Kirchhoff closed form (k and ρc both ∝ 1 + βT, fixed surface)', () => {
  it.each<Geometry>(['slab', 'rod', 'sphere'])('%s: centre and mid-radius within 0.2 K, time to 300 °C at the centre within 0.2 % (Carslaw & Jaeger §1.16)', (geometry) => {
    // Read from Fo ≈ 0.15 (5 s): right after the surface is suddenly fixed, the frozen field comes from a
    // series still ringing from the jump, and at Fo = 0.06 (2 s) a sphere's mid-radius is 0.2–0.3 K off.
    const solution = solveTemperatureDependent(kirchhoffProblem(geometry), { earliest_s: 2 })
    for (const t of [5, 10, 20, 40, 80]) for (const x of [0, 0.5]) expect(Math.abs(solution.evaluate(t, x) - kirchhoffExact(geometry, x, t)), `t=${t} x=${x}`).toBeLessThan(0.2)
    const reference = bisect((t) => kirchhoffExact(geometry, 0, t) - 300, 0.5, 500)
    const found = solution.targetTime('centre', { below_C: 300 }) as number
    expect(Math.abs(found / reference - 1)).toBeLessThan(0.002)
  })
})

/** The centre's time to a temperature from Crank–Nicolson sampled densely (linear between samples). */
interface Crossing {
  times: number[]
  centre: number[]
  crossing_s: number
}

function crankNicolsonCrossing(problem: CooldownProblem, below_C: number, end_s: number, cells: number, rampRate: number): Crossing {
  const times = Array.from({ length: 1201 }, (_, i) => (end_s * i) / 1200)
  const centre = solveCrankNicolsonNonlinear(problem, { times_s: times, points: [0], cells, rampRate }).T_C.map((row) => row[0])
  const i = centre.findIndex((T) => T <= below_C)
  const crossing_s = times[i - 1] + ((centre[i - 1] - below_C) / (centre[i - 1] - centre[i])) * (times[i] - times[i - 1])
  return { times, centre, crossing_s }
}

describe('the sub-step series against a converged finite-volume reference', () => {
  // Reference: the non-linear Crank–Nicolson solver at 150 cells and ramp 0.015, then at
  // 300 cells and ramp 0.0075; the test first shows the refinement has stopped changing
  // the answer (≤ 0.05 K, ≤ 0.02 % in time), then holds the series to 0.2 K and 0.2 %.
  const cases: [string, Geometry, number, Stage['outer'], boolean, number, number][] = [
    ['(a) oil h(T) curve', 'rod', 0.025, oil, false, 200, 400],
    ['(a) oil h(T) curve', 'slab', 0.015, oil, false, 200, 300],
    ['(a) oil h(T) curve', 'sphere', 0.03, oil, false, 200, 400],
    ['(b) air, convection and radiation', 'rod', 0.025, airWithRadiation, false, 400, 5000],
    ['(b) air, convection and radiation', 'slab', 0.015, airWithRadiation, false, 400, 3000],
    ['(b) air, convection and radiation', 'sphere', 0.03, airWithRadiation, false, 400, 5000],
    ['(c) steel table with its cp peak', 'rod', 0.025, plainWater, true, 200, 400],
    ['(c) steel table with its cp peak', 'slab', 0.015, plainWater, true, 200, 300],
    ['(c) steel table with its cp peak', 'sphere', 0.03, plainWater, true, 200, 400],
  ]
  it.each(cases)('%s, %s: centre within 0.2 K, time to target within 0.2 %', (_name, geometry, length_m, outer, table, below_C, end_s) => {
    const problem = steelQuench(geometry, length_m, outer, table)
    const coarse = crankNicolsonCrossing(problem, below_C, end_s, 150, 0.015)
    const fine = crankNicolsonCrossing(problem, below_C, end_s, 300, 0.0075)
    const refinementChange = Math.max(...fine.centre.map((T, i) => Math.abs(T - coarse.centre[i])))
    expect(refinementChange).toBeLessThan(0.05)
    expect(Math.abs(fine.crossing_s / coarse.crossing_s - 1)).toBeLessThan(2e-4)

    const solution = solveTemperatureDependent(problem, { earliest_s: end_s / 600 })
    let worst = 0
    fine.times.forEach((t, i) => {
      if (t >= end_s / 600) worst = Math.max(worst, Math.abs(solution.evaluate(t, 0) - fine.centre[i]))
    })
    expect(worst).toBeLessThan(0.2)
    const found = solution.targetTime('centre', { below_C }) as number
    expect(Math.abs(found / fine.crossing_s - 1)).toBeLessThan(0.002)
    expect(solution.summaries[0].method).toMatch(/sub-steps/)
    // The estimate errs on the safe side: never below the error measured against the reference.
    expect(solution.summaries[0].estimatedError_K).toBeGreaterThan(worst)
  }, 60_000)
})

describe('a stage whose landing step is rejected', () => {
  const curvePoint = ([T_C, h]: number[]) => ({ T_C, h })
  // A graded bar (case over core) in a still oil's low curve: the step landing on the
  // stage's end at 45 s was rejected and, being within 1.5 steps of the end, tried again
  // at the same length until the sub-step cap stopped it. Now the rejected step shrinks.
  const gradedBarInStillOil = caseToProblem(
    parseCase({
      geometry: 'rod',
      size_m: 0.015,
      material: {
        profile: [
          { x: 0, k: 63.9, rhoCp: 3399088 },
          { x: 0.9, k: 63.9, rhoCp: 3399088 },
          { x: 0.9, k: 57.5, rhoCp: 3399088 },
          { x: 1, k: 57.5, rhoCp: 3399088 },
        ],
      },
      initial_C: 830,
      stages: [
        {
          surface: {
            hCurve: [[60, 240], [200, 280], [300, 400], [400, 1200], [500, 2400], [600, 2800], [700, 1200], [800, 480], [900, 400]].map(curvePoint),
            ambient_C: 60,
          },
          duration_s: 45,
        },
        { surface: { hCurve: [[25, 2], [100, 5], [300, 6], [600, 7], [900, 8]].map(curvePoint), ambient_C: 25, emissivity: 0.8 } },
      ],
    }),
  )

  it('ends the stage in a few hundred sub-steps and agrees with the refined finite-volume reference', () => {
    const solution = solveTemperatureDependent(gradedBarInStillOil, { earliest_s: 1 })
    expect(solution.summaries[0].subSteps).toBeLessThan(1000)
    const reference = crankNicolsonCrossing(gradedBarInStillOil, 100, 2500, 300, 0.0075)
    const found = solution.targetTime('centre', { below_C: 100 }) as number
    expect(Math.abs(found / reference.crossing_s - 1)).toBeLessThan(0.002)
  }, 60_000)
})
