/**
 * Levenberg–Marquardt for a small non-linear least-squares problem
 *
 *   minimise ½ Σ r_i(p)²,
 *
 * with Marquardt's scaling: each step solves (JᵀJ + λ·diag(JᵀJ)) δ = −Jᵀr, λ shrinks
 * after a step that lowers the cost and grows (the step is retried) after one that
 * does not (Marquardt, J. SIAM 11 (1963) 431). J comes from forward differences,
 * one extra residual evaluation per parameter. ml-matrix does the linear algebra.
 *
 * ml-levenberg-marquardt was not used: it hides the Jacobian, which the standard
 * uncertainties need, and has no place for penalty rows.
 */
import { Matrix, solve } from 'ml-matrix'

export interface LeastSquaresOptions {
  /** Parameter step for the forward differences. */
  differenceStep?: number
  maxIterations?: number
  /** Stop when a step lowers the cost by less than this fraction. */
  relativeTolerance?: number
  /** Told after each accepted step, so a caller can show progress. */
  onIteration?: (iteration: number, cost: number) => void
}

export interface LeastSquaresResult {
  params: number[]
  residuals: Float64Array
  /** J[i][j] = ∂r_i/∂p_j at the result. */
  jacobian: Matrix
  iterations: number
  converged: boolean
}

const sumSquares = (r: Float64Array) => r.reduce((s, v) => s + v * v, 0)

function forwardJacobian(residuals: (p: number[]) => Float64Array, p: number[], r0: Float64Array, step: number): Matrix {
  const J = new Matrix(r0.length, p.length)
  for (let j = 0; j < p.length; j++) {
    const shifted = p.slice()
    shifted[j] += step
    const r = residuals(shifted)
    for (let i = 0; i < r0.length; i++) J.set(i, j, (r[i] - r0[i]) / step)
  }
  return J
}

export function levenbergMarquardt(residuals: (p: number[]) => Float64Array, start: number[], options: LeastSquaresOptions = {}): LeastSquaresResult {
  const step = options.differenceStep ?? 1e-4
  const maxIterations = options.maxIterations ?? 50
  const tolerance = options.relativeTolerance ?? 1e-7
  let p = start.slice()
  let r = residuals(p)
  let cost = sumSquares(r)
  let J = forwardJacobian(residuals, p, r, step)
  let lambda = 1e-2
  let iterations = 0
  let converged = false
  while (iterations < maxIterations && !converged) {
    iterations++
    const JtJ = J.transpose().mmul(J)
    const gradient = J.transpose().mmul(Matrix.columnVector(Array.from(r)))
    let accepted = false
    // Raise λ until a step lowers the cost (a short, gradient-like step always does).
    for (let attempt = 0; attempt < 20 && !accepted; attempt++) {
      const A = JtJ.clone()
      for (let j = 0; j < p.length; j++) A.set(j, j, JtJ.get(j, j) * (1 + lambda) + 1e-12)
      const delta = solve(A, gradient.clone().mul(-1)).to1DArray()
      const trial = p.map((v, j) => v + delta[j])
      const rTrial = residuals(trial)
      const costTrial = sumSquares(rTrial)
      if (costTrial < cost) {
        converged = cost - costTrial <= tolerance * cost || Math.max(...delta.map(Math.abs)) < 1e-9
        p = trial
        r = rTrial
        cost = costTrial
        lambda = Math.max(lambda / 3, 1e-9)
        accepted = true
        options.onIteration?.(iterations, cost)
      } else lambda *= 4
    }
    if (!accepted) {
      converged = true
      break
    }
    J = forwardJacobian(residuals, p, r, step)
  }
  return { params: p, residuals: r, jacobian: J, iterations, converged }
}
