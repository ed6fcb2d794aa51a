import { describe, expect, it } from 'vitest'
import { rodRoot, slabRoot, sphereRoot, surfaceValues, uniformMass, uniformNorm, uniformOverlap } from '../../../server/thermal/eigenRoots'
import { heatCapacity } from '../../../server/thermal/modeIntegrals'
import { breakpointsOf, propertiesAt, scaleDomain } from '../../../server/thermal/properties'
import { compositeRule, gaussLegendre } from '../../../server/thermal/quadrature'
import { modeFamily } from '../../../server/thermal/modeFamily'
import { buildStageSeries, type SeriesInput } from '../../../server/thermal/series'
import { solveCooldown } from '../../../server/thermal/solveCooldown'
import type { CooldownProblem, Geometry } from '../../../server/thermal/types'
import { casedRod } from './helpers'

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
