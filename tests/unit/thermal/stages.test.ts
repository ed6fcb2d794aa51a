import { describe, expect, it } from 'vitest'
import { symmetricRoot, uniformInitialCoefficient } from '../../../server/thermal/eigenRoots'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import type { CooldownProblem, Geometry } from '../../../server/thermal/types'
import { convective, fixed, uniformProblem } from './helpers'

const K = 40
const RHOCP = 7850 * 475

describe('stages', () => {
  // The rod's J0 from the `bessel` package is good to ≈ 3e-9, which makes its modes
  // orthogonal only to ≈ 1e-8: 800 K × 1e-8 per mode, hence 1e-4 K for the rod.
  it.each([
    ['slab', 'uniform', 1e-6],
    ['sphere', 'uniform', 1e-6],
    ['rod', 'uniform', 1e-4],
    ['slab', 'graded', 1e-6],
    ['rod', 'graded', 1e-6],
  ] as [Geometry, string, number][])('%s (%s): splitting one condition into two stages reproduces the single stage to %f K (projection is exact)', (g, kind, tol) => {
    const base = uniformProblem(g, 0.02, K, RHOCP, 850, [{ outer: convective(500, 60) }])
    if (kind === 'graded')
      base.domain.properties = [
        { x: 0, k_W_mK: 30, rhoCp_J_m3K: 3.6e6 },
        { x: 0.7, k_W_mK: 45, rhoCp_J_m3K: 3.8e6 },
        { x: 0.7, k_W_mK: 20, rhoCp_J_m3K: 4.0e6 },
        { x: 1, k_W_mK: 22, rhoCp_J_m3K: 4.0e6 },
      ]
    const split: CooldownProblem = { ...base, stages: [{ ...base.stages[0], duration_s: 30 }, base.stages[0]] }
    // Twelve modes in every stage, so truncation (allowed up to 0.01 K) is not what is compared.
    const one = solveCooldown(base, { earliest_s: 5, minModes: 12 })
    const two = solveCooldown(split, { earliest_s: 5, minModes: 12 })
    for (const t of [35, 60, 200, 900]) for (const x of [0, 0.5, 0.69, 0.71, 1]) expect(Math.abs(one.evaluate(t, x) - two.evaluate(t, x))).toBeLessThan(tol)
  })

  it('soak: time for a bar centre to reach 880 °C in a 900 °C furnace matches the one-term solution (Incropera §5.5)', () => {
    // Fo ≫ 0.2 at the target, so the one-term solution is exact to far better than the 1e-4 asserted.
    const R = 0.05
    const h = 200
    const sol = solveCooldown(uniformProblem('rod', R, 30, 3.9e6, 20, [{ outer: convective(h, 900) }]))
    const bi = (h * R) / 30
    const zeta = symmetricRoot('rod', 1, bi)
    const theta = (880 - 900) / (20 - 900)
    const expected = (-Math.log(theta / uniformInitialCoefficient('rod', zeta)) / (zeta * zeta)) * ((R * R * 3.9e6) / 30)
    const t = sol.targetTime('centre', { above_C: 880 }) as number
    expect(Math.abs(t / expected - 1)).toBeLessThan(1e-4)
  })

  it('a slab between two different fixed face temperatures settles on the linear steady profile (Fourier\'s law)', () => {
    const sol = solveCooldown(uniformProblem('slab', 0.05, K, RHOCP, 500, [{ inner: fixed(300), outer: fixed(100) }]))
    for (const x of [0, 0.25, 0.5, 1]) expect(sol.evaluate(1e6, x)).toBeCloseTo(300 - 200 * x, 9)
  })

  it('a graded slab with two convective faces settles on the constant-flux profile T = T0∞ − q(1/h0 + ∫dx/k)', () => {
    const problem: CooldownProblem = {
      domain: { geometry: 'slab', length_m: 0.1, properties: [{ x: 0, k_W_mK: 10, rhoCp_J_m3K: 3e6 }, { x: 1, k_W_mK: 30, rhoCp_J_m3K: 3e6 }] },
      initial: 20,
      stages: [{ inner: convective(50, 400), outer: convective(25, 20) }],
    }
    const sol = solveCooldown(problem, { earliest_s: 100 })
    // ∫₀^x dx′/k over L = 0.1 m with k = 10 + 20x: (L/20) ln((10 + 20x)/10).
    const r = (x: number) => (0.1 / 20) * Math.log((10 + 20 * x) / 10)
    const q = (400 - 20) / (1 / 50 + r(1) + 1 / 25)
    for (const x of [0, 0.5, 1]) expect(sol.evaluate(1e7, x)).toBeCloseTo(400 - q * (1 / 50 + r(x)), 6)
  })
})

describe('series against the Crank–Nicolson solver (800 °C cooldown, within 0.05 K)', () => {
  const graded = [
    { x: 0, k_W_mK: 25, rhoCp_J_m3K: 3.6e6 },
    { x: 0.85, k_W_mK: 40, rhoCp_J_m3K: 3.8e6 },
    { x: 0.85, k_W_mK: 18, rhoCp_J_m3K: 4.1e6 },
    { x: 1, k_W_mK: 20, rhoCp_J_m3K: 4.1e6 },
  ]
  it.each([
    ['slab', 'uniform', 0.1],
    ['rod', 'uniform', 1],
    ['sphere', 'uniform', 10],
    ['slab', 'graded', 1],
    ['rod', 'graded', 0.1],
    ['rod', 'graded', 10],
  ] as [Geometry, string, number][])('%s, %s, Bi = %f, oil then air', (g, kind, bi) => {
    const L = 0.025
    const problem = uniformProblem(g, L, K, RHOCP, 830, [
      { outer: convective((bi * K) / L, 30), duration_s: 120 },
      { outer: convective(12, 30) },
    ])
    if (kind === 'graded') problem.domain.properties = graded
    const times = [5, 30, 120, 125, 400, 1500]
    const points = [0, 0.5, 0.85, 1]
    const sol = solveCooldown(problem, { earliest_s: 5 })
    const cn = solveCrankNicolson(problem, { times_s: times, points })
    cn.t_s.forEach((t, i) => points.forEach((x, j) => expect(Math.abs(cn.T_C[i][j] - sol.evaluate(t, x))).toBeLessThan(0.05)))
  })
})
