import { describe, expect, it } from 'vitest'
import { ALEXANDER_3 } from '../../../server/thermal/sdirk'

const { gamma, below, times, weights, embedded } = ALEXANDER_3
/** The full Butcher matrix with γ on the diagonal. */
const a = (i: number, j: number) => (i === j ? gamma : j < i ? below[i]![j]! : 0)
const sum = (f: (i: number) => number) => f(0) + f(1) + f(2)

describe('Alexander’s SDIRK tableau', () => {
  it('γ is the root of 6γ³ − 18γ² + 9γ − 1 in (1/6, 1/2), which makes the method L-stable (Alexander 1977)', () => {
    expect(6 * gamma ** 3 - 18 * gamma ** 2 + 9 * gamma - 1).toBeCloseTo(0, 14)
    expect(gamma).toBeGreaterThan(1 / 6)
    expect(gamma).toBeLessThan(1 / 2)
    // Stability function at infinity, R(∞) = 1 − bᵀA⁻¹1 = 0 for a stiffly accurate method: the weights are A's last row.
    weights.forEach((b, j) => expect(b).toBe(a(2, j)))
  })

  it('meets the order conditions up to third order (Hairer, Nørsett & Wanner, Solving ODEs I, §II.2)', () => {
    times.forEach((c, i) => expect(c).toBeCloseTo(sum((j) => a(i, j)), 15))
    expect(sum((i) => weights[i]!)).toBeCloseTo(1, 15)
    expect(sum((i) => weights[i]! * times[i]!)).toBeCloseTo(1 / 2, 15)
    expect(sum((i) => weights[i]! * times[i]! ** 2)).toBeCloseTo(1 / 3, 15)
    expect(sum((i) => weights[i]! * sum((j) => a(i, j) * times[j]!))).toBeCloseTo(1 / 6, 15)
  })

  it('the embedded weights are second order and differ from the method’s (a usable error estimate)', () => {
    expect(sum((i) => embedded[i]!)).toBeCloseTo(1, 15)
    expect(sum((i) => embedded[i]! * times[i]!)).toBeCloseTo(1 / 2, 15)
    expect(Math.abs(sum((i) => embedded[i]! * times[i]! ** 2) - 1 / 3)).toBeGreaterThan(0.01)
  })

  it('integrates y′ = −y², y(0) = 1 (exact 1/(1 + t)) with global error falling as the step cubed', () => {
    const solve = (steps: number) => {
      const h = 1 / steps
      let y = 1
      for (let n = 0; n < steps; n++) {
        const k: number[] = []
        for (let i = 0; i < 3; i++) {
          const z = y + h * sum((j) => (j < i ? a(i, j) * k[j]! : 0))
          // Stage equation Y = z − γh Y² solved exactly (the positive root).
          const Y = (-1 + Math.sqrt(1 + 4 * gamma * h * z)) / (2 * gamma * h)
          k.push(-Y * Y)
        }
        y += h * sum((i) => weights[i]! * k[i]!)
      }
      return Math.abs(y - 1 / 2)
    }
    const ratio = solve(20) / solve(40)
    expect(Math.log2(ratio)).toBeGreaterThan(2.8)
    expect(Math.log2(ratio)).toBeLessThan(3.2)
  })
})
