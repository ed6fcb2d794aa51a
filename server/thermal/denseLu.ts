/**
 * In-place LU factorisation with partial pivoting for the small dense systems the
 * stepped engine solves hundreds of times per plan (galerkinStage.ts: 8–60 unknowns).
 * ml-matrix solves the same systems (the tests compare against it), but its object
 * per matrix and per-element accessors cost more than the factorisation itself here.
 */

/**
 * Factors the n×n row-major matrix a in place into L (unit lower, below the diagonal)
 * and U (on and above it), row swaps in pivots. Returns false when a pivot is zero or
 * not finite (the matrix is singular to working precision), leaving a unusable.
 */
export function luFactor(a: Float64Array, n: number, pivots: Int32Array): boolean {
  for (let j = 0; j < n; j++) {
    let p = j
    let largest = Math.abs(a[j * n + j])
    for (let i = j + 1; i < n; i++) {
      const size = Math.abs(a[i * n + j])
      if (size > largest) {
        largest = size
        p = i
      }
    }
    if (!(largest > 0) || !Number.isFinite(largest)) return false
    pivots[j] = p
    if (p !== j)
      for (let k = 0; k < n; k++) {
        const swap = a[j * n + k]
        a[j * n + k] = a[p * n + k]
        a[p * n + k] = swap
      }
    const pivot = a[j * n + j]
    for (let i = j + 1; i < n; i++) {
      const factor = (a[i * n + j] /= pivot)
      if (factor === 0) continue
      for (let k = j + 1; k < n; k++) a[i * n + k] -= factor * a[j * n + k]
    }
  }
  return true
}

/** Solves A x = b in place from luFactor's a and pivots. */
export function luSolve(lu: Float64Array, n: number, pivots: Int32Array, b: Float64Array): void {
  for (let i = 0; i < n; i++) {
    const p = pivots[i]
    if (p !== i) {
      const swap = b[i]
      b[i] = b[p]
      b[p] = swap
    }
    let s = b[i]
    for (let k = 0; k < i; k++) s -= lu[i * n + k] * b[k]
    b[i] = s
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i]
    for (let k = i + 1; k < n; k++) s -= lu[i * n + k] * b[k]
    b[i] = s / lu[i * n + i]
  }
}
