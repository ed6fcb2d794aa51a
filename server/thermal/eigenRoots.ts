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
 * Checked against roots and coefficients computed with mpmath
 * (scripts/reference/generate.py; tests/unit/thermal/eigenRoots.test.ts).
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

/** A symmetric uniform mode f(x) (f(0) = 1) through its root and its values at the surface. */
export interface SurfaceValues {
  lam: number
  /** f(1) and f′(1). */
  f1: number
  df1: number
}

/** f(1), f′(1) of cos λx, J0(λx), sin(λx)/(λx). */
export function surfaceValues(geometry: Geometry, lam: number): SurfaceValues {
  if (geometry === 'slab') return { lam, f1: Math.cos(lam), df1: -lam * Math.sin(lam) }
  if (geometry === 'rod') return { lam, f1: besselJ0(lam), df1: -lam * besselJ1(lam) }
  const s = Math.sin(lam) / lam
  return { lam, f1: s, df1: Math.cos(lam) - s }
}

/*
 * Integrals with weight x^m over 0 ≤ x ≤ 1 from surface values alone. Every such
 * mode solves (x^m f′)′ = −λ² x^m f with x^m f′ → 0 at the centre, so
 *   (x^m (f_a′ f_b − f_a f_b′))′ = (b² − a²) x^m f_a f_b   (Green's identity; Lommel's integral for J0),
 *   ∫ x^m f = −f′(1)/λ²,
 *   ∫ x^m f² = ½ (f(1)² + f′(1)²/λ²) + (m − 1) f(1) f′(1)/(2λ²)
 * (the last checked against ½ + sin 2λ/4λ, (J0² + J1²)/2 and (½ − sin 2λ/4λ)/λ²).
 * They let a stage start from the previous stage's modes without quadrature.
 */

export function uniformMass(mode: SurfaceValues): number {
  return -mode.df1 / (mode.lam * mode.lam)
}

export function uniformNorm(m: 0 | 1 | 2, mode: SurfaceValues): number {
  const l2 = mode.lam * mode.lam
  return 0.5 * (mode.f1 * mode.f1 + (mode.df1 * mode.df1) / l2) + ((m - 1) * mode.f1 * mode.df1) / (2 * l2)
}

/** ∫ x^m f_a f_b dx; equal roots (the same surface condition) give the norm. */
export function uniformOverlap(m: 0 | 1 | 2, a: SurfaceValues, b: SurfaceValues): number {
  const d = b.lam * b.lam - a.lam * a.lam
  // Closer than 1e-8 the formula loses more digits to cancellation than the norm is off.
  if (Math.abs(d) <= 1e-8 * a.lam * a.lam) return uniformNorm(m, a)
  return (a.df1 * b.f1 - a.f1 * b.df1) / d
}

/** A term A_i g_i of a start given as modes over its steady state. */
export interface UniformTerm {
  amplitude_K: number
  surface: SurfaceValues
}

/**
 * Amplitude of the symmetric uniform mode f_n when the stage starts from
 * T = T_start,ss + Σ_i A_i g_i over its steady state T_ss:
 *   a_n = ((T_start,ss − T_ss) ∫x^m f_n + Σ_i A_i ∫x^m g_i f_n) / ∫x^m f_n².
 * A uniform start is the case without terms, where mass/norm is the textbook C_n
 * (uniformInitialCoefficient). Both series paths take their amplitudes from here.
 */
export function uniformAmplitude(m: 0 | 1 | 2, startExcess_K: number, terms: readonly UniformTerm[], mode: SurfaceValues): number {
  let projection = startExcess_K * uniformMass(mode)
  for (const term of terms) projection += term.amplitude_K * uniformOverlap(m, term.surface, mode)
  return projection / uniformNorm(m, mode)
}
