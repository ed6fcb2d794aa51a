/**
 * Eigenmodes of graded (piecewise-linear, possibly discontinuous) properties by shooting.
 *
 * Dimensionless eigenproblem on 0 ≤ x ≤ 1 (see properties.ts for the scaling):
 *     (x^m k f′)′ = −μ x^m c f,
 * as the first-order system f′ = p/(x^m k), p′ = −μ x^m c f with p = x^m k f′.
 * Inner end: symmetry f = 1, p = 0 (rod/sphere start at a small x from the series
 * f ≈ 1 − μ c x²/(2(m+1)k), which removes the x^-m singularity); slab face k f′ = Bi₀ f
 * (f = 1, p = Bi₀) or fixed (f = 0, p = 1). Outer end: p + Bi₁ f = 0 (f = 0 if fixed).
 *
 * Sturm counting through the Prüfer angle θ = atan2(f, p): θ′ = (p²/(x^m k) +
 * μ x^m c f²)/(f² + p²) > 0, its zeros of f are θ = jπ, and θ(1; μ) increases
 * with μ, so the n-th eigenvalue (n − 1 interior zeros) is the unique root of
 *     θ(1; μ) = nπ − atan(1/Bi₁).
 * That bracket is found by stepping up from the previous eigenvalue, then Brent
 * polishes μ to 1e-10 relative. f and p are continuous across a property jump;
 * integration restarts there (each linear piece is integrated separately).
 * Checked on k = ρc = e^{2x}, whose modes are e^{−x} sin(nπx), μ = 1 + n²π²
 * (tests/unit/thermal/shooting.test.ts), and against the uniform closed forms.
 */
import { denseValue, integrate, type DenseSegment } from './dormandPrince'
import type { PropertyPiece } from './properties'
import { brent } from './roots'

export interface ShootingSpec {
  m: 0 | 1 | 2
  pieces: PropertyPiece[]
  /** 0 for symmetry, Infinity for a fixed face, otherwise a convective slab face. */
  innerBiot: number
  /** Infinity for a fixed surface. */
  outerBiot: number
}

export interface ShotMode {
  /** Dimensionless decay rate μ̂. */
  rate: number
  shape: (x: number) => number
}

/** Tolerances of the coarse search (bracketing, Brent) and of the final Newton polish. */
const COARSE = { rtol: 1e-6, atol: 1e-12 }
const FINE = { rtol: 1e-10, atol: 1e-14 }
const COARSE_RATE_RTOL = 1e-7

interface Shot {
  theta: number
  /** dθ(1)/dμ = ∫ x^m c f² dx / (f(1)² + p(1)²), from the Wronskian of (f, p) and (∂f/∂μ, ∂p/∂μ). */
  dThetaDmu: number
  segments: DenseSegment[]
  /** Start of the integration (> 0 for rod/sphere with a symmetric centre). */
  xStart: number
}

/** Integrates the shooting system for decay rate mu; θ(1), dθ(1)/dμ and optionally dense output. */
export function shoot(spec: ShootingSpec, mu: number, tolerance = FINE, dense = false): Shot {
  const { m, pieces } = spec
  const first = pieces[0]
  let x = 0
  // (f, p, ∫ x^m c f² dx)
  const y = new Float64Array(3)
  if (spec.innerBiot === Infinity) {
    y[0] = 0
    y[1] = 1
  } else if (spec.innerBiot === 0 && m > 0) {
    // Series start: small enough that the neglected O(x⁴μ²) and O(x³k′) terms are < 1e-12.
    const w2 = (mu * first.c0) / first.k0
    x = Math.min(1e-4, 1e-4 / Math.sqrt(1 + w2), 0.01 * (first.x1 - first.x0))
    y[0] = 1 - (w2 * x * x) / (2 * (m + 1))
    y[1] = (-mu * first.c0 * x ** (m + 1)) / (m + 1)
    y[2] = (first.c0 * x ** (m + 1)) / (m + 1)
  } else {
    y[0] = 1
    y[1] = spec.innerBiot
  }
  const xStart = x
  let angle = Math.atan2(y[0], y[1])
  let theta = angle
  const onStep = (_x: number, s: Float64Array) => {
    const a = Math.atan2(s[0], s[1])
    let d = a - angle
    if (d <= -Math.PI) d += 2 * Math.PI
    else if (d > Math.PI) d -= 2 * Math.PI
    theta += d
    angle = a
  }
  const segments: DenseSegment[] = []
  let state: Float64Array = y
  let h: number | undefined
  const peak = new Float64Array(3)
  for (const piece of pieces) {
    if (piece.x1 <= x) continue
    const dk = (piece.k1 - piece.k0) / (piece.x1 - piece.x0)
    const dc = (piece.c1 - piece.c0) / (piece.x1 - piece.x0)
    const rhs = (xx: number, s: Float64Array, ds: Float64Array) => {
      const xm = m === 0 ? 1 : m === 1 ? xx : xx * xx
      const k = piece.k0 + (xx - piece.x0) * dk
      const wc = xm * (piece.c0 + (xx - piece.x0) * dc)
      ds[0] = s[1] / (xm * k)
      ds[1] = -mu * wc * s[0]
      ds[2] = wc * s[0] * s[0]
    }
    // Keep each step under ~1 radian of local oscillation so the Prüfer angle unwraps.
    const omega = Math.sqrt(mu * Math.max(piece.c0 / piece.k0, piece.c1 / piece.k1))
    const hmax = omega > 0 ? 1 / omega : undefined
    const from = Math.max(x, piece.x0)
    const result = integrate(rhs, from, state, piece.x1, { ...tolerance, hmax, h0: h, dense, onStep, peak })
    state = result.y
    h = result.h
    x = piece.x1
    if (dense) segments.push(...result.segments)
  }
  const r2 = state[0] * state[0] + state[1] * state[1]
  return { theta, dThetaDmu: state[2] / r2, segments, xStart }
}

/**
 * Lazily computed modes 1, 2, … of a graded body. Each eigenvalue is bracketed by
 * the Sturm count and found by Brent on a coarse integration (1e-7), then one
 * Newton step on the fine integration (error ~ (1e-7)², below the 1e-10 target).
 */
export function shootingModes(spec: ShootingSpec): (n: number) => ShotMode {
  const modes: ShotMode[] = []
  const target = (n: number) => n * Math.PI - Math.atan2(1, spec.outerBiot)
  // WKB phase growth: dθ(1)/d√μ ≈ ∫√(c/k) dx.
  let phaseIntegral = 0
  for (const p of spec.pieces) phaseIntegral += (p.x1 - p.x0) * 0.5 * (Math.sqrt(p.c0 / p.k0) + Math.sqrt(p.c1 / p.k1))
  return (n: number) => {
    while (modes.length < n) {
      const j = modes.length + 1
      const goal = target(j)
      const residual = (mu: number) => shoot(spec, mu, COARSE).theta - goal
      let lo = j === 1 ? 0 : modes[j - 2].rate
      let flo = residual(lo)
      let hi = (Math.sqrt(lo) + (goal - (j === 1 ? 0 : target(j - 1))) / phaseIntegral) ** 2
      let fhi = residual(hi)
      while (fhi < 0) {
        lo = hi
        flo = fhi
        hi = (Math.sqrt(hi) + 0.5 * Math.PI / phaseIntegral) ** 2
        fhi = residual(hi)
      }
      const coarse = brent(residual, lo, hi, { fa: flo, fb: fhi, rtol: COARSE_RATE_RTOL })
      const polish = shoot(spec, coarse, FINE)
      const rate = coarse - (polish.theta - goal) / polish.dThetaDmu
      modes.push(denseMode(spec, rate))
    }
    return modes[n - 1]
  }
}

function denseMode(spec: ShootingSpec, rate: number): ShotMode {
  const { segments, xStart } = shoot(spec, rate, FINE, true)
  const first = spec.pieces[0]
  const starts = segments.map((s) => s.x0)
  const shape = (x: number): number => {
    if (x < xStart) return 1 - (rate * first.c0 * x * x) / (2 * (spec.m + 1) * first.k0)
    let lo = 0
    let hi = starts.length - 1
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1
      if (starts[mid] <= x) lo = mid
      else hi = mid - 1
    }
    return denseValue(segments[lo], 3, 0, Math.min(x, segments[lo].x0 + segments[lo].h))
  }
  return { rate, shape }
}
