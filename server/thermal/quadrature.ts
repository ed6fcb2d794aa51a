/**
 * Composite Gauss–Legendre quadrature on [0, 1].
 *
 * Nodes are the roots of P_n found by Newton's method from the Tricomi initial
 * guess cos(π(i − ¼)/(n + ½)), weights 2 / ((1 − x²) P_n′(x)²) (Abramowitz &
 * Stegun 25.4.29). Panels are split at every breakpoint (property jumps, kinks of
 * piecewise-linear tables) so each panel integrates a smooth function.
 */

export interface QuadratureRule {
  x: Float64Array
  w: Float64Array
}

const ruleCache = new Map<number, QuadratureRule>()

/** n-point Gauss–Legendre rule on [−1, 1]. */
export function gaussLegendre(n: number): QuadratureRule {
  const cached = ruleCache.get(n)
  if (cached) return cached
  const x = new Float64Array(n)
  const w = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5))
    let dp = 0
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1
      let p1 = z
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k
        p0 = p1
        p1 = p2
      }
      dp = (n * (z * p1 - p0)) / (z * z - 1)
      const dz = p1 / dp
      z -= dz
      if (Math.abs(dz) < 1e-16) break
    }
    x[i] = -z
    w[i] = 2 / ((1 - z * z) * dp * dp)
  }
  const rule = { x, w }
  ruleCache.set(n, rule)
  return rule
}

/**
 * Composite rule on [0, 1]: panels no wider than maxWidth, split at breakpoints.
 * `weight(x)` multiplies each node's weight (here ρc·x^m).
 */
export function compositeRule(
  breakpoints: number[],
  maxWidth: number,
  weight: (x: number) => number,
  order = 8,
): QuadratureRule {
  const base = gaussLegendre(order)
  const cuts = [...new Set([0, 1, ...breakpoints.filter((b) => b > 0 && b < 1)])].sort((a, b) => a - b)
  const xs: number[] = []
  const ws: number[] = []
  for (let j = 0; j + 1 < cuts.length; j++) {
    const span = cuts[j + 1] - cuts[j]
    const panels = Math.max(1, Math.ceil(span / maxWidth))
    const width = span / panels
    for (let p = 0; p < panels; p++) {
      const mid = cuts[j] + (p + 0.5) * width
      for (let i = 0; i < order; i++) {
        const xi = mid + 0.5 * width * base.x[i]
        xs.push(xi)
        ws.push(0.5 * width * base.w[i] * weight(xi))
      }
    }
  }
  return { x: Float64Array.from(xs), w: Float64Array.from(ws) }
}
