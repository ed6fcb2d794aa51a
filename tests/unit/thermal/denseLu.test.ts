import { Matrix, solve } from 'ml-matrix'
import { describe, expect, it } from 'vitest'
import { luFactor, luSolve } from '../../../server/thermal/denseLu'

/** A reproducible pseudo-random sequence (Park–Miller), so a failure can be replayed. */
function lehmer(seed: number): () => number {
  let state = seed
  return () => {
    state = (state * 48271) % 2147483647
    return state / 2147483647 - 0.5
  }
}

function solveWithLu(rows: number[][], b: number[]): number[] | null {
  const n = rows.length
  const a = Float64Array.from(rows.flat())
  const pivots = new Int32Array(n)
  if (!luFactor(a, n, pivots)) return null
  const x = Float64Array.from(b)
  luSolve(a, n, pivots, x)
  return Array.from(x)
}

describe('dense LU with partial pivoting', () => {
  it.each([3, 8, 14, 30])('solves a random %i×%i system as ml-matrix does', (n) => {
    const random = lehmer(1000 + n)
    const rows = Array.from({ length: n }, () => Array.from({ length: n }, random))
    const b = Array.from({ length: n }, random)
    const reference = solve(new Matrix(rows), Matrix.columnVector(b)).to1DArray()
    const x = solveWithLu(rows, b) as number[]
    x.forEach((value, i) => expect(value).toBeCloseTo(reference[i]!, 10))
  })

  it('pivots past a zero on the diagonal (no factorisation without row swaps exists)', () => {
    // [[0, 1], [1, 0]] x = [2, 3] → x = [3, 2].
    expect(solveWithLu([[0, 1], [1, 0]], [2, 3])).toEqual([3, 2])
  })

  it('solves an indefinite symmetric system (Newton’s matrix with a falling surface flux is one)', () => {
    const rows = [[2, 3, 0], [3, 1, 4], [0, 4, -5]]
    const b = [1, 2, 3]
    const reference = solve(new Matrix(rows), Matrix.columnVector(b)).to1DArray()
    const x = solveWithLu(rows, b) as number[]
    x.forEach((value, i) => expect(value).toBeCloseTo(reference[i]!, 12))
  })

  it('refuses a singular matrix instead of returning infinities', () => {
    expect(solveWithLu([[1, 2], [2, 4]], [1, 1])).toBeNull()
    expect(solveWithLu([[1, 0], [0, Number.NaN]], [1, 1])).toBeNull()
  })
})
