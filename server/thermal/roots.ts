/**
 * Safeguarded scalar root finding on a sign-changing bracket.
 *
 * Brent's method (inverse quadratic interpolation guarded by bisection), as in
 * R. P. Brent, "Algorithms for Minimization without Derivatives" (1973), ch. 4.
 * Every root in this folder is found inside a bracket we constructed ourselves,
 * so the method never leaves [a, b] and always converges; a non-finite f or the
 * iteration cap is refused (EngineLimitError) rather than looped on.
 */
import { EngineLimitError } from './errors'

export interface BrentOptions {
  /** Absolute tolerance on the root (default 0). */
  xtol?: number
  /** Relative tolerance on the root (default 4 machine epsilons). */
  rtol?: number
  maxIterations?: number
  /** Already-known f(a), f(b), to save evaluations. */
  fa?: number
  fb?: number
}

const EPS = Number.EPSILON

/*
 * Signs compared directly: the product fa·fb underflows to zero for tiny values
 * (5e-324 × −5e-324 = −0), which read as "no sign change" on a valid bracket.
 */
const opposite = (u: number, v: number) => (u < 0 && v > 0) || (u > 0 && v < 0)
const same = (u: number, v: number) => (u < 0 && v < 0) || (u > 0 && v > 0)

/** Solves f(x) = 0 for x in [a, b]; f(a) and f(b) must differ in sign. */
export function brent(f: (x: number) => number, a: number, b: number, options: BrentOptions = {}): number {
  const xtol = options.xtol ?? 0
  const rtol = options.rtol ?? 4 * EPS
  const maxIterations = options.maxIterations ?? 200
  let fa = options.fa ?? f(a)
  let fb = options.fb ?? f(b)
  if (fa === 0) return a
  if (fb === 0) return b
  if (!Number.isFinite(fa) || !Number.isFinite(fb)) throw new EngineLimitError(`a root search met a non-finite value on [${a}, ${b}]`)
  if (!opposite(fa, fb)) throw new RangeError(`brent: no sign change on [${a}, ${b}] (f = ${fa}, ${fb})`)
  let c = a
  let fc = fa
  let d = b - a
  let e = d
  for (let i = 0; i < maxIterations; i++) {
    if (same(fb, fc)) {
      c = a
      fc = fa
      d = b - a
      e = d
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      // Swap so that b is the better estimate (Brent's bookkeeping: a keeps the old b).
      a = b
      b = c
      c = a
      fa = fb
      fb = fc
      fc = fa
    }
    const tol = 2 * EPS * Math.abs(b) + 0.5 * (xtol + rtol * Math.abs(b))
    const mid = 0.5 * (c - b)
    if (Math.abs(mid) <= tol || fb === 0) return b
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa
      let p: number
      let q: number
      if (a === c) {
        p = 2 * mid * s
        q = 1 - s
      } else {
        const qa = fa / fc
        const r = fb / fc
        p = s * (2 * mid * qa * (qa - r) - (b - a) * (r - 1))
        q = (qa - 1) * (r - 1) * (s - 1)
      }
      if (p > 0) q = -q
      else p = -p
      if (2 * p < Math.min(3 * mid * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d
        d = p / q
      } else {
        d = mid
        e = d
      }
    } else {
      d = mid
      e = d
    }
    a = b
    fa = fb
    b += Math.abs(d) > tol ? d : mid > 0 ? tol : -tol
    fb = f(b)
    if (!Number.isFinite(fb)) throw new EngineLimitError(`a root search met a non-finite value at ${b}`)
  }
  throw new EngineLimitError(`a root search did not converge in ${maxIterations} iterations near ${b}`)
}
