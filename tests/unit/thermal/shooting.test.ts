import { describe, expect, it } from 'vitest'
import { rodRoot, slabRoot, sphereRoot } from '../../../server/thermal/eigenRoots'
import type { PropertyPiece } from '../../../server/thermal/properties'
import { shootingModes } from '../../../server/thermal/shooting'

/**
 * Graded closed form. With k = ρc = e^{2x} on 0 < x < 1 and both faces fixed,
 *   (e^{2x} f′)′ = −μ e^{2x} f  ⇔  f″ + 2f′ + μ f = 0.
 * Put f = e^{−x} g: f′ = e^{−x}(g′ − g), f″ = e^{−x}(g″ − 2g′ + g), so
 *   g″ − g = −μ g,  g(0) = g(1) = 0  ⇒  g = sin(nπx), μ = 1 + n²π².
 * The table is e^{2x} sampled at 400 points, linear in between. k and ρc carry
 * the same interpolation error (≤ h²/8 · 4e² ≈ 2.3e-5 relative), and μ depends
 * on them only through k/ρc and the weighted Rayleigh quotient, so the decay
 * rates land far closer than that; we assert 1e-6 relative and the shape to 1e-5.
 */
function exponentialTable(pieces: number): PropertyPiece[] {
  return Array.from({ length: pieces }, (_, i) => {
    const a = i / pieces
    const b = (i + 1) / pieces
    return { x0: a, x1: b, k0: Math.exp(2 * a), k1: Math.exp(2 * b), c0: Math.exp(2 * a), c1: Math.exp(2 * b) }
  })
}

describe('shooting on graded properties', () => {
  const modes = shootingModes({ m: 0, pieces: exponentialTable(400), innerBiot: Infinity, outerBiot: Infinity })

  it.each([1, 2, 3, 4, 6, 8])('k = ρc = e^{2x}: mode %i has μ = 1 + n²π² and shape e^{−x} sin(nπx) (derived above)', (n) => {
    const mode = modes(n)
    expect(Math.abs(mode.rate / (1 + (n * Math.PI) ** 2) - 1)).toBeLessThan(1e-6)
    // The shot starts with f′(0) = 1/k(0) = 1; e^{−x} sin(nπx) has slope nπ there.
    for (const x of [0.13, 0.37, 0.5, 0.81, 0.97]) {
      expect(mode.shape(x)).toBeCloseTo((Math.exp(-x) * Math.sin(n * Math.PI * x)) / (n * Math.PI), 5)
    }
  })

  const uniform: PropertyPiece[] = [{ x0: 0, x1: 1, k0: 1, k1: 1, c0: 1, c1: 1 }]
  it.each([
    [0, 0, 0.7, 'slab λ tan λ = Bi', (n: number) => slabRoot(n, 0, 0.7)],
    [0, 3, 0.2, 'slab with two convective faces', (n: number) => slabRoot(n, 3, 0.2)],
    [0, Infinity, 50, 'slab with a fixed inner face', (n: number) => slabRoot(n, Infinity, 50)],
    [1, 0, 2, 'rod λ J1/J0 = Bi', (n: number) => rodRoot(n, 2)],
    [2, 0, 0.3, 'sphere 1 − λ cot λ = Bi', (n: number) => sphereRoot(n, 0.3)],
    [2, 0, Infinity, 'sphere fixed surface, λ = nπ', (n: number) => sphereRoot(n, Infinity)],
  ])('uniform m = %i, Bi0 = %f, Bi1 = %f: shooting matches the closed form (%s) for 12 modes', (m, bi0, bi1, _name, root) => {
    const shot = shootingModes({ m: m as 0 | 1 | 2, pieces: uniform, innerBiot: bi0, outerBiot: bi1 })
    for (let n = 1; n <= 12; n++) {
      const exact = root(n) ** 2
      // Bessel values (≈ 3e-9 absolute) limit the rod's closed form.
      expect(Math.abs(shot(n).rate / exact - 1)).toBeLessThan(m === 1 ? 1e-8 : 1e-10)
    }
  })

  it('a two-layer slab (jump in k and ρc at x = 0.5) satisfies flux continuity: the n-th mode has n − 1 interior zeros', () => {
    // Sturm count check on a clad plate: k 50 | 15, ρc 3.6e6 | 4.0e6 (scaled).
    const pieces: PropertyPiece[] = [
      { x0: 0, x1: 0.5, k0: 50 / 32.5, k1: 50 / 32.5, c0: 3.6 / 3.8, c1: 3.6 / 3.8 },
      { x0: 0.5, x1: 1, k0: 15 / 32.5, k1: 15 / 32.5, c0: 4 / 3.8, c1: 4 / 3.8 },
    ]
    const shot = shootingModes({ m: 0, pieces, innerBiot: 0, outerBiot: 1 })
    for (let n = 1; n <= 8; n++) {
      let zeros = 0
      let prev = shot(n).shape(0)
      for (let i = 1; i <= 4000; i++) {
        const v = shot(n).shape((i / 4000) * 0.9999)
        if (v * prev < 0) zeros++
        prev = v
      }
      expect(zeros).toBe(n - 1)
      if (n > 1) expect(shot(n).rate).toBeGreaterThan(shot(n - 1).rate)
    }
  })
})
