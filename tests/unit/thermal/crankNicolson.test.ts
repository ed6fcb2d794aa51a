import { describe, expect, it } from 'vitest'
import bessel from 'bessel'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import type { CooldownProblem, Geometry, PropertyPoint, Stage } from '../../../server/thermal/types'
import { bisect } from '../../support/bisect'

// Closed forms are written out here, independently of the eigenmode engine.

const K = 40 // W/mK, a plain carbon steel
const RHO_CP = 7850 * 475 // J/m³K
const ALPHA = K / RHO_CP
const L = 0.02 // m
const T0 = 820
const T_AMB = 20

const uniform: PropertyPoint[] = [
  { x: 0, k_W_mK: K, rhoCp_J_m3K: RHO_CP },
  { x: 1, k_W_mK: K, rhoCp_J_m3K: RHO_CP },
]

function problem(geometry: Geometry, stages: Stage[], initial: CooldownProblem['initial'] = T0): CooldownProblem {
  return { domain: { geometry, length_m: L, properties: uniform }, initial, stages }
}

const fixedSurface = (T_C: number, duration_s?: number): Stage => ({
  outer: { type: 'fixed', T_C },
  inner: { type: 'symmetry' },
  duration_s,
})

// n-th zero of J0: one sign change within ±0.3 of (n − ¼)π (McMahon).
const J0_ZEROS = Array.from({ length: 400 }, (_, i) =>
  bisect((z) => bessel.besselj(z, 0), (i + 0.75) * Math.PI - 0.3, (i + 0.75) * Math.PI + 0.3),
)

/**
 * Fraction of the initial excess left, (T − Ts)/(T0 − Ts), for a body whose
 * surface is held at Ts from t = 0 — separation of variables.
 */
const fixedSurfaceSeries: Record<Geometry, (x: number, Fo: number) => number> = {
  // Carslaw & Jaeger §3.3: Σ 4(−1)ⁿ/((2n+1)π) cos((2n+1)πx/2) e^{−(2n+1)²π²Fo/4}
  slab: (x, Fo) => {
    let s = 0
    for (let n = 0; n < 3000; n++) {
      const l = ((2 * n + 1) * Math.PI) / 2
      s += ((4 * (-1) ** n) / ((2 * n + 1) * Math.PI)) * Math.cos(l * x) * Math.exp(-l * l * Fo)
    }
    return s
  },
  // Carslaw & Jaeger §7.4: Σ 2 J0(βₙx)/(βₙ J1(βₙ)) e^{−βₙ²Fo}, J0(βₙ) = 0
  rod: (x, Fo) => {
    let s = 0
    for (const b of J0_ZEROS) {
      s += ((2 * bessel.besselj(b * x, 0)) / (b * bessel.besselj(b, 1))) * Math.exp(-b * b * Fo)
    }
    return s
  },
  // Carslaw & Jaeger §9.3: Σ 2(−1)ⁿ⁺¹ sin(nπx)/(nπx) e^{−n²π²Fo}
  sphere: (x, Fo) => {
    let s = 0
    for (let n = 1; n < 3000; n++) {
      const l = n * Math.PI
      s += 2 * (-1) ** (n + 1) * (x === 0 ? 1 : Math.sin(l * x) / (l * x)) * Math.exp(-l * l * Fo)
    }
    return s
  },
}

const fo = (t: number) => (ALPHA * t) / (L * L)
const POINTS = [0, 0.25, 0.5, 0.75, 0.9, 1]
const TIMES = [2, 5, 10, 20, 40, 80, 160] // s; Fo = 0.05 … 4

describe('solveCrankNicolson against closed forms', () => {
  it.each<[Geometry, string]>([
    ['slab', 'Carslaw & Jaeger §3.3, cosine series'],
    ['rod', 'Carslaw & Jaeger §7.4, J0 series'],
    ['sphere', 'Carslaw & Jaeger §9.3, sin(nπx)/x series'],
  ])('%s with a fixed surface matches %s to 0.05 K with default cells and steps', (geometry) => {
    const r = solveCrankNicolson(problem(geometry, [fixedSurface(T_AMB)]), { times_s: TIMES, points: POINTS })
    expect(r.t_s).toEqual(TIMES)
    TIMES.forEach((t, i) =>
      POINTS.forEach((x, j) => {
        const exact = T_AMB + (T0 - T_AMB) * fixedSurfaceSeries[geometry](x, fo(t))
        expect(Math.abs(r.T_C[i][j] - exact), `${geometry} x=${x} t=${t}`).toBeLessThan(0.05)
      }),
    )
  })

  // One-term solution θ/θi = C1 cos(λ1 x) e^{−λ1²Fo}, λ1 tan λ1 = Bi,
  // C1 = 4 sin λ1/(2λ1 + sin 2λ1) (Incropera, Fundamentals of Heat and Mass
  // Transfer, §5.6). The neglected second term is below e^{−(λ2²−λ1²)Fo} of θi
  // (|Cₙ| < 1.3 for a slab), which goes into the tolerance.
  it.each([
    [0.5, 'Incropera §5.6'],
    [2, 'Incropera §5.6'],
    [10, 'Incropera §5.6'],
  ])('convective slab, Bi = %d, centre and surface follow the one-term solution (%s)', (Bi) => {
    const h = (Bi * K) / L
    const f = (l: number) => l * Math.tan(l) - Bi
    const l1 = bisect(f, 1e-9, Math.PI / 2 - 1e-9)
    const l2 = bisect(f, Math.PI + 1e-9, (3 * Math.PI) / 2 - 1e-9)
    const C1 = (4 * Math.sin(l1)) / (2 * l1 + Math.sin(2 * l1))
    const foValues = [0.25, 0.5, 1, 2]
    const times = foValues.map((F) => (F * L * L) / ALPHA)
    const r = solveCrankNicolson(
      problem('slab', [{ outer: { type: 'convective', h_W_m2K: h, ambient_C: T_AMB }, inner: { type: 'symmetry' } }]),
      { times_s: times, points: [0, 0.5, 1] },
    )
    foValues.forEach((F, i) =>
      [0, 0.5, 1].forEach((x, j) => {
        const exact = T_AMB + (T0 - T_AMB) * C1 * Math.cos(l1 * x) * Math.exp(-l1 * l1 * F)
        const tol = 0.05 + 1.3 * (T0 - T_AMB) * Math.exp(-(l2 * l2 - l1 * l1) * F)
        expect(Math.abs(r.T_C[i][j] - exact), `Bi=${Bi} Fo=${F} x=${x}`).toBeLessThan(tol)
      }),
    )
  })

  it('steps exactly onto a stage change: a surface temperature switched at t1 matches Duhamel superposition of two cosine series', () => {
    // Linear problem: T = Ts2 + (T0 − Ts1)·S(t) + (Ts1 − Ts2)·S(t − t1) for t > t1.
    const t1 = 13.7
    const Ts2 = 300
    const times = [5, t1, t1 + 0.5, 20, 60]
    const r = solveCrankNicolson(problem('slab', [fixedSurface(T_AMB, t1), fixedSurface(Ts2)]), {
      times_s: times,
      points: [0, 0.5, 0.95],
    })
    const S = (x: number, t: number) => fixedSurfaceSeries.slab(x, fo(t))
    times.forEach((t, i) =>
      [0, 0.5, 0.95].forEach((x, j) => {
        const exact =
          t <= t1
            ? T_AMB + (T0 - T_AMB) * S(x, t)
            : Ts2 + (T0 - T_AMB) * S(x, t) + (T_AMB - Ts2) * S(x, t - t1)
        expect(Math.abs(r.T_C[i][j] - exact), `t=${t} x=${x}`).toBeLessThan(0.05)
      }),
    )
  })

  it('reaches the exact series-resistance steady state of a graded, layered slab with two fixed faces', () => {
    // Steady flux q = ΔT / ∫dx/k; ∫dx/k over a linear k is span·ln(k2/k1)/(k2−k1).
    // The finite volumes reproduce this exactly (faces on the breakpoints).
    const properties: PropertyPoint[] = [
      { x: 0, k_W_mK: 12, rhoCp_J_m3K: 3.9e6 },
      { x: 0.3, k_W_mK: 20, rhoCp_J_m3K: 3.7e6 },
      { x: 0.3, k_W_mK: 45, rhoCp_J_m3K: 3.5e6 },
      { x: 1, k_W_mK: 45, rhoCp_J_m3K: 3.5e6 },
    ]
    const length_m = 0.01
    const resistance = (x0: number, x1: number, k0: number, k1: number) =>
      k0 === k1 ? (x1 - x0) * length_m / k0 : ((x1 - x0) * length_m * Math.log(k1 / k0)) / (k1 - k0)
    const kAt = (x: number) => 12 + ((20 - 12) * x) / 0.3
    const Rtotal = resistance(0, 0.3, 12, 20) + resistance(0.3, 1, 45, 45)
    const exact = (x: number) => {
      const R = x <= 0.3 ? resistance(0, x, 12, kAt(x)) : resistance(0, 0.3, 12, 20) + resistance(0.3, x, 45, 45)
      return 100 - (100 * R) / Rtotal
    }
    const points = [0, 0.1, 0.3, 0.65, 1]
    const r = solveCrankNicolson(
      {
        domain: { geometry: 'slab', length_m, properties },
        initial: 50,
        stages: [{ inner: { type: 'fixed', T_C: 100 }, outer: { type: 'fixed', T_C: 0 } }],
      },
      { times_s: [2000], points, cells: 50 },
    )
    points.forEach((x, j) => expect(r.T_C[0][j], `x=${x}`).toBeCloseTo(exact(x), 8))
  })

  it('conserves energy in a graded, clad rod over two convective stages', () => {
    const properties: PropertyPoint[] = [
      { x: 0, k_W_mK: 22, rhoCp_J_m3K: 3.9e6 },
      { x: 0.8, k_W_mK: 35, rhoCp_J_m3K: 3.6e6 },
      { x: 0.8, k_W_mK: 15, rhoCp_J_m3K: 4.1e6 },
      { x: 1, k_W_mK: 17, rhoCp_J_m3K: 4.0e6 },
    ]
    const h1 = 900
    const h2 = 40
    const p: CooldownProblem = {
      domain: { geometry: 'rod', length_m: L, properties },
      initial: [
        { x: 0, T_C: 860 },
        { x: 1, T_C: 780 },
      ],
      stages: [
        { outer: { type: 'convective', h_W_m2K: h1, ambient_C: 60 }, inner: { type: 'symmetry' }, duration_s: 30 },
        { outer: { type: 'convective', h_W_m2K: h2, ambient_C: 25 }, inner: { type: 'symmetry' } },
      ],
    }
    const times = Array.from({ length: 1201 }, (_, i) => i * 0.25) // 0 … 300 s
    const points = Array.from({ length: 401 }, (_, i) => i / 400)
    const r = solveCrankNicolson(p, { times_s: times, points })

    // (1) The scheme's own ledger: stored-energy drop = heat out, to round-off.
    r.stored_J.forEach((E, i) => expect(Math.abs(r.stored_J[0] - E - r.lost_J[i])).toBeLessThan(1e-11 * r.stored_J[0]))

    // (2) Independently from the outputs: heat out = ∫ h (Ts − T∞) 2πR dt
    //     (trapezoid in time) against the drop of ∫ ρc T 2πr dr (Simpson in r);
    //     both quadratures are good to ~1e-4.
    const rhoCp = (x: number) =>
      x < 0.8 ? 3.9e6 + ((3.6e6 - 3.9e6) * x) / 0.8 : 4.1e6 + ((4.0e6 - 4.1e6) * (x - 0.8)) / 0.2
    const stored = (row: number[]) => {
      let s = 0
      const dx = 1 / 400
      for (let j = 0; j <= 400; j++) {
        const w = j === 0 || j === 400 ? 1 : j % 2 === 1 ? 4 : 2
        const x = points[j]
        // at the jump (x = 0.8, j = 320) Simpson sees the two one-sided values averaged
        const c = j === 320 ? 0.5 * (3.6e6 + 4.1e6) : rhoCp(x)
        s += (w * dx) / 3 * c * row[j] * 2 * Math.PI * x * L * L
      }
      return s
    }
    // The sample at t = 30 s carries the first stage's surface temperature, so the
    // first interval of the second stage is taken from its right end alone.
    const q = (k: number, h: number, ambient_C: number) => h * (r.T_C[k][400] - ambient_C) * 2 * Math.PI * L
    let lost = 0
    for (let i = 1; i < times.length; i++) {
      const dt = times[i] - times[i - 1]
      if (times[i] <= 30) lost += 0.5 * dt * (q(i - 1, h1, 60) + q(i, h1, 60))
      else if (times[i - 1] > 30) lost += 0.5 * dt * (q(i - 1, h2, 25) + q(i, h2, 25))
      else lost += dt * q(i, h2, 25)
    }
    const drop = stored(r.T_C[0]) - stored(r.T_C[times.length - 1])
    expect(Math.abs(drop - lost) / drop).toBeLessThan(5e-4)
    expect(Math.abs(r.lost_J[times.length - 1] - lost) / lost).toBeLessThan(5e-4)
  })

  it('converges at second order: halving cells and the step cap cuts the error about 4×', () => {
    const times = [10, 25, 50]
    const points = [0, 0.5, 0.9]
    const exact = times.map((t) => points.map((x) => T_AMB + (T0 - T_AMB) * fixedSurfaceSeries.rod(x, fo(t))))
    const worstError = (cells: number) => {
      const r = solveCrankNicolson(problem('rod', [fixedSurface(T_AMB)]), {
        times_s: times,
        points,
        cells,
        dt_s: 8 / cells,
      })
      return Math.max(...r.T_C.flatMap((row, i) => row.map((v, j) => Math.abs(v - exact[i][j]))))
    }
    const e = [10, 20, 40].map(worstError)
    expect(e[0] / e[1]).toBeGreaterThan(3.3)
    expect(e[0] / e[1]).toBeLessThan(4.7)
    expect(e[1] / e[2]).toBeGreaterThan(3.3)
    expect(e[1] / e[2]).toBeLessThan(4.7)
  })

  it.each([
    ['domain.length_m', (p: CooldownProblem) => ({ ...p, domain: { ...p.domain, length_m: 0 } })],
    ['rhoCp_J_m3K', (p: CooldownProblem) => ({ ...p, domain: { ...p.domain, properties: [uniform[0], { ...uniform[1], rhoCp_J_m3K: -1 }] } })],
    ['stages[0].inner', (p: CooldownProblem) => ({ ...p, stages: [{ ...p.stages[0], inner: { type: 'fixed' as const, T_C: 0 } }] })],
    ['times_s', (p: CooldownProblem) => ({ ...p, stages: [fixedSurface(20, 5)] })],
  ])('rejects a bad problem, naming %s', (field, mutate) => {
    expect(() => solveCrankNicolson(mutate(problem('rod', [fixedSurface(T_AMB)])), { times_s: [10], points: [0] })).toThrow(field)
  })
})
