/**
 * The singly diagonally implicit Runge–Kutta method of the temperature-dependent
 * engine (every stage's diagonal entry γ): L-stable and stiffly accurate (the step's
 * result is its last stage, so a stiff component is damped to its quasi-steady value
 * instead of ringing), with an embedded lower-order combination of the same stages
 * for the error estimate. Its order conditions are checked in
 * tests/unit/thermal/sdirk.test.ts. Tried in its place and not kept: Hairer & Wanner's
 * five-stage fourth-order SDIRK (fewer steps but more Newton solves in all, and its
 * estimate fell below the measured error on the benchmark bar, whose tables' kinks
 * cap the order a step can use) and Kennedy & Carpenter's ESDIRK3(2)4L[2]SA (stage
 * order two, explicit first stage: 20 % fewer steps, but its embedded estimate fell
 * below the measured error on the water-quenched cases, and at a tolerance that
 * holds them it cost as much as this method).
 */
export interface SdirkTableau {
  /** The diagonal entry of every stage. */
  gamma: number
  /** The stages' coefficients a_ij below the diagonal, row by row. */
  below: readonly (readonly number[])[]
  /** Where the stages sit in the step: c_i = Σ_j a_ij (γ included). */
  times: readonly number[]
  weights: readonly number[]
  embedded: readonly number[]
  /** The embedded combination's order: the step is resized by (tolerance / error)^(1/(estimateOrder + 1)). */
  estimateOrder: number
}

/** γ: the root of 6γ³ − 18γ² + 9γ − 1 = 0 between 1/6 and 1/2, to double precision. */
const GAMMA_3 = 0.435866521508459
const alexanderB1 = (-3 * GAMMA_3 * GAMMA_3) / 2 + 4 * GAMMA_3 - 1 / 4
const alexanderB2 = (3 * GAMMA_3 * GAMMA_3) / 2 - 5 * GAMMA_3 + 5 / 4
const alexanderEmbedded2 = (1 - 2 * GAMMA_3) / (1 - GAMMA_3)

/**
 * Three stages, third order: R. Alexander, "Diagonally implicit Runge–Kutta methods
 * for stiff O.D.E.'s", SIAM J. Numer. Anal. 14 (1977). Embedded: second order with
 * b̂₃ = 0 (Σb̂ = 1, Σb̂c = ½).
 */
export const ALEXANDER_3: SdirkTableau = {
  gamma: GAMMA_3,
  below: [[], [(1 - GAMMA_3) / 2], [alexanderB1, alexanderB2]],
  times: [GAMMA_3, (1 + GAMMA_3) / 2, 1],
  weights: [alexanderB1, alexanderB2, GAMMA_3],
  embedded: [1 - alexanderEmbedded2, alexanderEmbedded2, 0],
  estimateOrder: 2,
}
