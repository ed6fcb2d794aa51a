/**
 * Eigenvalues and eigenvectors of a small symmetric matrix by the cyclic Jacobi
 * method (Golub & Van Loan, Matrix Computations, 4th ed., §8.5): rotations that zero
 * one off-diagonal pair at a time, swept until the off-diagonal part is below 1e-11
 * of the diagonal (Frobenius norms): the modes are then those of a matrix within
 * 1e-11 of the Ritz matrix, far inside its quadrature error (~1e-6), and the
 * eigenvalues, whose error is quadratic in it, exact to rounding. Convergence is
 * quadratic once the matrix is nearly diagonal, which is the case here: the Ritz matrices of temperatureDependent.ts are
 * written in a basis of modes of a nearby uniform body, so two or three sweeps do.
 * Checked against closed-form spectra (tests/unit/thermal/ritzModes.test.ts).
 */
import { EngineLimitError } from './errors'

/** Default stop: Σ off-diagonal² ≤ tolerance² × Σ diagonal². */
const OFF_DIAGONAL = 1e-11
/** Skip a pair with a_pq² ≤ this × tolerance² × |a_pp a_qq|: such pairs sum to under the stopping test (n ≤ 100). */
const NEGLIGIBLE_PAIR = 1e-4

/**
 * Diagonalises the n×n symmetric matrix a (row-major, overwritten) in place: on
 * return its diagonal holds the eigenvalues and column j of `vectors` (row-major,
 * n×n) the unit eigenvector of eigenvalue a[j·n + j].
 *
 * With `start`, the orthogonal eigenvectors of a nearby matrix (a previous sub-step's),
 * a is first rotated into them (Vᵀ a V, nearly diagonal) and the sweeps continue from
 * there: two or three instead of five to eight from the identity. `tolerance` is the
 * stopping test's relative off-diagonal size (default 1e-11, above).
 */
export function jacobiEigen(a: Float64Array, n: number, vectors: Float64Array, start?: Float64Array, tolerance = OFF_DIAGONAL): void {
  const stop = tolerance * tolerance
  const negligible = NEGLIGIBLE_PAIR * stop
  if (start) {
    rotateInto(a, n, start)
    vectors.set(start)
  } else {
    vectors.fill(0)
    for (let i = 0; i < n; i++) vectors[i * n + i] = 1
  }
  for (let sweep = 0; sweep < 50; sweep++) {
    let off = 0
    let diag = 0
    for (let i = 0; i < n; i++) {
      diag += a[i * n + i] * a[i * n + i]
      for (let j = i + 1; j < n; j++) off += a[i * n + j] * a[i * n + j]
    }
    if (off <= stop * diag) return
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p * n + q]
        const app = a[p * n + p]
        const aqq = a[q * n + q]
        // Pairs already this small sum to less than the stopping test (n ≤ 100), so rotating them would change nothing that counts.
        if (apq * apq <= negligible * Math.abs(app * aqq)) continue
        // The smaller rotation angle: t = tan θ from cot 2θ = (a_qq − a_pp)/(2 a_pq).
        const theta = (aqq - app) / (2 * apq)
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1))
        const c = 1 / Math.sqrt(t * t + 1)
        const s = t * c
        // Rows and columns p, q of a symmetric a change alike: update each pair once and
        // mirror it; the 2×2 block has the closed form that zeroes a_pq exactly.
        for (let k = 0; k < n; k++) {
          if (k === p || k === q) continue
          const akp = a[k * n + p]
          const akq = a[k * n + q]
          const kp = c * akp - s * akq
          const kq = s * akp + c * akq
          a[k * n + p] = a[p * n + k] = kp
          a[k * n + q] = a[q * n + k] = kq
        }
        a[p * n + p] = app - t * apq
        a[q * n + q] = aqq + t * apq
        a[p * n + q] = a[q * n + p] = 0
        for (let k = 0; k < n; k++) {
          const vkp = vectors[k * n + p]
          const vkq = vectors[k * n + q]
          vectors[k * n + p] = c * vkp - s * vkq
          vectors[k * n + q] = s * vkp + c * vkq
        }
      }
    }
  }
  throw new EngineLimitError('an eigenvalue decomposition did not converge in 50 sweeps')
}

/** a ← Vᵀ a V for symmetric a and square V (row-major, n×n). */
function rotateInto(a: Float64Array, n: number, v: Float64Array): void {
  const av = new Float64Array(n * n)
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++) {
      const aik = a[i * n + k]
      if (aik === 0) continue
      for (let j = 0; j < n; j++) av[i * n + j] += aik * v[k * n + j]
    }
  a.fill(0)
  for (let k = 0; k < n; k++)
    for (let i = 0; i < n; i++) {
      const vki = v[k * n + i]
      for (let j = i; j < n; j++) a[i * n + j] += vki * av[k * n + j]
    }
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) a[j * n + i] = a[i * n + j]
}

/** Cholesky factor (lower, row-major) of the n×n symmetric positive-definite matrix a. */
export function cholesky(a: Float64Array, n: number): Float64Array {
  const l = new Float64Array(n * n)
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j]
    for (let k = 0; k < j; k++) d -= l[j * n + k] * l[j * n + k]
    if (!(d > 0)) throw new RangeError('cholesky: matrix is not positive definite')
    const ljj = Math.sqrt(d)
    l[j * n + j] = ljj
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j]
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k]
      l[i * n + j] = s / ljj
    }
  }
  return l
}

/** Solves L y = b (forward) in place for lower-triangular L. */
export function forwardSubstitute(l: Float64Array, n: number, b: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = b[i]
    for (let k = 0; k < i; k++) s -= l[i * n + k] * b[k]
    b[i] = s / l[i * n + i]
  }
}

/** Solves Lᵀ x = b (backward) in place for lower-triangular L. */
export function backSubstitute(l: Float64Array, n: number, b: Float64Array): void {
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i]
    for (let k = i + 1; k < n; k++) s -= l[k * n + i] * b[k]
    b[i] = s / l[i * n + i]
  }
}
