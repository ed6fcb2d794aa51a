import { describe, expect, it } from 'vitest'
import { pointValue, pointValues, type PointStage } from '../../../shared/pointSeries'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { discreteRates } from '../../../server/thermal/discreteModes'
import { rodRoot, slabRoot, sphereRoot, surfaceValues, uniformMass, uniformNorm, uniformOverlap } from '../../../server/thermal/eigenRoots'
import { heatCapacity } from '../../../server/thermal/modeIntegrals'
import { breakpointsOf, propertiesAt, scaleDomain } from '../../../server/thermal/properties'
import { compositeRule, gaussLegendre } from '../../../server/thermal/quadrature'
import { modeFamily } from '../../../server/thermal/modeFamily'
import { shootingAccuracy, shootingModes } from '../../../server/thermal/shooting'
import { buildStageSeries, type SeriesInput } from '../../../server/thermal/series'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import type { CooldownProblem, Geometry, PropertyPoint } from '../../../server/thermal/types'

const casedRod: PropertyPoint[] = [
  { x: 0, k_W_mK: 28, rhoCp_J_m3K: 3.7e6 },
  { x: 0.85, k_W_mK: 40, rhoCp_J_m3K: 3.8e6 },
  { x: 0.85, k_W_mK: 18, rhoCp_J_m3K: 4.1e6 },
  { x: 1, k_W_mK: 20, rhoCp_J_m3K: 4.1e6 },
]

describe('finite-volume rate estimates (starting values for shooting)', () => {
  const pieces = scaleDomain({ geometry: 'rod', length_m: 0.025, properties: casedRod }).pieces
  it.each([0, 1, 2] as const)('m = %i, cased body: the n-th estimate lies between the shot (n − 1)-th and (n + 1)-th rates and within 0.3 %', (m) => {
    const spec = { m, pieces, innerBiot: 0, outerBiot: 0.8 }
    const shot = shootingModes(spec)
    const estimates = discreteRates(spec, 12)
    for (let n = 1; n <= 12; n++) {
      const exact = shot(n).rate
      expect(estimates[n - 1]).toBeGreaterThan(n === 1 ? 0 : shot(n - 1).rate)
      expect(estimates[n - 1]).toBeLessThan(shot(n + 1).rate)
      expect(Math.abs(estimates[n - 1] / exact - 1)).toBeLessThan(0.003)
    }
  })

  it.each([
    [0, (n: number) => slabRoot(n, 0, 2)],
    [1, (n: number) => rodRoot(n, 2)],
  ] as const)('uniform m = %i, Bi = 2: with the (λΔx)²/12 correction five modes on 40 cells are within 5e-4 of the closed form', (m, root) => {
    const spec = { m, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }], innerBiot: 0, outerBiot: 2 }
    discreteRates(spec, 5, 40).forEach((mu, i) => expect(Math.abs(mu / root(i + 1) ** 2 - 1)).toBeLessThan(5e-4))
  })
})

describe('shooting polish', () => {
  it('a symmetric uniform slab: every shape, moved to the Newton-corrected rate along its μ-sensitivity, is cos λx to 1e-8', () => {
    const shot = shootingModes({ m: 0, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }], innerBiot: 0, outerBiot: 0.7 })
    for (let n = 1; n <= 12; n++) {
      const lam = slabRoot(n, 0, 0.7)
      for (const x of [0, 0.21, 0.5, 0.77, 1]) expect(Math.abs(shot(n).shape(x) - Math.cos(lam * x))).toBeLessThan(1e-8)
    }
  })
})

describe('shooting from the centre power series', () => {
  it.each([
    [1, (n: number) => rodRoot(n, 2)],
    [2, (n: number) => sphereRoot(n, 2)],
  ] as const)('uniform m = %i: the shape at small x (power series) joins the integrated shape and matches the closed form', (m, root) => {
    const shot = shootingModes({ m, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }], innerBiot: 0, outerBiot: 2 })
    for (const n of [1, 4, 9]) {
      const lam = root(n)
      const exact = (x: number) => (m === 1 ? surfaceValues('rod', lam * x).f1 : x === 0 ? 1 : Math.sin(lam * x) / (lam * x))
      // J0 from the `bessel` package is good to ≈ 3e-9.
      for (const x of [0, 0.01, 0.05, 0.1, 0.2, 0.5, 0.9, 1]) expect(Math.abs(shot(n).shape(x) - exact(x))).toBeLessThan(1e-7)
    }
  })
})

describe('closed-form integrals of symmetric uniform modes (Green\'s identity)', () => {
  const rule = gaussLegendre(64)
  const integrate = (f: (x: number) => number) => {
    // 32 panels of 64-point Gauss–Legendre: exact to rounding for these smooth integrands.
    let sum = 0
    for (let p = 0; p < 32; p++) for (let i = 0; i < rule.x.length; i++) sum += (rule.w[i] / 64) * f((p + 0.5 + 0.5 * rule.x[i]) / 32)
    return sum
  }
  const shapeOf = (g: Geometry, lam: number) => (x: number) =>
    g === 'slab' ? Math.cos(lam * x) : g === 'rod' ? surfaceValues('rod', lam * x).f1 : x === 0 ? 1 : Math.sin(lam * x) / (lam * x)
  it.each([
    ['slab', 0, (n: number, bi: number) => slabRoot(n, 0, bi)],
    ['rod', 1, rodRoot],
    ['sphere', 2, sphereRoot],
  ] as const)('%s: norm, mass and the overlap of modes of two different Biot numbers equal quadrature', (g, m, root) => {
    const weight = (x: number) => x ** m
    for (const [n, k] of [[1, 1], [1, 3], [4, 2], [7, 7]]) {
      const a = surfaceValues(g, root(n, 12))
      const b = surfaceValues(g, root(k, 0.3))
      const fa = shapeOf(g, a.lam)
      const fb = shapeOf(g, b.lam)
      const tol = g === 'rod' ? 1e-8 : 1e-12
      expect(Math.abs(uniformNorm(m, a) - integrate((x) => weight(x) * fa(x) ** 2))).toBeLessThan(tol)
      expect(Math.abs(uniformMass(a) - integrate((x) => weight(x) * fa(x)))).toBeLessThan(tol)
      expect(Math.abs(uniformOverlap(m, a, b) - integrate((x) => weight(x) * fa(x) * fb(x)))).toBeLessThan(tol)
    }
  })

  it('a rod from a table start (quadrature projection) and from a flat start (closed forms) agree through a second stage', () => {
    const domain = { geometry: 'rod' as const, length_m: 0.02, properties: [0, 1].map((x) => ({ x, k_W_mK: 40, rhoCp_J_m3K: 3.73e6 })) }
    const stages: CooldownProblem['stages'] = [
      { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 900, ambient_C: 60 }, duration_s: 40 },
      { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 15, ambient_C: 25 } },
    ]
    const flat = solveCooldown({ domain, initial: 850, stages }, { earliest_s: 1, minModes: 30 })
    const table = solveCooldown({ domain, initial: [{ x: 0, T_C: 850 }, { x: 1, T_C: 850 }], stages }, { earliest_s: 1, minModes: 30 })
    expect(flat.stages[1].modes.every((mode) => mode.surface)).toBe(true)
    for (const t of [41, 60, 300, 3000]) for (const x of [0, 0.5, 1]) expect(Math.abs(flat.evaluate(t, x) - table.evaluate(t, x))).toBeLessThan(1e-5)
  })
})

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

describe('pointValues (curve evaluation by exponential ratios)', () => {
  const stages: PointStage[] = [
    { start_s: 0, end_s: 150, steady_C: 60, terms: [{ amplitude_K: 800, decayRate_per_s: 0.01 }, { amplitude_K: -40, decayRate_per_s: 0.3 }] },
    { start_s: 150, steady_C: 25, terms: [{ amplitude_K: 300, decayRate_per_s: 0.001 }, { amplitude_K: 5, decayRate_per_s: 0.05 }] },
  ]
  it('equals pointValue at every time of a uniform grid with extra times inserted, across a stage boundary', () => {
    const times = [...Array.from({ length: 601 }, (_, i) => (2000 * i) / 600), 150, 151.7, 999.9].sort((a, b) => a - b)
    const values = pointValues(stages, times)
    times.forEach((t, i) => expect(Math.abs(values[i] - pointValue(stages, t))).toBeLessThan(1e-10))
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

describe('graded mode cache', () => {
  const domain = scaleDomain({ geometry: 'rod', length_m: 0.025, properties: casedRod })
  it('a family asked again is the same family, extended lazily, with the rates a fresh shooting gives', () => {
    const first = modeFamily('rod', domain, 0, 0.8)
    const firstRates = [1, 2, 3].map((n) => first.mode(n).rate)
    const again = modeFamily('rod', domain, 0, 0.8)
    for (const n of [1, 2, 3]) expect(again.mode(n)).toBe(first.mode(n))
    const fresh = shootingModes({ m: 1, pieces: domain.pieces, innerBiot: 0, outerBiot: 0.8 })
    for (let n = 1; n <= 8; n++) expect(Math.abs(again.mode(n).rate / fresh(n).rate - 1)).toBeLessThan(1e-9)
    firstRates.forEach((rate, i) => expect(Math.abs(rate / fresh(i + 1).rate - 1)).toBeLessThan(1e-9))
  })

  it('a different surface Biot number or shooting accuracy is a different family', () => {
    const base = modeFamily('rod', domain, 0, 0.8).mode(1).rate
    expect(modeFamily('rod', domain, 0, 0.9).mode(1).rate).toBeGreaterThan(base)
    const loose = modeFamily('rod', domain, 0, 0.8, shootingAccuracy(0.05)).mode(1)
    expect(loose).not.toBe(modeFamily('rod', domain, 0, 0.8).mode(1))
    expect(Math.abs(loose.rate / base - 1)).toBeLessThan(1e-6)
  })
})

describe('projection through cached mode integrals', () => {
  const domain = scaleDomain({ geometry: 'rod', length_m: 0.025, properties: casedRod })
  const stage = (biot: number, ambient_C: number, start: SeriesInput['start'], startModes?: SeriesInput['startModes']) =>
    buildStageSeries({
      domain,
      family: modeFamily('rod', domain, 0, biot),
      steady: () => ambient_C,
      start,
      ...(startModes ? { startModes } : {}),
      breakpoints: [],
      symmetricUniformSteady: true,
      earliest_s: 2,
      minModes: 8,
      maxModes: 60,
      start_s: 0,
      end_s: 120,
    })

  it('a graded rod: amplitudes from a uniform start and from the previous stage\'s modes equal the quadrature projection of the same start to 1e-10 of the 790 K drop (the rules differ in panel width)', () => {
    const first = stage(0.6, 60, 850)
    const firstByQuadrature = stage(0.6, 60, () => 850)
    first.amplitudes_K.forEach((a, j) => expect(Math.abs(a - firstByQuadrature.amplitudes_K[j])).toBeLessThan(790e-10))
    first.modeMeans.forEach((mean, j) => expect(Math.abs(mean - firstByQuadrature.modeMeans[j])).toBeLessThan(1e-12))

    const tau = 120 / domain.timeScale_s
    const ends = first.amplitudes_K.map((a, j) => a * Math.exp(-first.rates[j] * tau))
    const endProfile = (x: number) => 60 + ends.reduce((sum, a, j) => sum + a * first.shapes[j](x), 0)
    const second = stage(0.01, 25, endProfile, { steady_C: 60, terms: first.modes.map((mode, j) => ({ amplitude_K: ends[j], mode })) })
    const secondByQuadrature = stage(0.01, 25, endProfile)
    second.amplitudes_K.forEach((a, j) => expect(Math.abs(a - secondByQuadrature.amplitudes_K[j])).toBeLessThan(790e-10))
  })
})

describe('heat capacity in closed form', () => {
  it.each([0, 1, 2] as const)('m = %i: ∫ c x^m over the cased body equals composite Gauss–Legendre, and ∫ x^m = 1/(m + 1) for c = 1', (m) => {
    const domain = { ...scaleDomain({ geometry: 'rod', length_m: 0.025, properties: casedRod }), m }
    const rule = compositeRule(breakpointsOf(domain.pieces), 1 / 64, (x) => propertiesAt(domain.pieces, x).c * x ** m)
    expect(heatCapacity(domain)).toBeCloseTo(rule.w.reduce((a, b) => a + b, 0), 13)
    const plain = { ...domain, pieces: [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }] }
    expect(heatCapacity(plain)).toBeCloseTo(1 / (m + 1), 15)
  })
})
