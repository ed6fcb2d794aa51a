import { describe, expect, it } from 'vitest'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { runCase } from '../../../server/thermal/runCase'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import type { Boundary, CooldownProblem, Geometry, PropertyPoint } from '../../../server/thermal/types'

// The eigenmode series and the Crank–Nicolson finite volumes share nothing but
// types.ts, so agreement to 0.05 K on an 800 K cooldown checks both.

const TOLERANCE_K = 0.05
const POINTS = [0, 0.5, 1] // centre, mid-radius, surface
const FO = [0.02, 0.1, 0.3, 1, 3] // Fo = α_ref t / L²

const uniformSteel: PropertyPoint[] = [
  { x: 0, k_W_mK: 40, rhoCp_J_m3K: 3.73e6 },
  { x: 1, k_W_mK: 40, rhoCp_J_m3K: 3.73e6 },
]
// A carburised case: softer, less conductive layer over the last 15 %, with a jump.
const casedSteel: PropertyPoint[] = [
  { x: 0, k_W_mK: 42, rhoCp_J_m3K: 3.6e6 },
  { x: 0.85, k_W_mK: 36, rhoCp_J_m3K: 3.8e6 },
  { x: 0.85, k_W_mK: 28, rhoCp_J_m3K: 4.0e6 },
  { x: 1, k_W_mK: 25, rhoCp_J_m3K: 4.1e6 },
]
const graded: Record<string, PropertyPoint[]> = { uniform: uniformSteel, cased: casedSteel }

const L = 0.025 // m
const T_START = 830
const T_BATH = 30

function surface(bi: number | 'fixed'): Exclude<Boundary, { type: 'symmetry' }> {
  return bi === 'fixed'
    ? { type: 'fixed', T_C: T_BATH }
    : { type: 'convective', h_W_m2K: (bi * 40) / L, ambient_C: T_BATH }
}

function compare(problem: CooldownProblem, times: number[]) {
  const series = solveCooldown(problem, { earliest_s: times[0] })
  const cn = solveCrankNicolson(problem, { times_s: times, points: POINTS })
  return times.flatMap((t, i) =>
    POINTS.map((x, j) => ({ t, x, series: series.evaluate(t, x), cn: cn.T_C[i][j] })),
  )
}

const cases: [Geometry, string, number | 'fixed'][] = []
for (const geometry of ['slab', 'rod', 'sphere'] as Geometry[]) {
  for (const material of ['uniform', 'cased']) {
    for (const bi of [0.1, 1, 10, 'fixed'] as const) cases.push([geometry, material, bi])
  }
}

describe('eigenmode series against Crank–Nicolson finite volumes', () => {
  it.each(cases)('%s, %s, Bi = %s: centre, mid and surface agree within 0.05 K', (geometry, material, bi) => {
    const problem: CooldownProblem = {
      domain: { geometry, length_m: L, properties: graded[material] },
      initial: T_START,
      stages: [{ outer: surface(bi), inner: { type: 'symmetry' } }],
    }
    const timeScale = (L * L * 3.73e6) / 40
    // slow Bi = 0.1 cooling is followed further, to Fo = 30
    const times = (bi === 0.1 ? [...FO, 10, 30] : FO).map((fo) => fo * timeScale)
    for (const r of compare(problem, times)) {
      expect(Math.abs(r.series - r.cn), `t=${r.t.toFixed(1)} s x=${r.x}`).toBeLessThan(TOLERANCE_K)
    }
  })

  it.each(['uniform', 'cased'])('%s rod, oil quench then still air (two stages): agree within 0.05 K', (material) => {
    const problem: CooldownProblem = {
      domain: { geometry: 'rod', length_m: L, properties: graded[material] },
      initial: [
        { x: 0, T_C: 850 },
        { x: 0.7, T_C: 845 },
        { x: 1, T_C: 820 },
      ],
      stages: [
        { outer: { type: 'convective', h_W_m2K: 800, ambient_C: 60 }, inner: { type: 'symmetry' }, duration_s: 180 },
        { outer: { type: 'convective', h_W_m2K: 15, ambient_C: 25 }, inner: { type: 'symmetry' } },
      ],
    }
    const times = [2, 10, 60, 180, 185, 600, 3600]
    const series = solveCooldown(problem, { earliest_s: [2, 5] })
    const cn = solveCrankNicolson(problem, { times_s: times, points: POINTS })
    times.forEach((t, i) =>
      POINTS.forEach((x, j) => {
        expect(Math.abs(series.evaluate(t, x) - cn.T_C[i][j]), `t=${t} x=${x}`).toBeLessThan(TOLERANCE_K)
      }),
    )
  })

  it('a CLI case through runCase: its table agrees with Crank–Nicolson on the hand-built problem within 0.05 K', () => {
    const caseJson = {
      geometry: 'rod',
      size_m: 0.02,
      material: { k: 40, rho: 7850, cp: 475 },
      initial_C: 850,
      centre: 'symmetry',
      stages: [{ surface: { h: 800, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 15, ambient_C: 25 } }],
      target: { at: 'centre', below_C: 100 },
      points: [0, 0.5, 1],
      times_s: [10, 60, 180, 600],
    }
    const result = runCase(caseJson)
    const rhoCp = 7850 * 475
    const cn = solveCrankNicolson(
      {
        domain: {
          geometry: 'rod',
          length_m: 0.02,
          properties: [
            { x: 0, k_W_mK: 40, rhoCp_J_m3K: rhoCp },
            { x: 1, k_W_mK: 40, rhoCp_J_m3K: rhoCp },
          ],
        },
        initial: 850,
        stages: [
          { outer: { type: 'convective', h_W_m2K: 800, ambient_C: 60 }, inner: { type: 'symmetry' }, duration_s: 180 },
          { outer: { type: 'convective', h_W_m2K: 15, ambient_C: 25 }, inner: { type: 'symmetry' } },
        ],
      },
      { times_s: caseJson.times_s, points: caseJson.points },
    )
    expect(result.table.t_s).toEqual(caseJson.times_s)
    caseJson.times_s.forEach((t, i) =>
      caseJson.points.forEach((x, j) => {
        expect(Math.abs(result.table.T_C[i][j] - cn.T_C[i][j]), `t=${t} x=${x}`).toBeLessThan(TOLERANCE_K)
      }),
    )
  })
})
