/**
 * Eigenvalues λ_n of uniform-property conduction (dimensionless, x ∈ [0, 1]),
 * μ̂_n = λ_n², each root bracketed in its own interval so none is skipped or repeated.
 *
 * Slab, mode cos(λx − φ), φ = atan(Bi₀/λ) (Bi₀ = 0: symmetric centre; Bi₀ = ∞:
 * fixed inner face). The outer condition f′ + Bi₁ f = 0 gives tan(λ − φ) = Bi₁/λ,
 * i.e. the monotone phase equation
 *     λ − atan(Bi₀/λ) − atan(Bi₁/λ) = (n − 1)π,     λ_n ∈ [(n − 1)π, nπ],
 * equivalent to λ tan λ = Bi (symmetric) and tan λ = λ(Bi₀+Bi₁)/(λ² − Bi₀Bi₁)
 * (two convective faces) but with no poles; Bi = ∞ gives (n − ½)π and nπ.
 * Rod: λ J1(λ) = Bi J0(λ), λ_n between the (n−1)-th zero of J1 (j1,0 = 0) and
 * the n-th zero of J0 (Bi = ∞: the zero of J0).
 * Sphere: 1 − λ cot λ = Bi, written cos λ + (Bi − 1) sin λ/λ = 0 so that it is
 * finite at λ = 0 (value Bi > 0) and equals (−1)^j at jπ: λ_n ∈ ((n − 1)π, nπ).
 * Checked against Incropera et al., Fundamentals of Heat and Mass Transfer,
 * Table 5.1 (tests/unit/thermal/eigenRoots.test.ts).
 */
import { besselJ0, besselJ0Zero, besselJ1, besselJ1Zero } from './bessel'
import type { Geometry } from './types'
import { brent } from './roots'

/** n-th root for a slab with Biot numbers Bi₀ at x = 0 (0 = symmetry) and Bi₁ at x = 1. */
export function slabRoot(n: number, bi0: number, bi1: number): number {
  // Both faces fixed: the root is the bracket end nπ itself, where rounding could hide the sign.
  if (bi0 === Infinity && bi1 === Infinity) return n * Math.PI
  const offset = (n - 1) * Math.PI
  const g = (lam: number) => lam - Math.atan2(bi0, lam) - Math.atan2(bi1, lam) - offset
  return brent(g, offset, offset + Math.PI, { rtol: 1e-15 })
}

/** n-th root of λ J1(λ)/J0(λ) = Bi for a solid cylinder. */
export function rodRoot(n: number, bi: number): number {
  const upper = besselJ0Zero(n)
  if (bi === Infinity) return upper
  const lower = n === 1 ? 0 : besselJ1Zero(n - 1)
  const g = (lam: number) => (lam * besselJ1(lam) - bi * besselJ0(lam)) / (1 + bi)
  return brent(g, lower, upper, { xtol: 1e-14 })
}

/** n-th root of 1 − λ cot λ = Bi for a solid sphere. */
export function sphereRoot(n: number, bi: number): number {
  if (bi === Infinity) return n * Math.PI
  const g = (lam: number) => Math.cos(lam) + ((bi - 1) * (lam === 0 ? 1 : Math.sin(lam) / lam))
  return brent(g, (n - 1) * Math.PI, n * Math.PI, { rtol: 1e-15 })
}

/** n-th root for a geometry with a symmetric centre and surface Biot number Bi. */
export function symmetricRoot(geometry: Geometry, n: number, bi: number): number {
  if (geometry === 'slab') return slabRoot(n, 0, bi)
  if (geometry === 'rod') return rodRoot(n, bi)
  return sphereRoot(n, bi)
}

/**
 * Series coefficient C_n of a uniform initial excess for a symmetric body,
 * (T − T∞)/(T₀ − T∞) = Σ C_n f_n(x) e^{−λ_n² Fo}, with f_n(0) = 1
 * (Incropera et al., eqs. 5.39b, 5.50c, 5.51c):
 * slab 4 sin λ/(2λ + sin 2λ); rod 2J1(λ)/(λ(J0² + J1²)); sphere 4(sin λ − λ cos λ)/(2λ − sin 2λ).
 */
export function uniformInitialCoefficient(geometry: Geometry, lam: number): number {
  if (geometry === 'slab') return (4 * Math.sin(lam)) / (2 * lam + Math.sin(2 * lam))
  if (geometry === 'rod') {
    const j0 = besselJ0(lam)
    const j1 = besselJ1(lam)
    return (2 * j1) / (lam * (j0 * j0 + j1 * j1))
  }
  return (4 * (Math.sin(lam) - lam * Math.cos(lam))) / (2 * lam - Math.sin(2 * lam))
}

/** Mode shape for uniform properties: cos(λx − φ), J0(λx), sin(λx)/(λx). */
export function uniformShape(geometry: Geometry, lam: number, bi0: number): (x: number) => number {
  if (geometry === 'slab') {
    const phi = Math.atan2(bi0, lam)
    return (x) => Math.cos(lam * x - phi)
  }
  if (geometry === 'rod') return (x) => besselJ0(lam * x)
  return (x) => (x === 0 ? 1 : Math.sin(lam * x) / (lam * x))
}
