/**
 * Weighted integrals of modes that do not depend on any start temperature, with the
 * weight w = c(x) x^m of the eigenproblem:
 *     mass ∫ w f,   norm ∫ w f²,   overlap ∫ w f g (f of one stage, g of the next),
 * and peak max|f| (over the quadrature nodes and the surface) for the truncation bound.
 *
 * With a uniform steady state (a symmetric centre) every coefficient is a combination
 * of them: from a uniform start a_n = (T₀ − T_ss) mass_n / norm_n, from a previous
 * stage T_prev,ss + Σ A_i g_i the same plus Σ A_i overlap_in / norm_n. Each is computed
 * once per mode or pair and kept with the Mode objects (WeakMaps), which the mode cache
 * of modeFamily.ts shares between solves, so re-planning a graded part with a new start
 * temperature, new stage durations or a new target computes no integral at all.
 *
 * Composite 8-point Gauss–Legendre, split at every property breakpoint, panels no wider
 * than min(1/16, 1.5/λ) for the fastest mode involved (λ² = μ max c/k), as the
 * quadrature projection in series.ts uses (properties.ts weightedRule); one rule per panel count and body.
 */
import type { Mode } from './modeFamily'
import { maxCapacityRatio, weightedRule, type ScaledDomain } from './properties'
import type { QuadratureRule } from './quadrature'

export interface ModeIntegrals {
  mass: number
  norm: number
  peak: number
}

const integrals = new WeakMap<Mode, ModeIntegrals>()
const overlaps = new WeakMap<Mode, Map<Mode, number>>()

const rules = new WeakMap<ScaledDomain, Map<number, QuadratureRule>>()

/**
 * A rule on the body that resolves modes up to this dimensionless rate: panels no
 * wider than min(1/16, 1.5/λ), their count per unit length rounded up to a multiple
 * of 8 so that neighbouring modes and pairs share one rule.
 */
function ruleFor(domain: ScaledDomain, rate: number): QuadratureRule {
  const panels = 8 * Math.ceil(Math.max(16, Math.sqrt(rate * maxCapacityRatio(domain.pieces)) / 1.5) / 8)
  let byPanels = rules.get(domain)
  if (!byPanels) rules.set(domain, (byPanels = new Map()))
  let rule = byPanels.get(panels)
  if (!rule) {
    rule = weightedRule(domain, 1 / panels)
    byPanels.set(panels, rule)
  }
  return rule
}

export function modeIntegrals(domain: ScaledDomain, mode: Mode): ModeIntegrals {
  const hit = integrals.get(mode)
  if (hit) return hit
  const rule = ruleFor(domain, mode.rate)
  let mass = 0
  let norm = 0
  let peak = Math.abs(mode.shape(1))
  for (let i = 0; i < rule.x.length; i++) {
    const f = mode.shape(rule.x[i])
    mass += rule.w[i] * f
    norm += rule.w[i] * f * f
    peak = Math.max(peak, Math.abs(f))
  }
  const result = { mass, norm, peak }
  integrals.set(mode, result)
  return result
}

/** ∫ w f g over the body. */
export function modeOverlap(domain: ScaledDomain, f: Mode, g: Mode): number {
  let row = overlaps.get(f)
  if (!row) overlaps.set(f, (row = new Map()))
  const hit = row.get(g)
  if (hit !== undefined) return hit
  const rule = ruleFor(domain, Math.max(f.rate, g.rate))
  let sum = 0
  for (let i = 0; i < rule.x.length; i++) sum += rule.w[i] * f.shape(rule.x[i]) * g.shape(rule.x[i])
  row.set(g, sum)
  return sum
}

/** ∫ w over the body (the scaled heat capacity), the denominator of the mean: on a piece c = α + βx, so ∫ x^m c = α Δx^{m+1}/(m+1) + β Δx^{m+2}/(m+2). */
export function heatCapacity(domain: ScaledDomain): number {
  const m = domain.m
  let sum = 0
  for (const { x0, x1, c0, c1 } of domain.pieces) {
    const beta = (c1 - c0) / (x1 - x0)
    const alpha = c0 - beta * x0
    sum += (alpha * (x1 ** (m + 1) - x0 ** (m + 1))) / (m + 1) + (beta * (x1 ** (m + 2) - x0 ** (m + 2))) / (m + 2)
  }
  return sum
}
