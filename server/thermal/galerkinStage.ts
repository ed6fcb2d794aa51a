/**
 * One stage's modal amplitudes under temperature-dependent coefficients, stepped by
 * an implicit Runge–Kutta method (temperatureDependent.ts drives it).
 *
 * The field is T = ℓ + Σ_j c_j(t) φ_j(x) on the stage's modal basis (ritzModes.ts:
 * the modes of a uniform body at the stage's Biot number, plus a face function per
 * convective face), and the weak form of ρc(T) ∂T/∂t = ∇·(k(T) ∇T) with the surface
 * losing q(T_s) = h(T_s)(T_s − T∞) + εσ(T_s⁴ − T∞⁴) projects it onto the modes:
 *
 *   M(c) ċ = f(c),   M_ab = L² ∫ x^m ρc(T) φ_a φ_b,
 *   f_a = −∫ x^m k(T) T′ φ_a′ − Σ_faces L q(T_face) φ_a(face)
 *
 * (x on 0–1, the integrals by the basis's quadrature with k and ρc read at each node
 * from the node's own temperature). With constant coefficients M and the stiffness
 * are diagonal in the modes and the amplitudes decay as the familiar series; the
 * temperature dependence couples them. The coupled system is stiff (the fastest
 * mode decays thousands of times faster than the slowest), so it is stepped by
 * Alexander's L-stable SDIRK (sdirk.ts): each stage solves
 *
 *   M(Y) (Y − Z) = γΔt f(Y),   Z = c_n + Δt Σ_{j<i} a_ij K_j,   K_i = (Y − Z)/(γΔt)
 *
 * by Newton's method with the matrix M + γΔt J, J = A + L² C + L q′(T_s) e eᵀ (A the
 * stiffness with k at the nodes, C the mass's change with the specific heat along the
 * step, q′ the face flux's slope, negative on a quench curve's vapour-blanket side).
 * A, C and M are kept from step to step and assembled again only when Newton was slow
 * or failed (the usual reuse of a stiff solver's Jacobian; the residual is always
 * exact), the face term is taken at each step's start, and the sum is factored every
 * step (LU: J is not definite). k′ is left out of J: its term, ∫ x^m k′ T′ φ_a′ φ_b,
 * saved a tenth of the Newton iterations on the benchmark bar and cost more to
 * assemble than that. The error estimate is the embedded second-order solution's
 * difference, passed through (M + γΔt J)⁻¹ M so fast modes that the
 * L-stable method damps do not count as error (Hairer & Wanner, Solving ODEs II,
 * §IV.8), measured as the largest temperature difference over the nodes and faces.
 */
import { endTemperature, largestOver, pairSums, type ModalBasis } from './ritzModes'
import type { SdirkTableau } from './sdirk'
import { luFactor, luSolve } from './denseLu'

/**
 * k and ρc at the nodes from the node temperatures (already clamped to the data's
 * range), and d(ρc)/dT into rhoCpSlope when given (for Newton's matrix).
 */
export type NodeProperties = (T: Float64Array, k: Float64Array, rhoCp: Float64Array, rhoCpSlope?: Float64Array) => void

/** Heat flux out of a convective face at its temperature, W/m². */
export type FaceFlux = (surface_C: number) => number

export interface GalerkinStage {
  basis: ModalBasis
  length_m: number
  properties: NodeProperties
  /** Flux laws of the convective faces (null for symmetric or fixed faces). */
  outerFlux: FaceFlux | null
  innerFlux: FaceFlux | null
  /** Keeps a truncated series' overshoot from picking coefficients outside the data's range. */
  clamp: (T_C: number) => number
  tableau: SdirkTableau
}

export interface StepResult {
  /** Coefficients at the step's end. */
  c: Float64Array
  /** The stages' derivatives K_i: the next step's predictors. */
  stages: Float64Array[]
  step_s: number
  /** Estimated local error, K (largest over the nodes and faces). */
  error_K: number
  /** The estimate as coefficients, for carrying it forward on the stage's modes. */
  errorVector: Float64Array
}

/**
 * Newton stops when the error it leaves could move no node by more than this share of
 * the step tolerance. Its errors are not in the embedded estimate and add up step
 * after step: at 0.1 the ISO 9950 probe's centre was 0.20 K off a converged
 * finite-volume run, at 0.03 0.035 K, for 15 % more time on the benchmark bar.
 */
const NEWTON_SHARE = 0.03
const NEWTON_ITERATIONS = 10
/** The smallest contraction a first update is judged by. */
const CONTRACTION_FLOOR = 1e-3
/** Newton iterations per stage beyond which the next step assembles a fresh matrix. */
const SLOW_NEWTON = 3
/** Surface temperature offset for the flux's slope, K: the curves are piecewise linear in much coarser steps. */
const FLUX_SLOPE_DELTA_K = 0.5

/** Steps a stage's coefficients; one instance per stage, its scratch arrays reused by every step. */
export class GalerkinStepper {
  private readonly n: number
  private readonly q: number
  private readonly T: Float64Array
  private readonly slope: Float64Array
  /** Node temperatures of the stage's Z (the part of Y fixed before its Newton iteration). */
  private readonly start: Float64Array
  private readonly clamped: Float64Array
  private readonly k: Float64Array
  private readonly rhoCp: Float64Array
  private readonly rhoCpSlope: Float64Array
  /** (ρc)′ Ṫ at the nodes, for C. */
  private readonly massChange: Float64Array
  private readonly massPairs: Float64Array
  private readonly stiffnessPairs: Float64Array
  private readonly changePairs: Float64Array
  private readonly mass: Float64Array
  /** M + γΔt J, factored in place, and its row swaps. */
  private readonly newton: Float64Array
  private readonly pivots: Int32Array
  /** φ_j and φ_j′ at node i, node-major (index i·N + j). */
  private readonly phiByNode: Float64Array
  private readonly dphiByNode: Float64Array
  private readonly jacobian: Float64Array
  /** Whether Newton asked for a fresh assembly of M and J. */
  private stale = true
  /** The last measured Newton contraction: judges a stage's first update (Hairer & Wanner's η). */
  private lastContraction = 1
  private readonly weighted: Float64Array
  private readonly flow: Float64Array
  /** Largest |φ_j| over the nodes and faces: bounds a coefficient change's effect on any temperature. */
  private readonly reach: Float64Array
  private outerT = 0
  private innerT = 0

  constructor(private readonly stage: GalerkinStage) {
    const { basis } = stage
    this.n = basis.count
    this.q = basis.nodes.length
    const { n, q } = this
    this.T = new Float64Array(q)
    this.slope = new Float64Array(q)
    this.start = new Float64Array(q)
    this.clamped = new Float64Array(q)
    this.k = new Float64Array(q)
    this.rhoCp = new Float64Array(q)
    this.rhoCpSlope = new Float64Array(q)
    this.massChange = new Float64Array(q)
    this.changePairs = new Float64Array((n * (n + 1)) / 2)
    this.pivots = new Int32Array(n)
    this.massPairs = new Float64Array((n * (n + 1)) / 2)
    this.stiffnessPairs = new Float64Array((n * (n + 1)) / 2)
    this.mass = new Float64Array(n * n)
    this.newton = new Float64Array(n * n)
    this.phiByNode = new Float64Array(n * q)
    this.dphiByNode = new Float64Array(n * q)
    for (let j = 0; j < n; j++)
      for (let i = 0; i < q; i++) {
        this.phiByNode[i * n + j] = basis.phi[j * q + i]
        this.dphiByNode[i * n + j] = basis.dphi[j * q + i]
      }
    this.jacobian = new Float64Array(n * n)
    this.weighted = new Float64Array(q)
    this.flow = new Float64Array(q)
    this.reach = Float64Array.from({ length: n }, (_, j) => {
      let peak = Math.max(Math.abs(basis.end0[j]), Math.abs(basis.end1[j]))
      for (let i = 0; i < q; i++) peak = Math.max(peak, Math.abs(basis.phi[j * q + i]))
      return peak
    })
  }

  /**
   * One step of `step_s` from coefficients c, the last accepted step (null at a
   * stage's start) giving the predictors. 'diverged' when Newton does not converge
   * (the caller shrinks the step), 'non-finite' when a value overflowed or was NaN.
   */
  step(c: Float64Array, previous: StepResult | null, step_s: number, tolerance_K: number): StepResult | 'diverged' | 'non-finite' {
    const { n } = this
    const { tableau } = this.stage
    const stageCount = tableau.weights.length
    const gh = tableau.gamma * step_s
    const factor = this.newtonFactor(c, gh, previous ? previous.stages[stageCount - 1] : null)
    if (!factor) return this.failed()
    const stages = Array.from({ length: stageCount }, () => new Float64Array(n))
    const Z = new Float64Array(n)
    const Y = new Float64Array(n)
    const residual = new Float64Array(n)
    // Derivatives known so far and where they sit (seconds from the step's start): the previous step's last two stages, then this step's.
    const known: { at_s: number; slope: Float64Array }[] = previous
      ? previous.stages.slice(-2).map((slope, i) => ({ at_s: (tableau.times[stageCount - 2 + i] - 1) * previous.step_s, slope }))
      : []
    const predictor = new Float64Array(n)
    for (let s = 0; s < stageCount; s++) {
      predictSlope(known, tableau.times[s] * step_s, predictor)
      for (let a = 0; a < n; a++) {
        let z = c[a]
        for (let j = 0; j < s; j++) z += step_s * tableau.below[s][j] * stages[j][a]
        Z[a] = z
        Y[a] = z + gh * predictor[a]
      }
      this.nodeValues(Z, this.start)
      // Newton stops when the error left after the last update, estimated from the updates' contraction
      // (θ/(1 − θ) times the last update, Hairer & Wanner §IV.8), is a small share of the tolerance.
      let converged = false
      let previousMove = Infinity
      let iteration = 0
      for (; iteration < NEWTON_ITERATIONS && !converged; iteration++) {
        this.residual(Y, gh, residual)
        luSolve(factor, n, this.pivots, residual)
        let moved = 0
        for (let a = 0; a < n; a++) {
          Y[a] -= residual[a]
          moved += Math.abs(residual[a]) * this.reach[a]
        }
        if (!Number.isFinite(moved)) return 'non-finite'
        // A first update is judged by the last contraction measured (Hairer & Wanner's η), else taken as is.
        const contraction = iteration === 0 ? Math.max(this.lastContraction, CONTRACTION_FLOOR) ** 0.8 : moved / previousMove
        if (iteration > 0 && contraction >= 1) return this.failed()
        if (iteration > 0) this.lastContraction = contraction
        const left = contraction < 1 ? (contraction / (1 - contraction)) * moved : moved
        converged = left <= NEWTON_SHARE * tolerance_K
        previousMove = moved
      }
      if (!converged) return this.failed()
      if (iteration > SLOW_NEWTON) this.stale = true
      for (let a = 0; a < n; a++) stages[s][a] = (Y[a] - Z[a]) / gh
      known.push({ at_s: tableau.times[s] * step_s, slope: stages[s] })
    }
    // Embedded difference, filtered: (M + γΔt J)⁻¹ M e.
    const difference = new Float64Array(n)
    for (let a = 0; a < n; a++) {
      let e = 0
      for (let s = 0; s < stageCount; s++) e += (tableau.weights[s] - tableau.embedded[s]) * stages[s][a]
      difference[a] = step_s * e
    }
    const filtered = new Float64Array(n)
    for (let a = 0; a < n; a++) {
      let s = 0
      for (let b = 0; b < n; b++) s += this.mass[a * n + b] * difference[b]
      filtered[a] = s
    }
    luSolve(factor, n, this.pivots, filtered)
    const error_K = largestOver(this.stage.basis, filtered)
    if (!Number.isFinite(error_K)) return 'non-finite'
    return { c: Y, stages, step_s, error_K, errorVector: filtered }
  }

  /** Node temperatures of c into out. */
  private nodeValues(c: Float64Array, out: Float64Array): void {
    const { basis } = this.stage
    const { n, q, phiByNode } = this
    for (let i = 0, o = 0; i < q; i++, o += n) {
      let value = basis.lift0 + basis.liftSlope * basis.nodes[i]
      for (let j = 0; j < n; j++) value += c[j] * phiByNode[o + j]
      out[i] = value
    }
  }

  /** Node temperatures and slopes of c, the node properties, the face temperatures. */
  private fieldOf(c: Float64Array, rhoCpSlope?: Float64Array): void {
    const { basis, clamp } = this.stage
    const { n, q, T, slope, clamped, phiByNode, dphiByNode } = this
    const { lift0, liftSlope, nodes } = basis
    // Node by node over node-major copies of φ and φ′: two running sums per node, ~1.5× the
    // speed of adding one function at a time into the node arrays (measured in isolation).
    for (let i = 0, o = 0; i < q; i++, o += n) {
      let value = lift0 + liftSlope * nodes[i]
      let gradient = liftSlope
      for (let j = 0; j < n; j++) {
        value += c[j] * phiByNode[o + j]
        gradient += c[j] * dphiByNode[o + j]
      }
      T[i] = value
      slope[i] = gradient
      clamped[i] = clamp(value)
    }
    this.stage.properties(clamped, this.k, this.rhoCp, rhoCpSlope)
    this.outerT = clamp(endTemperature(basis, c, 1))
    this.innerT = clamp(endTemperature(basis, c, 0))
  }

  /** R = M(Y)(Y − Z) − γΔt f(Y), with Z's node temperatures in this.start (set once per stage). */
  private residual(Y: Float64Array, gh: number, out: Float64Array): void {
    this.fieldOf(Y)
    const { basis, length_m: L } = this.stage
    const { n, q, weighted, flow, T, start, k, rhoCp, slope } = this
    const { weights, phi, dphi } = basis
    for (let i = 0; i < q; i++) {
      const w = weights[i]
      weighted[i] = L * L * w * rhoCp[i] * (T[i] - start[i])
      flow[i] = gh * w * k[i] * slope[i]
    }
    const outerLoss = this.stage.outerFlux ? gh * L * this.stage.outerFlux(this.outerT) : 0
    const innerLoss = this.stage.innerFlux ? gh * L * this.stage.innerFlux(this.innerT) : 0
    for (let a = 0, o = 0; a < n; a++, o += q) {
      let s = 0
      for (let i = 0; i < q; i++) s += weighted[i] * phi[o + i] + flow[i] * dphi[o + i]
      out[a] = s + outerLoss * basis.end1[a] + innerLoss * basis.end0[a]
    }
  }

  /**
   * LU factor of M + γΔt J (null when singular), J's bulk as last assembled (again
   * only when Newton was slow or failed) and its face terms L q′ e eᵀ at this step's
   * start: a quench curve's slope jumps and changes sign at its peak, within a step or
   * two, and a slope from the wrong side made Newton crawl or diverge there (the oil-
   * quenched reference rod took 191 sub-steps with it, 98 without). M stays for the
   * error filter.
   */
  private newtonFactor(c: Float64Array, gh: number, rate: Float64Array | null): Float64Array | null {
    const { basis, length_m: L } = this.stage
    const { n, mass, jacobian, newton } = this
    if (this.stale) this.assemble(c, rate)
    for (let p = 0; p < n * n; p++) newton[p] = mass[p] + gh * jacobian[p]
    const faces: [FaceFlux | null, Float64Array, 0 | 1][] = [
      [this.stage.outerFlux, basis.end1, 1],
      [this.stage.innerFlux, basis.end0, 0],
    ]
    for (const [flux, values, end] of faces) {
      if (!flux) continue
      const T = this.stage.clamp(endTemperature(basis, c, end))
      const slope = (gh * L * (flux(T + FLUX_SLOPE_DELTA_K) - flux(T - FLUX_SLOPE_DELTA_K))) / (2 * FLUX_SLOPE_DELTA_K)
      for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) newton[a * n + b] += slope * values[a] * values[b]
    }
    return luFactor(newton, n, this.pivots) ? newton : null
  }

  /** A step Newton could not finish: the caller shrinks it, and the next try assembles afresh. */
  private failed(): 'diverged' {
    this.stale = true
    return 'diverged'
  }

  /**
   * M(c) and the bulk of J(c): the stiffness A_ab = ∫ x^m k φ_a′ φ_b′ and the mass's
   * change C_ab = ∫ x^m (ρc)′ Ṫ φ_a φ_b, Ṫ from the last step's end derivative `rate`
   * (the stage's Y − Z is γΔt Ṫ, so its mass term M(Y)(Y − Z) has the slope M + γΔt L² C).
   * At the specific-heat peak (ρc)′ ΔT is a tenth of ρc within a step; without C Newton
   * took 15 % more iterations on the benchmark bar.
   */
  private assemble(c: Float64Array, rate: Float64Array | null): void {
    this.fieldOf(c, this.rhoCpSlope)
    const { basis, length_m: L } = this.stage
    const { n, q, mass, jacobian, phiByNode, rhoCpSlope, massChange } = this
    pairSums(basis.phiPairs, this.rhoCp, q, this.massPairs)
    pairSums(basis.dphiPairs, this.k, q, this.stiffnessPairs)
    for (let i = 0, o = 0; i < q; i++, o += n) {
      let rate_K_s = 0
      if (rate) for (let j = 0; j < n; j++) rate_K_s += rate[j] * phiByNode[o + j]
      massChange[i] = rhoCpSlope[i] * rate_K_s
    }
    pairSums(basis.phiPairs, massChange, q, this.changePairs)
    for (let a = 0, p = 0; a < n; a++)
      for (let b = a; b < n; b++, p++) {
        mass[a * n + b] = mass[b * n + a] = L * L * this.massPairs[p]
        jacobian[a * n + b] = jacobian[b * n + a] = this.stiffnessPairs[p] + L * L * this.changePairs[p]
      }
    this.stale = false
  }
}

/**
 * The next stage's derivative, extrapolated linearly in time through the two latest
 * known (the previous step's last stages, then this step's): Newton's starting point.
 * A stage's derivative drifts smoothly along the step, so this halves the first update
 * of holding the last one (measured on the benchmark bar: 16 % fewer Newton iterations).
 */
function predictSlope(known: { at_s: number; slope: Float64Array }[], at_s: number, out: Float64Array): void {
  if (known.length === 0) {
    out.fill(0)
    return
  }
  const last = known[known.length - 1]
  if (known.length === 1) {
    out.set(last.slope)
    return
  }
  const before = known[known.length - 2]
  const w = (at_s - before.at_s) / (last.at_s - before.at_s)
  for (let a = 0; a < out.length; a++) out[a] = before.slope[a] + w * (last.slope[a] - before.slope[a])
}
