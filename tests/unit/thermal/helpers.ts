import type { Boundary, CooldownProblem, Geometry, PropertyPoint, Stage } from '../../../server/thermal/types'

/** A uniform body from k, ρc. */
export function uniformProblem(
  geometry: Geometry,
  length_m: number,
  k: number,
  rhoCp: number,
  initial: CooldownProblem['initial'],
  stages: { outer: Stage['outer']; inner?: Boundary; duration_s?: number }[],
): CooldownProblem {
  return {
    domain: { geometry, length_m, properties: [0, 1].map((x) => ({ x, k_W_mK: k, rhoCp_J_m3K: rhoCp })) },
    initial,
    stages: stages.map((s) => ({ inner: s.inner ?? { type: 'symmetry' }, outer: s.outer, ...(s.duration_s ? { duration_s: s.duration_s } : {}) })),
  }
}

export const convective = (h_W_m2K: number, ambient_C: number) => ({ type: 'convective' as const, h_W_m2K, ambient_C })
export const fixed = (T_C: number) => ({ type: 'fixed' as const, T_C })

/** A case-hardened rod: a graded core, and a jump in k and ρc at x = 0.85 into the case. */
export const casedRod: PropertyPoint[] = [
  { x: 0, k_W_mK: 28, rhoCp_J_m3K: 3.7e6 },
  { x: 0.85, k_W_mK: 40, rhoCp_J_m3K: 3.8e6 },
  { x: 0.85, k_W_mK: 18, rhoCp_J_m3K: 4.1e6 },
  { x: 1, k_W_mK: 20, rhoCp_J_m3K: 4.1e6 },
]
