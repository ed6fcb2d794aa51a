/**
 * The modal basis of a temperature-dependent stage (temperatureDependent.ts), its
 * quadrature, and the Rayleigh–Ritz modes of the problem frozen at one field (the
 * stage's start, end and open end; galerkinStage.ts steps the unfrozen problem on
 * the same basis).
 *
 * With k(x) and ρc(x) frozen from a temperature field and each surface frozen as
 * −k ∂T/∂r = h_eff (T_s − T∞), the conduction equation is linear and
 *
 *   T(x, t) = ℓ(x) + Σ_i c_i(t) φ_i(x),   M ċ = −A c + b,
 *   M_ij = L² ∫ x^m ρc φ_i φ_j,   A_ij = ∫ x^m k φ_i′ φ_j′ + Σ_faces h_eff L φ_i φ_j,
 *   b_i = −∫ x^m k ℓ′ φ_i′ − Σ_faces h_eff L (ℓ − T∞) φ_i
 *
 * (the weak form; a fixed face is built into the basis, which vanishes there, and
 * the lift ℓ, linear between the fixed temperatures, else the outer surroundings:
 * the uniform steady state of a body with a symmetric centre is then c_ss = 0
 * exactly, not a Ritz fit of a constant). Its solution is the eigenmode
 * series c = c_ss + Σ_n a_n v_n e^{−μ_n t} with A v = μ M v, M-orthonormal v_n,
 * c_ss = A⁻¹ b and a_n = v_nᵀ M (c(0) − c_ss): the same form as a stage of the
 * constant-property engine, with Ritz approximations of the frozen modes. The basis
 * φ_i is the modes of a uniform body with the stage's boundary types at a nearby
 * Biot number (eigenRoots.ts), so for uniform properties the Ritz modes are the exact
 * ones and otherwise the matrices are nearly diagonal. Surface conditions are
 * natural in the weak form, so one basis (with a face function, basisFunctions)
 * serves every h the surface passes through.
 */
import { besselJ0, besselJ1 } from './bessel'
import { rodRoot, slabRoot, sphereRoot } from './eigenRoots'
import { compositeRule } from './quadrature'
import { backSubstitute, cholesky, forwardSubstitute, jacobiEigen } from './symmetricEigen'
import type { Geometry } from './types'

/** How a face enters the basis: no flux, a fixed temperature (built in), or a convective (natural) condition. */
export type FaceKind = 'symmetry' | 'fixed' | 'convective'

export interface BasisSpec {
  geometry: Geometry
  count: number
  inner: FaceKind
  outer: FaceKind
  /** Biot numbers of the uniform body whose modes are the basis (ignored at fixed or symmetric faces). */
  innerBiot: number
  outerBiot: number
  /** Fixed face temperatures, for the lift. */
  innerFixed_C?: number
  outerFixed_C?: number
  /** The outer surroundings: the lift when no face is fixed, so a uniform steady state is exact. */
  outerAmbient_C?: number
  /** x where the start profile or the material has a kink or jump (quadrature panel edges). */
  breakpoints: number[]
}

export interface ModalBasis {
  spec: BasisSpec
  m: 0 | 1 | 2
  /** Number of basis functions (the modes and the face functions). */
  count: number
  /** Roots λ_j of the basis modes. */
  roots: Float64Array
  /** All φ_j(x) into out (and φ_j′(x) into slope). */
  at: (x: number, out: Float64Array, slope?: Float64Array) => void
  /** Quadrature nodes and weights (with x^m) on 0–1. */
  nodes: Float64Array
  weights: Float64Array
  /** φ_j and φ_j′ at node q: index j·Q + q. */
  phi: Float64Array
  dphi: Float64Array
  /** w_q φ_a φ_b and w_q φ_a′ φ_b′ at node q for each pair a ≤ b (pair by pair, Q apart): the frozen matrices are their sums weighted by ρc and k. */
  phiPairs: Float64Array
  dphiPairs: Float64Array
  /** φ_j at x = 0 and x = 1. */
  end0: Float64Array
  end1: Float64Array
  /** Lift ℓ(x) = lift0 + liftSlope·x. */
  lift0: number
  liftSlope: number
}

/** φ(x) and φ′(x) of a uniform mode with root λ (inner Biot bi0 for a slab). */
function shapeAndSlope(geometry: Geometry, lam: number, bi0: number, x: number): [number, number] {
  if (geometry === 'slab') {
    const phase = lam * x - Math.atan2(bi0, lam)
    return [Math.cos(phase), -lam * Math.sin(phase)]
  }
  if (geometry === 'rod') return [besselJ0(lam * x), -lam * besselJ1(lam * x)]
  const z = lam * x
  // sin z / z and its slope; below z = 1e-3 their Taylor series are exact to rounding.
  if (z < 1e-3) return [1 - (z * z) / 6, (-lam * z) / 3]
  return [Math.sin(z) / z, (lam * (z * Math.cos(z) - Math.sin(z))) / (z * z)]
}

const biotOf = (kind: FaceKind, biot: number) => (kind === 'fixed' ? Infinity : kind === 'symmetry' ? 0 : biot)

/**
 * The basis functions: `count` uniform modes, then one function per convective face
 * whose slope there breaks the modes' shared Robin ratio φ′/φ = −Bi (x² at the outer
 * face, (1 − x)² at a slab's inner face, each zero or flat at the other end). Every
 * uniform mode obeys the reference Biot number at a convective face, so without it
 * no finite sum could follow a surface whose h_eff has moved away from it, and the
 * surface values would converge only like 1/N.
 */
function basisFunctions(spec: BasisSpec): { roots: Float64Array; at: (x: number, out: Float64Array, slope?: Float64Array) => void; size: number } {
  const { geometry, count } = spec
  const bi0 = biotOf(spec.inner, spec.innerBiot)
  const bi1 = biotOf(spec.outer, spec.outerBiot)
  const roots = Float64Array.from({ length: count }, (_, j) =>
    geometry === 'slab' ? slabRoot(j + 1, bi0, bi1) : geometry === 'rod' ? rodRoot(j + 1, bi1) : sphereRoot(j + 1, bi1),
  )
  const outerExtra = spec.outer === 'convective'
  const innerExtra = spec.inner === 'convective'
  const size = count + (outerExtra ? 1 : 0) + (innerExtra ? 1 : 0)
  return {
    roots,
    size,
    at: (x, out, slope) => {
      for (let j = 0; j < count; j++) {
        const [f, df] = shapeAndSlope(geometry, roots[j], bi0, x)
        out[j] = f
        if (slope) slope[j] = df
      }
      let j = count
      if (outerExtra) {
        out[j] = x * x
        if (slope) slope[j] = 2 * x
        j++
      }
      if (innerExtra) {
        out[j] = (1 - x) * (1 - x)
        if (slope) slope[j] = -2 * (1 - x)
      }
    },
  }
}

export function modalBasis(spec: BasisSpec): ModalBasis {
  const m = spec.geometry === 'slab' ? 0 : spec.geometry === 'rod' ? 1 : 2
  const functions = basisFunctions(spec)
  const { roots, size } = functions
  // φ_i φ_j oscillates at most like 2λ_max: over 12 radians of it an 8-point Gauss panel errs by ~1e-5
  // relative (the Gauss remainder, w^17 (8!)^4 f^(16) / (17 (16!)^3)), and only in the fastest pairs.
  // Narrower panels bought nothing measurable (the benchmark bar, the ISO probe log, the water-quenched
  // rod unchanged to 0.005 K) and cost up to twice the nodes, which every frozen solve's assembly sums over.
  const rule = compositeRule(spec.breakpoints, Math.min(1 / 8, 6 / roots[spec.count - 1]), (x) => x ** m)
  const q = rule.x.length
  const phi = new Float64Array(size * q)
  const dphi = new Float64Array(size * q)
  const value = new Float64Array(size)
  const slope = new Float64Array(size)
  for (let i = 0; i < q; i++) {
    functions.at(rule.x[i], value, slope)
    for (let j = 0; j < size; j++) {
      phi[j * q + i] = value[j]
      dphi[j * q + i] = slope[j]
    }
  }
  const end0 = new Float64Array(size)
  const end1 = new Float64Array(size)
  functions.at(0, end0)
  functions.at(1, end1)
  const t0 = spec.inner === 'fixed' ? (spec.innerFixed_C as number) : undefined
  const t1 = spec.outer === 'fixed' ? (spec.outerFixed_C as number) : undefined
  const lift0 = t0 ?? t1 ?? spec.outerAmbient_C ?? 0
  const liftSlope = t0 !== undefined && t1 !== undefined ? t1 - t0 : 0
  const phiPairs = new Float64Array(((size * (size + 1)) / 2) * q)
  const dphiPairs = new Float64Array(phiPairs.length)
  let offset = 0
  for (let a = 0; a < size; a++)
    for (let b = a; b < size; b++, offset += q)
      for (let i = 0; i < q; i++) {
        phiPairs[offset + i] = rule.w[i] * phi[a * q + i] * phi[b * q + i]
        dphiPairs[offset + i] = rule.w[i] * dphi[a * q + i] * dphi[b * q + i]
      }
  return { spec, m, count: size, roots, nodes: rule.x, weights: rule.w, phi, dphi, phiPairs, dphiPairs, end0, end1, lift0, liftSlope, at: functions.at }
}

/** φ_j(x) for every j, for reading a sub-step's series away from the nodes. */
export function basisValues(basis: ModalBasis, x: number): Float64Array {
  const out = new Float64Array(basis.count)
  basis.at(x, out)
  return out
}

/** Temperatures at the quadrature nodes of T = ℓ + Σ c_j φ_j. */
export function nodeTemperatures(basis: ModalBasis, c: Float64Array, out: Float64Array = new Float64Array(basis.nodes.length)): Float64Array {
  const q = basis.nodes.length
  for (let i = 0; i < q; i++) out[i] = basis.lift0 + basis.liftSlope * basis.nodes[i]
  for (let j = 0; j < basis.count; j++) {
    const cj = c[j]
    if (cj === 0) continue
    for (let i = 0; i < q; i++) out[i] += cj * basis.phi[j * q + i]
  }
  return out
}

/** Largest |Σ_j v_j φ_j| over the nodes and both faces: how far a coefficient change moves any temperature. */
export function largestOver(basis: ModalBasis, v: Float64Array): number {
  const n = basis.count
  const q = basis.nodes.length
  let peak = 0
  for (let i = 0; i < q; i++) {
    let s = 0
    for (let j = 0; j < n; j++) s += v[j] * basis.phi[j * q + i]
    peak = Math.max(peak, Math.abs(s))
  }
  let s0 = 0
  let s1 = 0
  for (let j = 0; j < n; j++) {
    s0 += v[j] * basis.end0[j]
    s1 += v[j] * basis.end1[j]
  }
  return Math.max(peak, Math.abs(s0), Math.abs(s1))
}

/** T at x = 0 or x = 1 of T = ℓ + Σ c_j φ_j. */
export function endTemperature(basis: ModalBasis, c: Float64Array, end: 0 | 1): number {
  const values = end === 0 ? basis.end0 : basis.end1
  let T = basis.lift0 + (end === 1 ? basis.liftSlope : 0)
  for (let j = 0; j < basis.count; j++) T += c[j] * values[j]
  return T
}

/** Best fit (in ∫x^m) of a temperature function by ℓ + Σ c_j φ_j: the start of a stage. */
export function projectOnto(basis: ModalBasis, temperatureAt: (x: number) => number): Float64Array {
  const q = basis.nodes.length
  const n = basis.count
  const excess = new Float64Array(q)
  for (let i = 0; i < q; i++) excess[i] = temperatureAt(basis.nodes[i]) - basis.lift0 - basis.liftSlope * basis.nodes[i]
  const gram = new Float64Array(n * n)
  const c = new Float64Array(n)
  for (let a = 0; a < n; a++) {
    for (let i = 0; i < q; i++) c[a] += basis.weights[i] * basis.phi[a * q + i] * excess[i]
    for (let b = a; b < n; b++) {
      let s = 0
      for (let i = 0; i < q; i++) s += basis.weights[i] * basis.phi[a * q + i] * basis.phi[b * q + i]
      gram[a * n + b] = gram[b * n + a] = s
    }
  }
  const factor = cholesky(gram, n)
  forwardSubstitute(factor, n, c)
  backSubstitute(factor, n, c)
  return c
}

/**
 * Relative off-diagonal size at which a frozen problem's Jacobi solve stops: its
 * modes are then those of a matrix within 1e-8 of the Ritz matrix, far inside the
 * quadrature's ~1e-5, and the rates, quadratic in it, exact to ~1e-16. From the
 * previous sub-step's eigenvectors that takes one or two sweeps where the solver's
 * default 1e-11 took two or three (a third of the eigen time on the benchmark bar).
 */
const EIGEN_TOLERANCE = 1e-8

/** The frozen problem: properties at the nodes and the faces' frozen coefficients. */
export interface FrozenCoefficients {
  length_m: number
  /** k and ρc at each quadrature node. */
  k_W_mK: Float64Array
  rhoCp_J_m3K: Float64Array
  /** h_eff and ambient of convective faces (ignored otherwise). */
  outerH_W_m2K: number
  outerAmbient_C: number
  innerH_W_m2K: number
  innerAmbient_C: number
}

/** One frozen sub-step as a series in basis coefficients: c(τ) = steady + Σ_n e^{−rate_n τ} amplitude vector_n. */
export interface FrozenSeries {
  rates_per_s: Float64Array
  steady: Float64Array
  /** a_n v_n for mode n at index n·N + i. */
  modeVectors: Float64Array
  /** The orthogonal eigenvectors of the symmetrised problem: the warm start of the next, nearby frozen problem. */
  rotation: Float64Array
  /** Cholesky factor R of the mass matrix (M = R Rᵀ): with `rotation`, the modes of any coefficient vector. */
  massFactor: Float64Array
}

/**
 * The Ritz modes of the frozen problem and the series from coefficients c0 at τ = 0.
 * `start` is the `rotation` of a nearby frozen problem on the same basis (the eigen
 * solve then takes one or two Jacobi sweeps).
 */
export function frozenSeries(basis: ModalBasis, frozen: FrozenCoefficients, c0: Float64Array, start?: Float64Array): FrozenSeries {
  const n = basis.count
  const q = basis.nodes.length
  const { dphi, weights, phiPairs, dphiPairs } = basis
  const L = frozen.length_m
  const mass = new Float64Array(n * n)
  const stiffness = new Float64Array(n * n)
  const load = new Float64Array(n)
  const k = frozen.k_W_mK
  const c = frozen.rhoCp_J_m3K
  const massPairs = pairSums(phiPairs, c, q)
  const stiffnessPairs = pairSums(dphiPairs, k, q)
  for (let a = 0, pair = 0; a < n; a++) {
    for (let b = a; b < n; b++, pair++) {
      mass[a * n + b] = mass[b * n + a] = L * L * massPairs[pair]
      stiffness[a * n + b] = stiffness[b * n + a] = stiffnessPairs[pair]
    }
    if (basis.liftSlope === 0) continue
    let sl = 0
    for (let i = 0; i < q; i++) sl += weights[i] * k[i] * dphi[a * q + i]
    load[a] = -basis.liftSlope * sl
  }
  const faces: [FaceKind, Float64Array, number, number, number][] = [
    [basis.spec.outer, basis.end1, frozen.outerH_W_m2K, frozen.outerAmbient_C, basis.lift0 + basis.liftSlope],
    [basis.spec.inner, basis.end0, frozen.innerH_W_m2K, frozen.innerAmbient_C, basis.lift0],
  ]
  for (const [kind, values, h, ambient, lift] of faces) {
    if (kind !== 'convective') continue
    const hl = h * L
    for (let a = 0; a < n; a++) {
      load[a] -= hl * (lift - ambient) * values[a]
      for (let b = 0; b < n; b++) stiffness[a * n + b] += hl * values[a] * values[b]
    }
  }
  // Steady coefficients: A c_ss = b.
  const stiffFactor = cholesky(stiffness, n)
  const steady = Float64Array.from(load)
  forwardSubstitute(stiffFactor, n, steady)
  backSubstitute(stiffFactor, n, steady)
  // A v = μ M v through S = R⁻¹ A R⁻ᵀ with M = R Rᵀ: v = R⁻ᵀ u for the unit eigenvectors u of S.
  const r = cholesky(mass, n)
  const s = transformedStiffness(r, stiffness, n)
  const column = new Float64Array(n)
  const u = new Float64Array(n * n)
  jacobiEigen(s, n, u, start, EIGEN_TOLERANCE)
  // Amplitude of mode j: a_j = v_jᵀ M (c0 − c_ss) = u_jᵀ Rᵀ (c0 − c_ss).
  const excess = new Float64Array(n)
  for (let a = 0; a < n; a++) excess[a] = c0[a] - steady[a]
  const rExcess = lowerTransposeTimes(r, excess)
  const rates = new Float64Array(n)
  const modeVectors = new Float64Array(n * n)
  for (let j = 0; j < n; j++) {
    rates[j] = s[j * n + j]
    let amplitude = 0
    for (let a = 0; a < n; a++) {
      column[a] = u[a * n + j]
      amplitude += column[a] * rExcess[a]
    }
    backSubstitute(r, n, column)
    for (let a = 0; a < n; a++) modeVectors[j * n + a] = amplitude * column[a]
  }
  return { rates_per_s: rates, steady, modeVectors, rotation: u, massFactor: r }
}

/** Rᵀ x for a lower-triangular R (row-major n×n). */
function lowerTransposeTimes(r: Float64Array, x: Float64Array): Float64Array {
  const n = x.length
  const out = new Float64Array(n)
  for (let a = 0; a < n; a++) {
    let sum = 0
    for (let b = a; b < n; b++) sum += r[b * n + a] * x[b]
    out[a] = sum
  }
  return out
}

/** Amplitudes a_n = v_nᵀ M x = u_nᵀ Rᵀ x of a coefficient vector x on a frozen problem's M-orthonormal modes v_n. */
export function modalAmplitudes(series: FrozenSeries, x: Float64Array): Float64Array {
  const n = x.length
  const rx = lowerTransposeTimes(series.massFactor, x)
  const out = new Float64Array(n)
  for (let j = 0; j < n; j++) {
    let sum = 0
    for (let a = 0; a < n; a++) sum += series.rotation[a * n + j] * rx[a]
    out[j] = sum
  }
  return out
}

/** Each M-orthonormal mode v_n = R⁻ᵀ u_n at the nodes and both faces: index n·(Q + 2) + i, the faces last. */
export function modeShapes(basis: ModalBasis, series: FrozenSeries): Float64Array {
  const n = basis.count
  const q = basis.nodes.length
  const width = q + 2
  const out = new Float64Array(n * width)
  const column = new Float64Array(n)
  for (let j = 0; j < n; j++) {
    for (let a = 0; a < n; a++) column[a] = series.rotation[a * n + j]
    backSubstitute(series.massFactor, n, column)
    const o = j * width
    for (let a = 0; a < n; a++) {
      const ca = column[a]
      for (let i = 0; i < q; i++) out[o + i] += ca * basis.phi[a * q + i]
      out[o + q] += ca * basis.end0[a]
      out[o + q + 1] += ca * basis.end1[a]
    }
  }
  return out
}

/**
 * S = R⁻¹ A R⁻ᵀ for lower-triangular R and symmetric A (row-major n×n): X = R⁻¹ A
 * by forward substitution on whole rows, then S = R⁻¹ Xᵀ the same way (Xᵀ = A R⁻ᵀ),
 * so every inner loop runs along contiguous rows.
 */
function transformedStiffness(r: Float64Array, a: Float64Array, n: number): Float64Array {
  const x = new Float64Array(n * n)
  const s = new Float64Array(n * n)
  forwardRows(r, a, x, n)
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const upper = x[i * n + j]
      x[i * n + j] = x[j * n + i]
      x[j * n + i] = upper
    }
  forwardRows(r, x, s, n)
  return s
}

/** out = R⁻¹ b for lower-triangular R, all n columns of b at once (row-major). */
function forwardRows(r: Float64Array, b: Float64Array, out: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) {
    const row = i * n
    for (let j = 0; j < n; j++) out[row + j] = b[row + j]
    for (let k = 0; k < i; k++) {
      const rik = r[row + k]
      const from = k * n
      for (let j = 0; j < n; j++) out[row + j] -= rik * out[from + j]
    }
    const inverse = 1 / r[row + i]
    for (let j = 0; j < n; j++) out[row + j] *= inverse
  }
}

/**
 * Σ_i node[i] · pairs[p·Q + i] for every pair p: the frozen matrices' entries. The
 * assembly is most of a frozen solve's arithmetic; four running sums let the loop
 * overlap its multiplications (Q is a multiple of 8, the Gauss panels' order).
 */
export function pairSums(pairs: Float64Array, node: Float64Array, q: number, out: Float64Array = new Float64Array(pairs.length / q)): Float64Array {
  for (let p = 0, o = 0; p < out.length; p++, o += q) {
    let s0 = 0
    let s1 = 0
    let s2 = 0
    let s3 = 0
    for (let i = 0; i < q; i += 4) {
      s0 += node[i] * pairs[o + i]
      s1 += node[i + 1] * pairs[o + i + 1]
      s2 += node[i + 2] * pairs[o + i + 2]
      s3 += node[i + 3] * pairs[o + i + 3]
    }
    out[p] = s0 + s1 + s2 + s3
  }
  return out
}

/**
 * Coefficients τ seconds into a series of exponentials, c(τ) = steady + Σ_j e^{−rate_j τ} vector_j:
 * a frozen series (one term per mode) or a stepped sub-step's interpolant (a few terms).
 */
export function seriesCoefficients(series: Pick<FrozenSeries, 'rates_per_s' | 'steady' | 'modeVectors'>, tau_s: number, out = new Float64Array(series.steady.length)): Float64Array {
  const n = series.steady.length
  out.set(series.steady)
  for (let j = 0; j < series.rates_per_s.length; j++) {
    const decay = Math.exp(-series.rates_per_s[j] * tau_s)
    if (decay === 0) continue
    for (let a = 0; a < n; a++) out[a] += decay * series.modeVectors[j * n + a]
  }
  return out
}
