/**
 * Crank–Nicolson finite volumes with temperature-dependent physics, the independent
 * check of temperatureDependent.ts (they share nothing but types and the table
 * readers):
 *
 *   ρc(x, T) ∂T/∂t = x^-m ∂/∂x ( x^m k(x, T) ∂T/∂x ),   −k ∂T/∂r = q(T_s) at a convective face,
 *
 * with q from surfaceCurve.ts (h(T_s) and radiation). Cells as in crankNicolson.ts
 * (cell-centred on r = xL, a cell face at every property breakpoint); each cell has
 * k and ρc at its own temperature (and, for a graded part, at its centre), and an
 * interior face the series resistance of its two half-cells (the harmonic mean of
 * their conductivities). A face's flux runs through its half-cell to the surface and
 * on through 1/h_eff at the surface temperature, which is solved for with it.
 *
 * Time: the trapezoidal rule with every coefficient taken at the step's midpoint
 * temperature ½(Tⁿ + Tⁿ⁺¹), iterated (Picard) until Tⁿ⁺¹ changes by less than
 * 1e-9 K, so the scheme stays second order in Δt with non-linear coefficients. Steps
 * start small at each stage start and grow linearly with the time since, Δt = Δt₀ +
 * r·t, as in crankNicolson.ts (which explains why no ringing survives).
 * Refined until the answer stops changing in tests/unit/thermal/temperatureDependent.test.ts,
 * and checked against the Kirchhoff closed form there.
 */
import type { Deadline } from './deadline'
import { EngineLimitError } from './errors'
import { interpolate, materialCurves } from './propertyTable'
import { surfaceLaw, type SurfaceLaw } from './surfaceCurve'
import { solveTridiagonal } from './tridiagonal'
import { GEOMETRY_EXPONENT, type Boundary, type CooldownProblem } from './types'

export interface NonlinearCrankNicolsonOptions {
  /** Output times, ascending, ≥ 0. */
  times_s: number[]
  /** Output positions as fractions 0–1 of length_m. */
  points: number[]
  /** Number of cells (default 400). */
  cells?: number
  /** Growth rate r of the step since each stage start (default 0.01). */
  rampRate?: number
  /** Checked every 16 steps; absent, the solve takes the time it needs. */
  deadline?: Deadline
}

export interface NonlinearCrankNicolsonResult {
  t_s: number[]
  /** T_C[timeIndex][pointIndex]. */
  T_C: number[][]
}

const START_STEP_STIFFNESS = 0.1
const PICARD_TOLERANCE_K = 1e-9
const MAX_PICARD = 50

/** A face of the domain as seen by the cells: no flux, a fixed temperature, or a surface law. */
type Face = { type: 'symmetry' } | { type: 'fixed'; T_C: number } | { type: 'convective'; law: SurfaceLaw }

const faceOf = (b: Boundary): Face => (b.type === 'convective' ? { type: 'convective', law: surfaceLaw(b) } : b)

/** Conductance (per unit area) from a cell centre through its half-cell r and the face condition, and the far temperature. */
function faceLink(face: Face, halfRes: number, surface_C: number): { u: number; far_C: number } {
  if (face.type === 'symmetry') return { u: 0, far_C: 0 }
  if (face.type === 'fixed') return { u: 1 / halfRes, far_C: face.T_C }
  return { u: 1 / (halfRes + 1 / face.law.effectiveH(surface_C)), far_C: face.law.ambient_C }
}

/** Surface temperature between a cell at T and the far side of a link: the drop across the half-cell. */
function surfaceTemperature(face: Face, halfRes: number, cell_C: number, hint_C: number): number {
  if (face.type === 'symmetry') return cell_C
  if (face.type === 'fixed') return face.T_C
  const { u, far_C } = faceLink(face, halfRes, hint_C)
  return cell_C - u * (cell_C - far_C) * halfRes
}

export function solveCrankNicolsonNonlinear(problem: CooldownProblem, opts: NonlinearCrankNicolsonOptions): NonlinearCrankNicolsonResult {
  const { domain, stages } = problem
  const m = GEOMETRY_EXPONENT[domain.geometry]
  const L = domain.length_m
  const N = opts.cells ?? 400
  if (!(Number.isInteger(N) && N >= 4)) throw new RangeError('cells: must be an integer ≥ 4')
  const rampRate = opts.rampRate ?? 0.01
  if (!(rampRate > 0 && rampRate < 1)) throw new RangeError('rampRate: must be between 0 and 1')
  opts.times_s.forEach((t, i) => {
    if (!(t >= 0) || (i > 0 && t < opts.times_s[i - 1])) throw new RangeError(`times_s[${i}]: must be ascending times ≥ 0`)
  })

  const faces = Array.from({ length: N + 1 }, (_, i) => i / N)
  const centre = Float64Array.from({ length: N }, (_, i) => (i + 0.5) / N)
  const volume = Float64Array.from({ length: N }, (_, i) => (L ** (m + 1) * (faces[i + 1] ** (m + 1) - faces[i] ** (m + 1))) / (m + 1))
  const area = Float64Array.from(faces, (x) => (x * L) ** m)
  const half = (0.5 * L) / N

  // k and ρc of each cell at a temperature: from the table, or the spatial profile at the cell centre.
  const table = domain.temperatureTable ? materialCurves(domain.temperatureTable) : null
  const props = domain.properties
  const profileAt = (values: number[], x: number) => interpolate(props.map((p) => p.x), values, x)
  const kCell = Float64Array.from(centre, (x) => profileAt(props.map((p) => p.k_W_mK), x))
  const cCell = Float64Array.from(centre, (x) => profileAt(props.map((p) => p.rhoCp_J_m3K), x))
  const kOf = (i: number, T: number) => (table ? interpolate(table.T_C, table.k_W_mK, T) : kCell[i])
  const cOf = (i: number, T: number) => (table ? interpolate(table.T_C, table.rhoCp_J_m3K, T) : cCell[i])

  const initial = problem.initial
  const T = Float64Array.from(centre, (x) => (typeof initial === 'number' ? initial : interpolate(initial.map((p) => p.x), initial.map((p) => p.T_C), x)))
  const next = new Float64Array(N)
  const iterate = new Float64Array(N)
  const mid = new Float64Array(N)
  const k = new Float64Array(N)
  const cap = new Float64Array(N)
  const G = new Float64Array(N + 1)
  const lower = new Float64Array(N)
  const diag = new Float64Array(N)
  const upper = new Float64Array(N)
  const rhs = new Float64Array(N)
  const scratch = new Float64Array(N)

  const result: NonlinearCrankNicolsonResult = { t_s: [], T_C: [] }
  let inner: Face = faceOf(stages[0].inner)
  let outer: Face = faceOf(stages[0].outer)
  const sample = (t: number) => {
    const kOuter = kOf(N - 1, T[N - 1])
    const surface = surfaceTemperature(outer, half / kOuter, T[N - 1], T[N - 1])
    const face0 = surfaceTemperature(inner, half / kOf(0, T[0]), T[0], T[0])
    result.t_s.push(t)
    result.T_C.push(
      opts.points.map((x) => {
        if (x >= centre[N - 1]) return T[N - 1] + ((x - centre[N - 1]) / (1 - centre[N - 1])) * (surface - T[N - 1])
        if (x <= centre[0]) {
          if (inner.type !== 'symmetry') return face0 + (x / centre[0]) * (T[0] - face0)
          // Even about the centre: a + b x² through the first two cells.
          const b = (T[1] - T[0]) / (centre[1] ** 2 - centre[0] ** 2)
          return T[0] + b * (x * x - centre[0] ** 2)
        }
        const i = Math.min(N - 2, Math.floor(x * N - 0.5))
        return T[i] + ((x - centre[i]) / (centre[i + 1] - centre[i])) * (T[i + 1] - T[i])
      }),
    )
  }

  /** Coefficients at the temperatures `at`; returns the two face links. */
  const coefficients = (at: Float64Array) => {
    for (let i = 0; i < N; i++) {
      k[i] = kOf(i, at[i])
      cap[i] = cOf(i, at[i]) * volume[i]
    }
    for (let i = 1; i < N; i++) G[i] = area[i] / (half / k[i - 1] + half / k[i])
    const surface = surfaceTemperature(outer, half / k[N - 1], at[N - 1], at[N - 1])
    const face0 = surfaceTemperature(inner, half / k[0], at[0], at[0])
    const o = faceLink(outer, half / k[N - 1], surface)
    const n = faceLink(inner, half / k[0], face0)
    return { gOut: area[N] * o.u, farOut: o.far_C, gIn: (m === 0 ? 1 : 0) * n.u, farIn: n.far_C }
  }

  const times = opts.times_s
  let nextOut = 0
  let t = 0
  let stageStart = 0
  let steps = 0
  for (let s = 0; s < stages.length && nextOut < times.length; s++) {
    inner = faceOf(stages[s].inner)
    outer = faceOf(stages[s].outer)
    const stageEnd = stages[s].duration_s === undefined ? Infinity : stageStart + (stages[s].duration_s as number)
    while (nextOut < times.length && times[nextOut] <= t) sample(times[nextOut++])
    const start = coefficients(T)
    let muMax = 0
    for (let i = 0; i < N; i++) muMax = Math.max(muMax, (2 * (G[i] + G[i + 1] + (i === 0 ? start.gIn : 0) + (i === N - 1 ? start.gOut : 0))) / cap[i])
    const dt0 = START_STEP_STIFFNESS / muMax
    const tEnd = Math.min(stageEnd, times[times.length - 1] ?? 0)
    while (t < tEnd) {
      const target = Math.min(tEnd, times[nextOut] ?? tEnd)
      let dt = dt0 + rampRate * (t - stageStart)
      const landing = target - t <= dt * (1 + 1e-9)
      if (landing) dt = target - t
      else if (target - t < 2 * dt) dt = (target - t) / 2
      iterate.set(T)
      for (let sweep = 0; ; sweep++) {
        for (let i = 0; i < N; i++) mid[i] = 0.5 * (T[i] + iterate[i])
        const { gIn, farIn, gOut, farOut } = coefficients(mid)
        for (let i = 0; i < N; i++) {
          const gl = G[i]
          const gr = G[i + 1]
          const gb = (i === 0 ? gIn : 0) + (i === N - 1 ? gOut : 0)
          const source = (i === 0 ? gIn * farIn : 0) + (i === N - 1 ? gOut * farOut : 0)
          const aii = gl + gr + gb
          const flux = (i > 0 ? gl * T[i - 1] : 0) + (i < N - 1 ? gr * T[i + 1] : 0) - aii * T[i]
          lower[i] = -0.5 * gl
          upper[i] = -0.5 * gr
          diag[i] = cap[i] / dt + 0.5 * aii
          rhs[i] = (cap[i] / dt) * T[i] + 0.5 * flux + source
        }
        solveTridiagonal(lower, diag, upper, rhs, next, scratch)
        let change = 0
        for (let i = 0; i < N; i++) change = Math.max(change, Math.abs(next[i] - iterate[i]))
        iterate.set(next)
        if (change < PICARD_TOLERANCE_K) break
        if (sweep >= MAX_PICARD || !Number.isFinite(change)) throw new EngineLimitError(`the finite-volume check did not settle in ${MAX_PICARD} sweeps of a step`)
      }
      T.set(iterate)
      t = landing ? target : t + dt
      if (++steps % 16 === 0) opts.deadline?.check()
      while (nextOut < times.length && times[nextOut] <= t) sample(times[nextOut++])
    }
    stageStart = stageEnd
  }
  return result
}
