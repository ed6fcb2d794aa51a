/**
 * Crank–Nicolson finite-volume solver for
 *
 *   ρc(x) ∂T/∂t = x^-m ∂/∂x ( x^m k(x) ∂T/∂x ),   m = 0 slab, 1 rod, 2 sphere,
 *
 * kept on a code path of its own so that it can check the eigenmode engine.
 *
 * Space: cell-centred finite volumes on r = x·L. Cell volumes are ∫ r^m dr, face
 * areas r^m, and every property breakpoint is a cell face, so a jump in the table
 * (a repeated x) is a face with a different material on each side. The
 * conductance of an interior face is the series resistance of the two half-cells
 * (∫ dr / k, exact for k linear in each half-cell: the harmonic average); ρc of a
 * cell is the volume average of the piecewise-linear profile.
 * Boundaries act through the half-cell next to them: a convective surface adds
 * 1/h in series, a fixed temperature is the half-cell alone, symmetry is no flux.
 *
 * Time: θ-scheme with θ = ½ (Crank–Nicolson), solved with the Thomas algorithm.
 * A sudden change of surface condition (t = 0 and every stage start) excites grid
 * modes that CN does not damp once μΔt > 2 (its amplification tends to −1, the
 * familiar ringing). Each stage therefore starts with a step at μ_max·Δt = 0.1 for
 * the stiffest grid mode and lets Δt grow linearly with the time since the stage
 * began, Δt = Δt₀ + r·t (optionally capped by dt_s). A mode of rate μ has decayed by
 * exp(−2/r) before Δt passes 2/μ, so nothing rings, and the start-up transient is
 * resolved as finely as the later smooth decay. This replaces fully implicit
 * (Rannacher) start-up steps, which would cost first-order error in the first
 * steps and need a separate tuning for every step size.
 *
 * Verified against separation-of-variables series for slab, rod and sphere
 * (Carslaw & Jaeger, Conduction of Heat in Solids, §3.3, §7.4, §9.3), the one-term
 * Biot solution, discrete energy conservation and second-order grid convergence
 * (tests/unit/thermal/crankNicolson.test.ts).
 */
import type { Deadline } from './deadline'
import { GEOMETRY_EXPONENT, type Boundary, type CooldownProblem, type Stage } from './types'
import { solveTridiagonal } from './tridiagonal'

export interface CrankNicolsonOptions {
  /** Output times, ascending, ≥ 0. */
  times_s: number[]
  /** Output positions as fractions 0–1 of length_m. */
  points: number[]
  /** Approximate number of cells (each property segment gets at least 2). */
  cells?: number
  /** Cap on the time step (default: none, the step grows with time; see RAMP_RATE). */
  dt_s?: number
  /**
   * Growth rate r of the step (default RAMP_RATE, ≈ 0.003 K of time error on an
   * 800 K drop). A larger r trades accuracy for fewer steps, so a comparison at a
   * looser accuracy can tune the step as well as the grid.
   */
  rampRate?: number
  /** Checked every few dozen steps; absent, the solve takes the time it needs. */
  deadline?: Deadline
}

export interface CrankNicolsonResult {
  t_s: number[]
  /** T_C[timeIndex][pointIndex]. */
  T_C: number[][]
  /**
   * Heat content relative to 0 °C at each output time. Per m² of face for a slab,
   * per m of length for a rod, for the whole ball for a sphere.
   */
  stored_J: number[]
  /** Heat that has left through the two ends since t = 0 (same measure as stored_J). */
  lost_J: number[]
}

/**
 * Default cell count: the spatial error of the scheme is ~ΔT·(Δx/L)²; 400 cells
 * keep it near 0.01 K on an 800 K drop (measured in the tests).
 */
const DEFAULT_CELLS = 400
/**
 * Growth rate r of the step, Δt = Δt₀ + r·t since the stage start. CN's phase
 * error on a mode of rate μ is (μΔt)³/12 per step; summed along the ramp and
 * weighted by the mode's decay e^{-μt} it peaks at ≈ r²/27 of the mode's initial
 * amplitude, i.e. ≈ 0.003 K on an 800 K drop at r = 0.01, for every μ at once
 * (measured: 0.013–0.02 K at r = 0.02, ≤ 0.006 K at r = 0.01).
 * So no separate Δt_max is needed for accuracy; late in a cooldown the steps
 * grow with the elapsed time and a long run costs only ln(t/Δt₀)/r steps.
 */
const RAMP_RATE = 0.01
/** Weight of the new time level: ½ is Crank–Nicolson (trapezoidal in time, second order). */
const THETA = 0.5
/** First step of each stage: μ_max·Δt₀ for the stiffest grid mode. */
const START_STEP_STIFFNESS = 0.1

/** Measure of the unit domain: face area of a slab, 2π for a rod per metre, 4π for a ball. */
const MEASURE = [1, 2 * Math.PI, 4 * Math.PI] as const

interface LinearTable {
  x: number[]
  v: number[]
}

/** Index j of the segment [x_j, x_{j+1}] (x_j < x_{j+1}) that contains xi. */
function segmentOf(table: LinearTable, xi: number): number {
  const n = table.x.length
  for (let j = 0; j < n - 2; j++) {
    if (xi <= table.x[j + 1] && table.x[j] < table.x[j + 1]) return j
  }
  return n - 2
}

/** Value of segment j's straight line at xi (a one-sided value at a jump). */
function lineValue(table: LinearTable, j: number, xi: number): number {
  const x0 = table.x[j]
  const x1 = table.x[j + 1]
  const v0 = table.v[j]
  return v0 + ((table.v[j + 1] - v0) * (xi - x0)) / (x1 - x0)
}

/**
 * Average of a piecewise-linear table over [a, b] with weight x^m. Split at the
 * table's breakpoints; 2-point Gauss is exact on each piece (degree ≤ 3).
 */
function weightedAverage(table: LinearTable, a: number, b: number, m: number): number {
  const cuts = [a, ...table.x.filter((xi) => xi > a && xi < b), b]
  let integral = 0
  let weight = 0
  const g = 0.5 / Math.sqrt(3)
  for (let p = 0; p < cuts.length - 1; p++) {
    const lo = cuts[p]
    const hi = cuts[p + 1]
    if (hi <= lo) continue
    const j = segmentOf(table, 0.5 * (lo + hi))
    for (const s of [0.5 - g, 0.5 + g]) {
      const xi = lo + s * (hi - lo)
      const w = (xi ** m * (hi - lo)) / 2
      integral += w * lineValue(table, j, xi)
      weight += w
    }
  }
  return integral / weight
}

/** Logarithmic mean of two positive numbers: ∫ dr / k over a span where k is linear is span / logMean. */
function logMean(a: number, b: number): number {
  return Math.abs(b - a) <= 1e-6 * a ? 0.5 * (a + b) : (b - a) / Math.log(b / a)
}

function checkTable(name: string, xs: number[], values: number[], positive: boolean): void {
  if (xs.length < 2) throw new RangeError(`${name}: needs at least two points`)
  if (xs[0] !== 0 || xs[xs.length - 1] !== 1) throw new RangeError(`${name}: x must run from 0 to 1`)
  for (let i = 0; i < xs.length; i++) {
    if (!Number.isFinite(xs[i]) || !Number.isFinite(values[i])) throw new RangeError(`${name}[${i}]: not a finite number`)
    if (positive && !(values[i] > 0)) throw new RangeError(`${name}[${i}]: must be positive`)
    if (i > 0 && xs[i] < xs[i - 1]) throw new RangeError(`${name}[${i}].x: must not decrease`)
    if (i > 1 && xs[i] === xs[i - 2]) throw new RangeError(`${name}[${i}].x: at most two points may share an x`)
  }
}

function checkBoundary(name: string, b: Boundary): void {
  if (b.type === 'convective') {
    if (!(b.h_W_m2K > 0) || !Number.isFinite(b.h_W_m2K)) throw new RangeError(`${name}.h_W_m2K: must be positive`)
    if (!Number.isFinite(b.ambient_C)) throw new RangeError(`${name}.ambient_C: not a finite number`)
  } else if (b.type === 'fixed' && !Number.isFinite(b.T_C)) {
    throw new RangeError(`${name}.T_C: not a finite number`)
  }
}

/** A boundary as a conductance (per unit face area, through the half-cell) to a temperature. */
interface BoundaryLink {
  /** W/(m²K) from the cell centre to the far temperature; 0 for symmetry. */
  u: number
  /** The far temperature (ambient or the fixed face). */
  far_C: number
  /** Resistance of the half-cell alone, m²K/W: the face temperature lies this far along the path. */
  halfRes: number
}

function link(b: Boundary, halfRes: number): BoundaryLink {
  if (b.type === 'symmetry') return { u: 0, far_C: 0, halfRes }
  if (b.type === 'fixed') return { u: 1 / halfRes, far_C: b.T_C, halfRes }
  return { u: 1 / (halfRes + 1 / b.h_W_m2K), far_C: b.ambient_C, halfRes }
}

/** Temperature of the face itself: the cell temperature less the drop across the half-cell. */
function faceTemperature(l: BoundaryLink, cell_C: number, b: Boundary): number {
  if (b.type === 'fixed') return b.T_C
  if (b.type === 'symmetry') return cell_C
  return cell_C - l.u * (cell_C - l.far_C) * l.halfRes
}

/**
 * Temperatures at `points` (fractions of length_m) and `times_s` for a staged
 * cooldown, by Crank–Nicolson finite volumes. Throws RangeError naming the field
 * for an invalid problem or options.
 */
export function solveCrankNicolson(problem: CooldownProblem, opts: CrankNicolsonOptions): CrankNicolsonResult {
  const { domain, stages } = problem
  const m = GEOMETRY_EXPONENT[domain.geometry]
  if (m === undefined) throw new RangeError(`domain.geometry: unknown geometry ${String(domain.geometry)}`)
  const L = domain.length_m
  if (!(L > 0) || !Number.isFinite(L)) throw new RangeError('domain.length_m: must be positive')

  const props = domain.properties
  const kTable: LinearTable = { x: props.map((p) => p.x), v: props.map((p) => p.k_W_mK) }
  const cTable: LinearTable = { x: props.map((p) => p.x), v: props.map((p) => p.rhoCp_J_m3K) }
  checkTable('domain.properties.k_W_mK', kTable.x, kTable.v, true)
  checkTable('domain.properties.rhoCp_J_m3K', cTable.x, cTable.v, true)

  const initialTable: LinearTable =
    typeof problem.initial === 'number'
      ? { x: [0, 1], v: [problem.initial, problem.initial] }
      : { x: problem.initial.map((p) => p.x), v: problem.initial.map((p) => p.T_C) }
  checkTable('initial', initialTable.x, initialTable.v, false)

  if (stages.length === 0) throw new RangeError('stages: at least one stage is needed')
  stages.forEach((s, i) => {
    checkBoundary(`stages[${i}].outer`, s.outer)
    checkBoundary(`stages[${i}].inner`, s.inner)
    if (m > 0 && s.inner.type !== 'symmetry') {
      throw new RangeError(`stages[${i}].inner: a ${domain.geometry} has a symmetric centre`)
    }
    const last = i === stages.length - 1
    if (!(last && s.duration_s === undefined) && !(s.duration_s! > 0 && Number.isFinite(s.duration_s))) {
      throw new RangeError(`stages[${i}].duration_s: must be positive${last ? ' or absent' : ''}`)
    }
  })

  const times = opts.times_s
  times.forEach((t, i) => {
    if (!(t >= 0) || !Number.isFinite(t)) throw new RangeError(`times_s[${i}]: must be a time ≥ 0`)
    if (i > 0 && t < times[i - 1]) throw new RangeError(`times_s[${i}]: times must be ascending`)
  })
  opts.points.forEach((x, i) => {
    if (!(x >= 0 && x <= 1)) throw new RangeError(`points[${i}]: must be a fraction 0–1`)
  })
  const tLast = times.length > 0 ? times[times.length - 1] : 0
  const stageStart: number[] = [0]
  for (const s of stages) stageStart.push(stageStart[stageStart.length - 1] + (s.duration_s ?? Infinity))
  if (tLast > stageStart[stages.length]) {
    throw new RangeError('times_s: the last time is after the end of the last stage')
  }
  const cellsWanted = opts.cells ?? DEFAULT_CELLS
  if (!(cellsWanted >= 2) || !Number.isInteger(cellsWanted)) throw new RangeError('cells: must be an integer ≥ 2')
  if (opts.dt_s !== undefined && !(opts.dt_s > 0 && Number.isFinite(opts.dt_s))) {
    throw new RangeError('dt_s: must be positive')
  }
  const rampRate = opts.rampRate ?? RAMP_RATE
  if (!(rampRate > 0 && rampRate < 1)) throw new RangeError('rampRate: must be between 0 and 1')

  // Faces in x: every distinct property breakpoint, uniform spacing in between.
  const breaks = [...new Set(kTable.x)]
  const facesX: number[] = [0]
  for (let j = 0; j < breaks.length - 1; j++) {
    const span = breaks[j + 1] - breaks[j]
    const n = Math.max(2, Math.round(cellsWanted * span))
    for (let i = 1; i <= n; i++) facesX.push(i === n ? breaks[j + 1] : breaks[j] + (span * i) / n)
  }
  const N = facesX.length - 1
  const centreX = new Float64Array(N)
  const capacity = new Float64Array(N) // ρc·V, J/K per unit measure
  const halfResLeft = new Float64Array(N) // ∫ dr/k from the left face to the centre
  const halfResRight = new Float64Array(N) // ∫ dr/k from the centre to the right face
  for (let i = 0; i < N; i++) {
    const a = facesX[i]
    const b = facesX[i + 1]
    const c = 0.5 * (a + b)
    centreX[i] = c
    const volume = (L ** (m + 1) * (b ** (m + 1) - a ** (m + 1))) / (m + 1)
    const rhoCp = weightedAverage(cTable, a, b, m)
    capacity[i] = rhoCp * volume
    const j = segmentOf(kTable, c)
    const kA = lineValue(kTable, j, a)
    const kC = lineValue(kTable, j, c)
    const kB = lineValue(kTable, j, b)
    halfResLeft[i] = ((c - a) * L) / logMean(kA, kC)
    halfResRight[i] = ((b - c) * L) / logMean(kC, kB)
  }
  // Interior face conductances G[i] between cells i-1 and i (W/K per unit measure).
  const G = new Float64Array(N + 1)
  for (let i = 1; i < N; i++) {
    G[i] = (L * facesX[i]) ** m / (halfResRight[i - 1] + halfResLeft[i])
  }
  const innerArea = m === 0 ? 1 : 0
  const outerArea = L ** m

  const dtMax = opts.dt_s ?? Infinity

  const T = new Float64Array(N)
  for (let i = 0; i < N; i++) T[i] = weightedAverage(initialTable, facesX[i], facesX[i + 1], m)

  const lower = new Float64Array(N)
  const diag = new Float64Array(N)
  const upper = new Float64Array(N)
  const rhs = new Float64Array(N)
  const next = new Float64Array(N)
  const scratch = new Float64Array(N)

  const result: CrankNicolsonResult = { t_s: [], T_C: [], stored_J: [], lost_J: [] }
  let lost = 0

  const sample = (stage: Stage, inner: BoundaryLink, outer: BoundaryLink, t: number): void => {
    const surface = faceTemperature(outer, T[N - 1], stage.outer)
    const row = opts.points.map((x) => {
      if (x >= centreX[N - 1]) {
        const s = (x - centreX[N - 1]) / (1 - centreX[N - 1])
        return T[N - 1] + s * (surface - T[N - 1])
      }
      if (x <= centreX[0]) {
        if (stage.inner.type === 'symmetry') {
          // Even in x about the centre: T = a + b·x² through the first two cells.
          const b = (T[1] - T[0]) / (centreX[1] ** 2 - centreX[0] ** 2)
          return T[0] + b * (x * x - centreX[0] ** 2)
        }
        const face = faceTemperature(inner, T[0], stage.inner)
        return face + (x / centreX[0]) * (T[0] - face)
      }
      let i = 0
      while (centreX[i + 1] < x) i++
      // Through the face between the two centres, at the temperature flux
      // continuity gives it, so a kink at a material jump is kept (in a uniform
      // material this is plain linear interpolation).
      const rl = halfResRight[i]
      const rr = halfResLeft[i + 1]
      const face_C = (T[i] * rr + T[i + 1] * rl) / (rl + rr)
      const xf = facesX[i + 1]
      return x <= xf
        ? T[i] + ((x - centreX[i]) / (xf - centreX[i])) * (face_C - T[i])
        : face_C + ((x - xf) / (centreX[i + 1] - xf)) * (T[i + 1] - face_C)
    })
    let stored = 0
    for (let i = 0; i < N; i++) stored += capacity[i] * T[i]
    result.t_s.push(t)
    result.T_C.push(row)
    result.stored_J.push(MEASURE[m] * stored)
    result.lost_J.push(MEASURE[m] * lost)
  }

  let t = 0
  let nextOut = 0
  let steps = 0
  for (let k = 0; k < stages.length && nextOut < times.length; k++) {
    const stage = stages[k]
    const inner = link(stage.inner, halfResLeft[0])
    const outer = link(stage.outer, halfResRight[N - 1])
    const gIn = innerArea * inner.u
    const gOut = outerArea * outer.u
    // C dT/dt = −A·T + s, A tridiagonal and symmetric with row sums = boundary links.
    let muMax = 0
    for (let i = 0; i < N; i++) {
      const aii = G[i] + G[i + 1] + (i === 0 ? gIn : 0) + (i === N - 1 ? gOut : 0)
      muMax = Math.max(muMax, (2 * aii) / capacity[i])
    }
    const dtStart = Math.min(dtMax, START_STEP_STIFFNESS / muMax)
    const tEnd = Math.min(stageStart[k + 1], tLast)
    while (nextOut < times.length && times[nextOut] <= t) sample(stage, inner, outer, times[nextOut++])

    let sinceStart = 0
    while (t < tEnd) {
      const target = Math.min(tEnd, times[nextOut] ?? tEnd)
      const remaining = target - t
      let dt = Math.min(dtMax, dtStart + rampRate * sinceStart)
      // Land exactly on the target; halve the last two steps rather than leave a sliver.
      const landing = remaining <= dt * (1 + 1e-9)
      if (landing) dt = remaining
      else if (remaining < 2 * dt) dt = remaining / 2

      for (let i = 0; i < N; i++) {
        const gl = G[i]
        const gr = G[i + 1]
        const gb = (i === 0 ? gIn : 0) + (i === N - 1 ? gOut : 0)
        const source = (i === 0 ? gIn * inner.far_C : 0) + (i === N - 1 ? gOut * outer.far_C : 0)
        const aii = gl + gr + gb
        const explicitFlux =
          (i > 0 ? gl * T[i - 1] : 0) + (i < N - 1 ? gr * T[i + 1] : 0) - aii * T[i]
        lower[i] = -THETA * gl
        upper[i] = -THETA * gr
        diag[i] = capacity[i] / dt + THETA * aii
        rhs[i] = (capacity[i] / dt) * T[i] + (1 - THETA) * explicitFlux + source
      }
      solveTridiagonal(lower, diag, upper, rhs, next, scratch)
      lost +=
        dt *
        (gIn * (THETA * next[0] + (1 - THETA) * T[0] - inner.far_C) +
          gOut * (THETA * next[N - 1] + (1 - THETA) * T[N - 1] - outer.far_C))
      T.set(next)
      t = landing ? target : t + dt
      sinceStart += dt
      if (++steps % 64 === 0) opts.deadline?.check()
      while (nextOut < times.length && times[nextOut] <= t) sample(stage, inner, outer, times[nextOut++])
    }
  }
  return result
}
