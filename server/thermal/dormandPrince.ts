/**
 * Adaptive Dormand–Prince 5(4) integrator with dense output.
 *
 * Tableau, error estimate and the 4th-order continuous extension are those of
 * Hairer, Nørsett & Wanner, "Solving Ordinary Differential Equations I", §II.5–6
 * (the DOPRI5 code). The step always lands exactly on x1, so a caller that
 * integrates piece by piece restarts the step at every property jump, where
 * the state (f, p) is continuous but its derivative is not.
 */

import type { Deadline } from './deadline'
import { EngineLimitError } from './errors'

export type Rhs = (x: number, y: Float64Array, dydx: Float64Array) => void

export interface DenseSegment {
  x0: number
  h: number
  /** Five coefficient blocks of length n (rcont1…rcont5 in DOPRI5). */
  rc: Float64Array
}

export interface IntegrateOptions {
  rtol: number
  atol: number
  /** Largest step allowed (keeps oscillatory solutions resolved). */
  hmax?: number
  /** Initial step guess (e.g. the last accepted step of the previous piece). */
  h0?: number
  /** Record dense-output segments. */
  dense?: boolean
  /** Called after every accepted step with the new state. */
  onStep?: (x: number, y: Float64Array) => void
  maxSteps?: number
  /**
   * Running peak |y_i|, read and updated. When given, component errors are
   * measured against the solution's size so far rather than its local value, so
   * an oscillating component does not force tiny steps near its zeros.
   */
  peak?: Float64Array
  /**
   * Only the first this many components control the step (default: all). Components
   * carried along for a first-order correction need no error control of their own.
   */
  errorComponents?: number
  /** Checked every DEADLINE_STRIDE steps. */
  deadline?: Deadline
}

/** Steps between deadline checks: a few hundred microseconds of work. */
const DEADLINE_STRIDE = 256

export interface IntegrateResult {
  y: Float64Array
  /** Suggested next step size. */
  h: number
  steps: number
  segments: DenseSegment[]
}

const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9
const A21 = 1 / 5
const A31 = 3 / 40, A32 = 9 / 40
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656
const A71 = 35 / 384, A73 = 500 / 1113, A74 = 125 / 192, A75 = -2187 / 6784, A76 = 11 / 84
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072
const D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423

/** Integrates y′ = rhs(x, y) from x0 to x1 (> x0) starting at y0 (not modified). */
export function integrate(rhs: Rhs, x0: number, y0: Float64Array, x1: number, options: IntegrateOptions): IntegrateResult {
  const n = y0.length
  const { rtol, atol } = options
  const span = x1 - x0
  const hmax = Math.min(options.hmax ?? span, span)
  const maxSteps = options.maxSteps ?? 100000
  const y = Float64Array.from(y0)
  const k1 = new Float64Array(n), k2 = new Float64Array(n), k3 = new Float64Array(n)
  const k4 = new Float64Array(n), k5 = new Float64Array(n), k6 = new Float64Array(n), k7 = new Float64Array(n)
  const yt = new Float64Array(n), ynew = new Float64Array(n)
  const segments: DenseSegment[] = []
  const peak = options.peak
  const controlled = options.errorComponents ?? n
  if (peak) for (let i = 0; i < n; i++) peak[i] = Math.max(peak[i], Math.abs(y[i]))
  let x = x0
  rhs(x, y, k1)
  let h = options.h0 ?? initialStep(y, k1, rtol, atol, span)
  h = Math.min(h, hmax)
  let steps = 0
  let rejectedLast = false
  while (x < x1) {
    if (steps++ > maxSteps) throw new EngineLimitError(`an integration needed more than ${maxSteps} steps; smooth the profile or reduce its jumps`)
    if (steps % DEADLINE_STRIDE === 0) options.deadline?.check()
    let last = false
    if (x + h >= x1 || x + 1.01 * h >= x1) {
      h = x1 - x
      last = true
    }
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * A21 * k1[i]
    rhs(x + C2 * h, yt, k2)
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i])
    rhs(x + C3 * h, yt, k3)
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i])
    rhs(x + C4 * h, yt, k4)
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i])
    rhs(x + C5 * h, yt, k5)
    for (let i = 0; i < n; i++) yt[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i])
    const xEnd = last ? x1 : x + h
    rhs(xEnd, yt, k6)
    for (let i = 0; i < n; i++) ynew[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i])
    rhs(xEnd, ynew, k7)
    let err = 0
    for (let i = 0; i < controlled; i++) {
      const e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i])
      const sc = atol + rtol * Math.max(Math.abs(y[i]), Math.abs(ynew[i]), peak ? peak[i] : 0)
      err += (e / sc) ** 2
    }
    err = Math.sqrt(err / controlled)
    // NaN would fail both branches' tests and shrink h forever.
    if (Number.isNaN(err)) throw new EngineLimitError('an integration met a non-finite value')
    if (err <= 1) {
      if (options.dense) {
        const rc = new Float64Array(5 * n)
        for (let i = 0; i < n; i++) {
          const dy = ynew[i] - y[i]
          const bspl = h * k1[i] - dy
          rc[i] = y[i]
          rc[n + i] = dy
          rc[2 * n + i] = bspl
          rc[3 * n + i] = dy - h * k7[i] - bspl
          rc[4 * n + i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i])
        }
        segments.push({ x0: x, h, rc })
      }
      x = xEnd
      y.set(ynew)
      if (peak) for (let i = 0; i < n; i++) peak[i] = Math.max(peak[i], Math.abs(y[i]))
      k1.set(k7)
      options.onStep?.(x, y)
      const grow = err === 0 ? 5 : Math.min(5, 0.9 * err ** -0.2)
      const hNext = Math.min(hmax, h * (rejectedLast ? Math.min(1, grow) : grow))
      rejectedLast = false
      if (last) return { y, h: hNext, steps, segments }
      h = hNext
    } else {
      h *= Math.max(0.2, 0.9 * err ** -0.2)
      rejectedLast = true
    }
  }
  return { y, h, steps, segments }
}

/** Component `i` of the dense-output polynomial of a segment at x (x0 ≤ x ≤ x0 + h). */
export function denseValue(segment: DenseSegment, n: number, i: number, x: number): number {
  const s = (x - segment.x0) / segment.h
  const s1 = 1 - s
  const rc = segment.rc
  return rc[i] + s * (rc[n + i] + s1 * (rc[2 * n + i] + s * (rc[3 * n + i] + s1 * rc[4 * n + i])))
}

/** Hairer's starting-step heuristic, simplified: one explicit Euler-size estimate. */
function initialStep(y: Float64Array, f: Float64Array, rtol: number, atol: number, span: number): number {
  let d0 = 0
  let d1 = 0
  for (let i = 0; i < y.length; i++) {
    const sc = atol + rtol * Math.abs(y[i])
    d0 += (y[i] / sc) ** 2
    d1 += (f[i] / sc) ** 2
  }
  const h = d0 < 1e-10 || d1 < 1e-10 ? 1e-6 * span : 0.01 * Math.sqrt(d0 / d1)
  return Math.min(h, span)
}
