import { describe, expect, it } from 'vitest'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import type { CooldownProblem, Geometry, PropertyPoint } from '../../../server/thermal/types'
import { casedRod } from './helpers'

describe('accuracy option', () => {
  const times = Array.from({ length: 40 }, (_, i) => 5 + i * 40)
  const oilThenAir = (geometry: Geometry, length_m: number, properties: PropertyPoint[]): CooldownProblem => ({
    domain: { geometry, length_m, properties },
    initial: 850,
    stages: [
      { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 900, ambient_C: 60 }, duration_s: 150 },
      { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 15, ambient_C: 25 } },
    ],
  })
  const uniform = [0, 1].map((x) => ({ x, k_W_mK: 40, rhoCp_J_m3K: 3.73e6 }))
  it.each([
    ['slab', 0.015, uniform],
    ['rod', 0.025, uniform],
    ['rod', 0.025, casedRod],
    ['sphere', 0.03, casedRod],
  ] as [Geometry, number, PropertyPoint[]][])('%s (L = %f m): accuracy_K 0.05 stays within 0.05 K of a fine Crank–Nicolson run at the centre', (g, L, properties) => {
    const problem = oilThenAir(g, L, properties)
    const loose = solveCooldown(problem, { earliest_s: 5, accuracy_K: 0.05 })
    const cn = solveCrankNicolson(problem, { times_s: times, points: [0], cells: 1600 })
    times.forEach((t, i) => expect(Math.abs(loose.evaluate(t, 0) - cn.T_C[i][0])).toBeLessThan(0.05))
    expect(loose.summaries.every((s) => s.truncationError_K < 0.04)).toBe(true)
  })

  it('rejects a non-positive accuracy', () => {
    expect(() => solveCooldown(oilThenAir('rod', 0.02, uniform), { accuracy_K: 0 })).toThrow(/accuracy_K/)
  })
})

describe('Crank–Nicolson step growth option', () => {
  const problem: CooldownProblem = {
    domain: { geometry: 'slab', length_m: 0.015, properties: [0, 1].map((x) => ({ x, k_W_mK: 40, rhoCp_J_m3K: 3.73e6 })) },
    initial: 850,
    stages: [{ inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 900, ambient_C: 60 } }],
  }
  const times = [5, 20, 60, 200]
  it('rampRate 0.04 (four times the default growth) stays within 0.05 K of the default on 400 cells', () => {
    const base = solveCrankNicolson(problem, { times_s: times, points: [0, 1] })
    const fast = solveCrankNicolson(problem, { times_s: times, points: [0, 1], rampRate: 0.04 })
    base.T_C.forEach((row, i) => row.forEach((T, j) => expect(Math.abs(fast.T_C[i][j] - T)).toBeLessThan(0.05)))
  })
  it.each([0, -0.1, 1, Number.NaN])('rejects rampRate %f', (rampRate) => {
    expect(() => solveCrankNicolson(problem, { times_s: times, points: [0], rampRate })).toThrow(/rampRate/)
  })
})
