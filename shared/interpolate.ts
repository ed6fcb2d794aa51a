/**
 * Piecewise-linear lookup in a table whose xs rise strictly, held constant beyond the
 * ends: the reading the issue fixes for property tables and cooling curves (and the
 * engine's, so the library's chart, the warnings and the solver agree).
 */
export function interpolate(xs: readonly number[], ys: readonly number[], x: number): number {
  const last = xs.length - 1
  if (x <= xs[0]!) return ys[0]!
  if (x >= xs[last]!) return ys[last]!
  let i = 1
  while (xs[i]! < x) i++
  const w = (x - xs[i - 1]!) / (xs[i]! - xs[i - 1]!)
  return ys[i - 1]! + w * (ys[i]! - ys[i - 1]!)
}
