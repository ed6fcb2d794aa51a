/**
 * Thomas algorithm for a tridiagonal system
 *
 *   lower[i]·u[i-1] + diag[i]·u[i] + upper[i]·u[i+1] = rhs[i],   i = 0 … n-1
 *
 * (lower[0] and upper[n-1] are ignored). Forward elimination then back
 * substitution, O(n), no pivoting: the finite-volume heat matrices it serves are
 * strictly diagonally dominant (M/Δt on the diagonal), for which the elimination
 * is stable (Golub & Van Loan, Matrix Computations, §4.3.5).
 *
 * `scratch` and `out` may be passed to avoid allocation in a time loop; they must
 * have length ≥ n. The inputs are not modified.
 */
export function solveTridiagonal(
  lower: ArrayLike<number>,
  diag: ArrayLike<number>,
  upper: ArrayLike<number>,
  rhs: ArrayLike<number>,
  out: Float64Array = new Float64Array(diag.length),
  scratch: Float64Array = new Float64Array(diag.length),
): Float64Array {
  const n = diag.length
  if (lower.length < n || upper.length < n || rhs.length < n || out.length < n || scratch.length < n) {
    throw new RangeError('solveTridiagonal: all arrays must have the length of diag')
  }
  if (n === 0) return out
  // scratch holds the modified super-diagonal c'; out holds d' and then u.
  let pivot = diag[0]
  if (pivot === 0) throw new RangeError('solveTridiagonal: zero pivot at row 0')
  scratch[0] = upper[0] / pivot
  out[0] = rhs[0] / pivot
  for (let i = 1; i < n; i++) {
    pivot = diag[i] - lower[i] * scratch[i - 1]
    if (pivot === 0) throw new RangeError(`solveTridiagonal: zero pivot at row ${i}`)
    scratch[i] = upper[i] / pivot
    out[i] = (rhs[i] - lower[i] * out[i - 1]) / pivot
  }
  for (let i = n - 2; i >= 0; i--) out[i] -= scratch[i] * out[i + 1]
  return out
}
