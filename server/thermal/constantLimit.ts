/**
 * The constant-property limit of a problem: flat material tables and heat-transfer
 * curves, and zero emissivities, say nothing the constant-property engine cannot, so
 * such a problem is rewritten with plain k, ρc and h and takes today's path
 * unchanged (the same numbers, to the bit). Anything that really varies with
 * temperature returns null and goes to temperatureDependent.ts.
 */
import { isFlatCurve, isFlatMaterial } from './propertyTable'
import type { Boundary, CooldownProblem, Stage } from './types'

export function constantLimit(problem: CooldownProblem): CooldownProblem | null {
  const table = problem.domain.temperatureTable
  if (table && !isFlatMaterial(table)) return null
  const boundaries: Boundary[] = problem.stages.flatMap((s) => [s.outer, s.inner])
  for (const b of boundaries) {
    if (b.type !== 'convective') continue
    if ((b.emissivity ?? 0) > 0 || (b.hCurve && !isFlatCurve(b.hCurve))) return null
  }
  if (!table && boundaries.every((b) => b.type !== 'convective' || (b.hCurve === undefined && b.emissivity === undefined))) return problem
  const plain = <B extends Boundary>(b: B): B =>
    b.type === 'convective' ? { type: 'convective', h_W_m2K: b.hCurve ? b.hCurve[0].h_W_m2K : b.h_W_m2K, ambient_C: b.ambient_C } as B : b
  const { geometry, length_m } = problem.domain
  const properties = table ? [0, 1].map((x) => ({ x, k_W_mK: table[0].k_W_mK, rhoCp_J_m3K: table[0].rhoCp_J_m3K })) : problem.domain.properties
  return {
    ...problem,
    domain: { geometry, length_m, properties },
    stages: problem.stages.map((s): Stage => ({ ...s, outer: plain(s.outer), inner: plain(s.inner) })),
  }
}
