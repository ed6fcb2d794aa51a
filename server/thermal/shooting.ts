/**
 * Eigenmodes of graded (piecewise-linear, possibly discontinuous) properties by shooting.
 *
 * Dimensionless eigenproblem on 0 ≤ x ≤ 1 (see properties.ts for the scaling):
 *     (x^m k f′)′ = −μ x^m c f,
 * as the first-order system f′ = p/(x^m k), p′ = −μ x^m c f with p = x^m k f′.
 * Inner end: symmetry f = 1, p = 0 (a rod or sphere starts away from the centre on
 * the power series of centreSeries below, which removes the x^-m singularity and
 * the many tiny steps an adaptive integrator takes next to it); slab face
 * k f′ = Bi₀ f (f = 1, p = Bi₀) or fixed (f = 0, p = 1). Outer end: p + Bi₁ f = 0
 * (f = 0 if fixed).
 *
 * Sturm counting through the Prüfer angle θ = atan2(f, p): θ′ = (p²/(x^m k) +
 * μ x^m c f²)/(f² + p²) > 0, its zeros of f are θ = jπ, and θ(1; μ) increases
 * with μ, so the n-th eigenvalue (n − 1 interior zeros) is the unique root of
 *     θ(1; μ) = nπ − atan(1/Bi₁).
 * Starting values come from a finite-volume discretisation (discreteModes.ts).
 * Safeguarded Newton steps on that equation, with the exact dθ(1)/dμ, then polish
 * μ to 1e-10 relative (the default): coarse shots until the step is below 1e-4,
 * then a fine shot that also carries ∂f/∂μ; once its Newton step δ is below
 * √1e-10, μ + δ is the rate and f + δ ∂f/∂μ the shape, both to O(δ²). Every shot
 * narrows a bracket [lo, hi] known from the sign of θ(1; μ) − target, so a poor
 * estimate costs bisection steps but can never converge on a neighbouring mode. f and p are continuous across a
 * property jump; integration restarts there (each linear piece separately).
 * Checked on k = ρc = e^{2x}, whose modes are e^{−x} sin(nπx), μ = 1 + n²π²
 * (tests/unit/thermal/shooting.test.ts), and against the uniform closed forms.
 */
import type { Deadline } from './deadline'
import { discreteRates } from './discreteModes'
import { denseValue, integrate, type DenseSegment } from './dormandPrince'
import { EngineLimitError } from './errors'
import type { PropertyPiece } from './properties'
import { gaussLegendre } from './quadrature'

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

export interface IntegrationTolerance {
  rtol: number
  atol: number
}

/** Integration tolerance of the final shots and the relative accuracy of μ. */
export interface ShootingAccuracy {
  fine: IntegrationTolerance
  rateRtol: number
}

/** The product default: rates to 1e-10 relative, shapes to about the same. */
export const FINE_SHOOTING: ShootingAccuracy = { fine: { rtol: 1e-10, atol: 1e-14 }, rateRtol: 1e-10 }

/** Far from the root a rough θ is enough to steer Newton; it costs a fraction of the fine steps. */
const COARSE = { rtol: 1e-6, atol: 1e-12 }
/** Switch from COARSE to the fine tolerance once a Newton step is below this fraction of μ. */
const COARSE_STEP = 1e-4
const MAX_SHOTS = 80

/**
 * Shooting matched to a temperature accuracy of accuracy_K on drops of up to ~1000 K:
 * relative errors ε in a rate or a shape move a term a e^{−μτ} by at most ~a·ε, so
 * ε = 2e-6 per kelvin of accuracy keeps them two orders below it (1e-7 at 0.05 K).
 * Never looser than the coarse search, never tighter than the default.
 */
export function shootingAccuracy(accuracy_K: number): ShootingAccuracy {
  const rtol = Math.min(Math.max(2e-6 * accuracy_K, FINE_SHOOTING.rateRtol), COARSE.rtol)
  return { fine: { rtol, atol: 1e-4 * rtol }, rateRtol: rtol }
}

interface Shot {
  theta: number
  /** dθ(1)/dμ = ∫ x^m c f² dx / (f(1)² + p(1)²), from the Wronskian of (f, p) and (∂f/∂μ, ∂p/∂μ). */
  dThetaDmu: number
  /** Dense output of a shape shot: (f, p, ∫ x^m c f², ∂f/∂μ, ∂p/∂μ); empty otherwise. */
  segments: DenseSegment[]
  /** Start of the integration (> 0 for rod/sphere with a symmetric centre). */
  xStart: number
  /** Power-series coefficients of f on 0 ≤ x ≤ xStart (empty when xStart = 0). */
  centre: Float64Array
  /** Their derivatives in μ (shape shots only). */
  centreDmu: Float64Array
}

/**
 * Regular solution f = Σ a_j x^j (a₀ = 1) at a symmetric centre of a rod or sphere
 * whose first piece has k = k₀ + k₁x, c = c₀ + c₁x. Multiplying the equation by
 * x^{1−m} and collecting x^{j−1}:
 *     k₀ j(j − 1 + m) a_j = −k₁ (j − 1)(j − 1 + m) a_{j−1} − μ (c₀ a_{j−2} + c₁ a_{j−3}),
 * so a₁ = 0. It converges for |x| < k₀/|k₁|; the caller stays within a quarter of
 * that and within 1.5/ω (ω² = μ max c/k), where f > 0 and no term is large enough
 * to lose digits to cancellation. Returns f, p = x^m k f′, ∫₀^x s^m c f² ds and the
 * μ-derivatives of f and p at xs.
 */
function centreSeries(
  m: 0 | 1 | 2,
  piece: PropertyPiece,
  mu: number,
  xs: number,
): { a: Float64Array; da: Float64Array; f: number; p: number; energy: number; fMu: number; pMu: number } {
  const k0 = piece.k0
  const k1 = (piece.k1 - piece.k0) / (piece.x1 - piece.x0)
  const c0 = piece.c0
  const c1 = (piece.c1 - piece.c0) / (piece.x1 - piece.x0)
  const terms: number[] = [1, 0]
  // ∂a_j/∂μ from the μ-derivative of the same recurrence.
  const slopes: number[] = [0, 0]
  for (let j = 2; j < 120; j++) {
    const lower = c0 * terms[j - 2] + (j >= 3 ? c1 * terms[j - 3] : 0)
    const aj = (-k1 * (j - 1) * (j - 1 + m) * terms[j - 1] - mu * lower) / (k0 * j * (j - 1 + m))
    const dLower = c0 * slopes[j - 2] + (j >= 3 ? c1 * slopes[j - 3] : 0)
    slopes.push((-k1 * (j - 1) * (j - 1 + m) * slopes[j - 1] - lower - mu * dLower) / (k0 * j * (j - 1 + m)))
    terms.push(aj)
    if (Math.abs(aj) * xs ** j < 1e-18 && Math.abs(terms[j - 1]) * xs ** (j - 1) < 1e-18 && j > 4) break
  }
  const a = Float64Array.from(terms)
  const value = (x: number) => {
    let f = 0
    for (let j = a.length - 1; j >= 0; j--) f = f * x + a[j]
    return f
  }
  let df = 0
  for (let j = a.length - 1; j >= 1; j--) df = df * xs + j * a[j]
  // ∫ x^m c f² only steers Newton (dθ/dμ); 8-point Gauss on a smooth integrand spanning
  // at most 1.5 radians is good to ~1e-12.
  const gauss = gaussLegendre(8)
  let energy = 0
  for (let i = 0; i < 8; i++) {
    const x = 0.5 * xs * (1 + gauss.x[i])
    const f = value(x)
    energy += 0.5 * xs * gauss.w[i] * x ** m * (c0 + c1 * x) * f * f
  }
  const f = value(xs)
  const da = Float64Array.from(slopes)
  let fMu = 0
  let dfMu = 0
  for (let j = da.length - 1; j >= 0; j--) {
    fMu = fMu * xs + da[j]
    if (j > 0) dfMu = dfMu * xs + j * da[j]
  }
  const area = xs ** m * (k0 + k1 * xs)
  return { a, da, f, p: area * df, energy, fMu, pMu: area * dfMu }
}

/**
 * Integrates the shooting system for decay rate mu; θ(1), dθ(1)/dμ and, for a shape
 * shot (`shape`), dense output carrying the sensitivities ∂f/∂μ, ∂p/∂μ:
 *     (∂f/∂μ)′ = (∂p/∂μ)/(x^m k),   (∂p/∂μ)′ = −x^m c (f + μ ∂f/∂μ),
 * which let a shape shot at μ be moved to a Newton-corrected μ + δ to O(δ²).
 */
export function shoot(spec: ShootingSpec, mu: number, tolerance: IntegrationTolerance = FINE_SHOOTING.fine, shape = false, deadline?: Deadline): Shot {
  const { m, pieces } = spec
  const first = pieces[0]
  let x = 0
  // (f, p, ∫ x^m c f² dx[, ∂f/∂μ, ∂p/∂μ]); the start values below do not depend on μ except at a centre.
  const y = new Float64Array(shape ? 5 : 3)
  let centre: Float64Array = new Float64Array(0)
  let centreDmu: Float64Array = new Float64Array(0)
  if (spec.innerBiot === Infinity) {
    y[0] = 0
    y[1] = 1
  } else if (spec.innerBiot === 0 && m > 0) {
    const omega = Math.sqrt(mu * Math.max(first.c0 / first.k0, first.c1 / first.k1))
    const dk = Math.abs(first.k1 - first.k0) / (first.x1 - first.x0)
    x = Math.min(0.5 * (first.x1 - first.x0), omega > 0 ? 1.5 / omega : Infinity, dk > 0 ? (0.25 * first.k0) / dk : Infinity)
    const start = centreSeries(m, first, mu, x)
    y[0] = start.f
    y[1] = start.p
    y[2] = start.energy
    centre = start.a
    if (shape) {
      y[3] = start.fMu
      y[4] = start.pMu
      centreDmu = start.da
    }
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
  const peak = new Float64Array(y.length)
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
      if (shape) {
        ds[3] = s[4] / (xm * k)
        ds[4] = -wc * (s[0] + mu * s[3])
      }
    }
    // Keep each step under ~1 radian of local oscillation so the Prüfer angle unwraps.
    const omega = Math.sqrt(mu * Math.max(piece.c0 / piece.k0, piece.c1 / piece.k1))
    const hmax = omega > 0 ? 1 / omega : undefined
    const from = Math.max(x, piece.x0)
    const result = integrate(rhs, from, state, piece.x1, { ...tolerance, hmax, h0: h, dense: shape, onStep, peak, errorComponents: 3, deadline })
    state = result.y
    h = result.h
    x = piece.x1
    if (shape) segments.push(...result.segments)
  }
  const r2 = state[0] * state[0] + state[1] * state[1]
  return { theta, dThetaDmu: state[2] / r2, segments, xStart, centre, centreDmu }
}

/**
 * Lazily computed modes 1, 2, … of a graded body. Finite-volume estimates for a
 * batch of modes (twice as many as asked so far) seed the Newton iteration of
 * each; see the file comment for the safeguards. A mode that does not converge in
 * MAX_SHOTS, or a non-finite shot, is refused (EngineLimitError); the deadline of the
 * solve asking is checked before every shot.
 */
export function shootingModes(spec: ShootingSpec, accuracy: ShootingAccuracy = FINE_SHOOTING): (n: number, deadline?: Deadline) => ShotMode {
  const modes: ShotMode[] = []
  let estimates: Float64Array = new Float64Array(0)
  const last = spec.pieces[spec.pieces.length - 1]
  const outerRatio = Math.sqrt(last.c1 / last.k1)
  // Quadratic convergence: a step of s leaves an error ~ s², so √rateRtol-sized steps suffice.
  const acceptStep = Math.sqrt(accuracy.rateRtol)
  const solve = (j: number, deadline: Deadline | undefined): ShotMode => {
    // θ(1; μ_{j−1}) is the previous target, π below this one; μ₁ > 0.
    let lo = j === 1 ? 0 : modes[j - 2].rate
    let hi = Infinity
    let mu = estimates[j - 1] > lo ? estimates[j - 1] : lo + 1
    let fine = false
    for (let shots = 0; shots < MAX_SHOTS; shots++) {
      deadline?.check()
      // Fine shots are usually the last: they keep dense output and the μ-sensitivities.
      const shot = shoot(spec, mu, fine ? accuracy.fine : COARSE, fine, deadline)
      if (!Number.isFinite(shot.theta) || !Number.isFinite(shot.dThetaDmu)) throw new EngineLimitError(`mode ${j} of this profile met a non-finite value while shooting`)
      // The same Sturm condition in the scaled angle φ = atan2(s f, p), s = λ√(c/k) at
      // the surface: θ ↦ φ is increasing and fixes every multiple of π/2, so φ(1) − (jπ −
      // atan(s/Bi₁)) has the sign of θ(1) − (jπ − atan(1/Bi₁)), but φ(1) is nearly affine
      // in λ = √μ (exactly so for uniform properties), which is where Newton works best.
      const lam = Math.sqrt(mu)
      const s = lam * outerRatio
      const sin = Math.sin(shot.theta)
      const cos = Math.cos(shot.theta)
      const phi = shot.theta + Math.atan2(s * sin, cos) - Math.atan2(sin, cos)
      const residual = phi - (j * Math.PI - Math.atan2(s, spec.outerBiot))
      if (residual < 0) lo = mu
      else hi = mu
      const dPhiDmu = (s / (cos * cos + s * s * sin * sin)) * shot.dThetaDmu
      const lamNext = lam - residual / (2 * lam * dPhiDmu)
      const next = lamNext > 0 ? lamNext * lamNext : -1
      const step = Math.abs(next - mu)
      // A step below √rateRtol leaves errors ~step² in the rate and in the shape moved
      // along its sensitivity, so this shot is the mode.
      if (fine && next > lo && next < hi && step <= acceptStep * mu) return denseMode(next, shot, next - mu)
      mu = next > lo && next < hi ? next : hi === Infinity ? 2 * Math.max(mu, lo, 1) : 0.5 * (lo + hi)
      if (!fine && step <= COARSE_STEP * mu) {
        // The coarse θ may be off by ~COARSE.rtol: widen the bracket it built before trusting fine shots.
        fine = true
        lo = Math.max(j === 1 ? 0 : modes[j - 2].rate, lo - 10 * COARSE_STEP * mu)
        hi += 10 * COARSE_STEP * mu
      }
    }
    throw new EngineLimitError(`mode ${j} of this profile did not converge in ${MAX_SHOTS} shots; smooth the profile or reduce its jumps`)
  }
  const denseMode = (rate: number, shot: Shot, delta: number): ShotMode => ({ rate, shape: shapeOf(shot, delta) })
  return (n: number, deadline?: Deadline) => {
    if (estimates.length < n) estimates = discreteRates(spec, Math.max(2 * n, 8))
    while (modes.length < n) modes.push(solve(modes.length + 1, deadline))
    return modes[n - 1]
  }
}

/** f(x) of a shot moved to μ + delta: the centre power series, then the dense output of the integration. */
function shapeOf(shot: Shot, delta: number): (x: number) => number {
  const { segments, xStart } = shot
  const centre = shot.centre.map((a, j) => a + delta * shot.centreDmu[j])
  const starts = segments.map((s) => s.x0)
  let last = 0
  return (x: number): number => {
    if (x < xStart) {
      if (x === 0) return centre[0]
      let f = 0
      for (let j = centre.length - 1; j >= 0; j--) f = f * x + centre[j]
      return f
    }
    // Callers mostly sweep x upwards (quadrature nodes, profiles): try the last segment and its successor first.
    let lo = last
    if (!(starts[lo] <= x && (lo + 1 === starts.length || x < starts[lo + 1]))) {
      lo = lo + 1 < starts.length && starts[lo + 1] <= x && (lo + 2 === starts.length || x < starts[lo + 2]) ? lo + 1 : -1
      if (lo < 0) {
        lo = 0
        let hi = starts.length - 1
        while (lo < hi) {
          const mid = (lo + hi + 1) >> 1
          if (starts[mid] <= x) lo = mid
          else hi = mid - 1
        }
      }
      last = lo
    }
    const at = Math.min(x, segments[lo].x0 + segments[lo].h)
    return denseValue(segments[lo], 5, 0, at) + delta * denseValue(segments[lo], 5, 3, at)
  }
}
