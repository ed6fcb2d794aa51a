// The declarations must reach every tsconfig that compiles this file (app, server, tests, scripts).
// eslint-disable-next-line @typescript-eslint/triple-slash-reference
/// <reference path="./besselPackage.d.ts" />
/**
 * J0, J1 and their zeros.
 *
 * Values come from the `bessel` package (polynomial/asymptotic fits, absolute
 * error ≈ 3e-9, checked against mpmath values in tests/fixtures/reference-values.json). Zeros are
 * bracketed around McMahon's asymptotic estimates j0,n ≈ (n − ¼)π,
 * j1,n ≈ (n + ¼)π (A&S 9.5.12) — the estimate is within 0.1 of the zero and
 * consecutive zeros are ≈ π apart, so a ±0.4 bracket holds exactly one — and
 * polished with Brent. Accuracy is limited by the J values: ≈ 1e-8 absolute.
 */
import bessel from 'bessel'
import { brent } from './roots'

export function besselJ0(x: number): number {
  return x === 0 ? 1 : bessel.besselj(x, 0)
}

export function besselJ1(x: number): number {
  return x === 0 ? 0 : bessel.besselj(x, 1)
}

// The zeros are constants that bracket every rod root, so each is found once per process.
const j0Zeros: number[] = []
const j1Zeros: number[] = []

/** n-th positive zero of J0 (n ≥ 1). */
export function besselJ0Zero(n: number): number {
  if (j0Zeros[n] === undefined) {
    const guess = (n - 0.25) * Math.PI
    j0Zeros[n] = brent(besselJ0, guess - 0.4, guess + 0.4, { xtol: 1e-13 })
  }
  return j0Zeros[n]
}

/** n-th positive zero of J1 (n ≥ 1); j1,0 = 0 is excluded. */
export function besselJ1Zero(n: number): number {
  if (j1Zeros[n] === undefined) {
    const guess = (n + 0.25) * Math.PI
    j1Zeros[n] = brent(besselJ1, guess - 0.4, guess + 0.4, { xtol: 1e-13 })
  }
  return j1Zeros[n]
}
