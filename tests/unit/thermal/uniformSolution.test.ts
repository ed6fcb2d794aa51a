import { beforeAll, describe, expect, it, vi } from 'vitest'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { runCase } from '../../../server/thermal/runCase'
import { scaleDomain } from '../../../server/thermal/properties'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import { solveUniformSymmetric } from '../../../server/thermal/uniformSolution'
import type { TargetSpec } from '../../../server/thermal/targetTime'
import type { CooldownProblem, Geometry, PointRef, SolveOptions, Stage } from '../../../server/thermal/types'
import { convective, fixed, uniformProblem } from './helpers'

const K = 40
const RHOCP = 7850 * 475
const L = 0.02

type General = { solveCooldown: typeof solveCooldown; runCase: typeof runCase }
let general: General

// The general path, as solveCooldown and runCase run it when the fast path declines every problem.
beforeAll(async () => {
  vi.resetModules()
  vi.doMock('../../../server/thermal/uniformSolution', () => ({ solveUniformSymmetric: () => null }))
  general = {
    solveCooldown: (await import('../../../server/thermal/solveCooldown')).solveCooldown,
    runCase: (await import('../../../server/thermal/runCase')).runCase,
  }
  vi.doUnmock('../../../server/thermal/uniformSolution')
})

/** h for a Biot number hL/k; Infinity gives a fixed surface. */
const surface = (bi: number, ambient_C: number): Stage['outer'] => (bi === Infinity ? fixed(ambient_C) : convective((bi * K) / L, ambient_C))
const oneStage = (g: Geometry, bi: number) => uniformProblem(g, L, K, RHOCP, 850, [{ outer: surface(bi, 60) }])
// Quench, air, a hold in a furnace at fixed temperature, then air again: projections between four different families.
const multiStage = (g: Geometry, bi: number) =>
  uniformProblem(g, L, K, RHOCP, 850, [
    { outer: surface(bi, 60), duration_s: 40 },
    { outer: surface(0.01, 25), duration_s: 300 },
    { outer: fixed(400), duration_s: 60 },
    { outer: surface(0.02, 25) },
  ])
const times = [0, 0.5, 3, 20, 39.9, 40, 41, 200, 340, 345, 400, 401, 1000, 5000, 40000]
const xs = [0, 0.2, 0.5, 0.77, 1]
const refs: PointRef[] = ['centre', 'surface', 'mean', { x: 0.4 }]
const geometries: Geometry[] = ['slab', 'rod', 'sphere']
const biots = [0.03, 0.4, 3, 40, Infinity]
const optionSets: SolveOptions[] = [{}, { earliest_s: 5, accuracy_K: 0.05 }, { earliest_s: 1, minModes: 12 }, { earliest_s: [0.2, 3, 1, 50] }]

/** a equals b: temperatures (keys ending _C or _K) to 1e-9 K, every other number to 1e-9 relative (1e-12 absolute near zero), the rest exactly. */
function expectSame(a: unknown, b: unknown, path = ''): void {
  if (typeof b === 'number') {
    expect(typeof a, path).toBe('number')
    const tol = /_[CK]\b|_[CK]\./.test(path) ? 1e-9 : Math.max(1e-9 * Math.abs(b), 1e-12)
    if (Number.isFinite(b)) expect(Math.abs((a as number) - b), path).toBeLessThanOrEqual(tol)
    else expect(a, path).toBe(b)
  } else if (Array.isArray(b)) {
    expect(Array.isArray(a) && a.length, path).toBe(b.length)
    b.forEach((v, i) => expectSame((a as unknown[])[i], v, `${path}.${i}`))
  } else if (b !== null && typeof b === 'object') {
    expect(Object.keys(a as object).sort(), path).toEqual(Object.keys(b).sort())
    for (const [k, v] of Object.entries(b)) expectSame((a as Record<string, unknown>)[k], v, path ? `${path}.${k}` : k)
  } else expect(a, path).toBe(b)
}

// A truncated series is not accurate before earliest_s and may cross a target near t = 0 early;
// whatever the general path answers there, the fast path must answer alike.
const targets: [PointRef, TargetSpec][] = [['centre', { below_C: 300 }], [{ x: 0.4 }, { below_C: 250 }], ['mean', { below_C: 200 }], ['surface', { below_C: 100 }]]

/** Everything a caller can read from a solution, as plain data. */
function readings(problem: CooldownProblem, options: SolveOptions, solve: typeof solveCooldown) {
  const s = solve(problem, options)
  return {
    evaluate_C: times.map((t) => xs.map((x) => s.evaluate(t, x))),
    mean_C: times.map((t) => s.mean(t)),
    initial_C: xs.map((x) => s.initialAt(x)),
    centreX: s.centreX,
    summaries: s.summaries,
    points: refs.map((at) =>
      s.pointSeries(at).map(({ steady_C, terms, ...rest }) => ({
        ...rest,
        steady_C,
        terms: terms.map((t) => ({ amplitude_K: t.amplitude_K, rate: t.decayRate_per_s })),
      }))),
    target: targets.map(([at, target]) => s.targetTime(at, target)),
    domain: s.domain,
    stages: s.stages.map((st) => ({
      ...st,
      steady_C: st.steady(0.3),
      steady: undefined,
      shapes_K: st.shapes.map((f) => xs.map((x) => f(x))),
      shapes: undefined,
      modes: st.modes.map(({ rate, surface }) => ({ rate, surface })),
    })),
  }
}

describe('uniform symmetric fast path', () => {
  it.each(geometries.flatMap((g) => biots.map((bi) => [g, bi] as const)))('%s, Bi = %f: one stage equals the general path to 1e-9 K', (g, bi) => {
    const problem = oneStage(g, bi)
    expect(solveUniformSymmetric(problem, scaleDomain(problem.domain), {}, 400)).not.toBeNull()
    for (const options of optionSets.slice(0, 3)) expectSame(readings(problem, options, solveCooldown), readings(problem, options, general.solveCooldown))
  })

  it.each(geometries.flatMap((g) => biots.map((bi) => [g, bi] as const)))('%s, first Bi = %f: four stages equal the general path to 1e-9 K', (g, bi) => {
    const problem = multiStage(g, bi)
    expect(solveUniformSymmetric(problem, scaleDomain(problem.domain), {}, 400)).not.toBeNull()
    for (const options of optionSets) expectSame(readings(problem, options, solveCooldown), readings(problem, options, general.solveCooldown))
  })

  it('declines what it does not cover: graded properties, a start profile, a slab face at x = 0, h = 0', () => {
    const graded = oneStage('rod', 1)
    graded.domain.properties = [{ x: 0, k_W_mK: 30, rhoCp_J_m3K: 3.6e6 }, { x: 1, k_W_mK: 45, rhoCp_J_m3K: 3.8e6 }]
    const profile = { ...oneStage('slab', 1), initial: [{ x: 0, T_C: 850 }, { x: 1, T_C: 800 }] }
    const face = uniformProblem('slab', L, K, RHOCP, 850, [{ inner: fixed(20), outer: convective(500, 20) }])
    const still = uniformProblem('sphere', L, K, RHOCP, 850, [{ outer: convective(0, 20) }])
    for (const problem of [graded, profile, face, still]) expect(solveUniformSymmetric(problem, scaleDomain(problem.domain), {}, 400)).toBeNull()
  })

  it.each([
    ['rod plan with a target', { geometry: 'rod', size_m: 0.02, material: { k: 40, rho: 7850, cp: 475 }, initial_C: 850, stages: [{ surface: { h: 800, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 15, ambient_C: 25 } }], target: { at: 'centre', below_C: 100 } }],
    ['slab with times, points, a mean target and the Crank–Nicolson check', { geometry: 'slab', size_m: 0.015, material: { k: 30, rho: 7800, cp: 500 }, initial_C: 860, stages: [{ surface: { h: 2500, ambient_C: 40 }, duration_s: 20 }, { surface: { fixed_C: 300 }, duration_s: 100 }, { surface: { h: 10, ambient_C: 25 } }], times_s: [1, 10, 25, 500], points: [0, 0.3, 1], target: { at: 'mean', below_C: 150 }, check: 'finite-difference' }],
    ['sphere heat-up to a surface target with a mode floor', { geometry: 'sphere', size_m: 0.04, material: { k: 35, rho: 7850, cp: 480 }, initial_C: 20, stages: [{ surface: { h: 150, ambient_C: 900 } }], target: { at: 'surface', above_C: 880 }, modes: 20 }],
  ])('runCase, %s: the whole result equals the general path to 1e-9 K', (_, c) => {
    expectSame(runCase(c), general.runCase(c))
  })
})

describe('fast path at accuracy_K 0.05', () => {
  const times = Array.from({ length: 40 }, (_, i) => 5 + i * 40)
  it.each(geometries)('%s, oil then air: within 0.05 K of a 1600-cell Crank–Nicolson run at the centre', (g) => {
    const problem = uniformProblem(g, 0.025, K, RHOCP, 850, [{ outer: convective(900, 60), duration_s: 150 }, { outer: convective(15, 25) }])
    const fast = solveCooldown(problem, { earliest_s: 5, accuracy_K: 0.05 })
    const cn = solveCrankNicolson(problem, { times_s: times, points: [0], cells: 1600 })
    times.forEach((t, i) => expect(Math.abs(fast.evaluate(t, 0) - cn.T_C[i][0])).toBeLessThan(0.05))
  })
})
