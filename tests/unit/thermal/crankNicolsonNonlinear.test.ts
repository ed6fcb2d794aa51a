import { describe, expect, it } from 'vitest'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { solveCrankNicolsonNonlinear } from '../../../server/thermal/crankNicolsonNonlinear'
import type { Geometry } from '../../../server/thermal/types'
import { kirchhoffExact, kirchhoffProblem } from './kirchhoff'
import { OIL_CURVE, steelQuench } from './quenchFixtures'

const TIMES = [2, 5, 10, 20, 40, 80]

describe('non-linear Crank–Nicolson', () => {
  it.each<Geometry>(['slab', 'rod', 'sphere'])('%s: matches the Kirchhoff closed form within 0.02 K (Carslaw & Jaeger §1.16; Özışık, non-linear problems)', (geometry) => {
    const fd = solveCrankNicolsonNonlinear(kirchhoffProblem(geometry), { times_s: TIMES, points: [0, 0.5] })
    TIMES.forEach((t, i) => [0, 0.5].forEach((x, j) => expect(Math.abs(fd.T_C[i][j] - kirchhoffExact(geometry, x, t)), `t=${t} x=${x}`).toBeLessThan(0.02)))
  })

  it.each<Geometry>(['slab', 'rod', 'sphere'])('%s: the error against the closed form falls about fourfold when cells and steps are halved (second order)', (geometry) => {
    const error = (cells: number, rampRate: number) => {
      const fd = solveCrankNicolsonNonlinear(kirchhoffProblem(geometry), { times_s: [10, 40], points: [0], cells, rampRate })
      return Math.max(...[10, 40].map((t, i) => Math.abs(fd.T_C[i][0] - kirchhoffExact(geometry, 0, t))))
    }
    const ratio = error(25, 0.04) / error(50, 0.02)
    expect(ratio).toBeGreaterThan(2.5)
    expect(ratio).toBeLessThan(6)
  })

  it.each<Geometry>(['slab', 'rod', 'sphere'])('%s with constant properties and h: agrees with the linear Crank–Nicolson code within 0.01 K', (geometry) => {
    const problem = steelQuench(geometry, 0.02, { type: 'convective', h_W_m2K: 900, ambient_C: 60 })
    const times = [1, 10, 60, 300]
    const a = solveCrankNicolson(problem, { times_s: times, points: [0, 0.5, 1] })
    const b = solveCrankNicolsonNonlinear(problem, { times_s: times, points: [0, 0.5, 1] })
    times.forEach((_, i) => [0, 1, 2].forEach((j) => expect(Math.abs(a.T_C[i][j] - b.T_C[i][j])).toBeLessThan(0.01)))
  })

  it('refining an oil quench with an h(T) curve stops changing the centre (100 → 200 → 400 cells, ramp halved each time)', () => {
    const problem = steelQuench('rod', 0.025, { type: 'convective', h_W_m2K: 300, ambient_C: 60, hCurve: OIL_CURVE }, true)
    const times = [5, 10, 20, 40, 80, 160, 320]
    const centre = (cells: number, rampRate: number) =>
      solveCrankNicolsonNonlinear(problem, { times_s: times, points: [0], cells, rampRate }).T_C.map((r) => r[0])
    const [a, b, c] = [centre(100, 0.02), centre(200, 0.01), centre(400, 0.005)]
    const change = (x: number[], y: number[]) => Math.max(...x.map((v, i) => Math.abs(v - y[i])))
    expect(change(b, c)).toBeLessThan(0.01)
    expect(change(b, c)).toBeLessThan(change(a, b))
  }, 60_000)
})
