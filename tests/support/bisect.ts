/**
 * A root of f in [a, b] by plain bisection, 200 halvings (past double precision for any
 * bracket the tests use). f(a) and f(b) must differ in sign.
 *
 * Reference values are computed with this rather than the engine's own root finder, so a
 * fault there cannot hide in both the engine's answer and the value it is checked against.
 */
export function bisect(f: (x: number) => number, a: number, b: number): number {
  let fa = f(a)
  for (let i = 0; i < 200; i++) {
    const c = 0.5 * (a + b)
    const fc = f(c)
    if (Math.sign(fc) === Math.sign(fa)) {
      a = c
      fa = fc
    } else b = c
  }
  return 0.5 * (a + b)
}
