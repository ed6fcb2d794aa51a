/**
 * The eigenmodes of one stage, computed on demand: closed forms for uniform
 * properties where they exist (eigenRoots.ts), shooting otherwise (shooting.ts).
 * Uniform rods and spheres always have a symmetric centre, and every uniform slab
 * — symmetric, one fixed or convective inner face, or two different faces — has
 * the closed form cos(λx − atan(Bi₀/λ)), so shooting is only used for graded bodies.
 */
import type { Deadline } from './deadline'
import { rodRoot, slabRoot, sphereRoot, surfaceValues, uniformShape, type SurfaceValues } from './eigenRoots'
import type { ScaledDomain } from './properties'
import { FINE_SHOOTING, shootingModes, type ShootingAccuracy } from './shooting'
import type { Geometry } from './types'

export interface Mode {
  /** Dimensionless decay rate μ̂ (μ = μ̂ / timeScale_s). */
  rate: number
  shape: (x: number) => number
  /** Symmetric uniform modes only: root and surface values for closed-form integrals. */
  surface?: SurfaceValues
}

export interface ModeFamily {
  analytic: boolean
  /** n-th mode, n ≥ 1 (n − 1 interior zeros); a graded family checks the caller's deadline between shots. */
  mode: (n: number, deadline?: Deadline) => Mode
}

/**
 * Modes of recent uniform families, shared between solves: runCase solves a case
 * twice (a cheap pass, then one accurate from the first curve sample) and the
 * planner re-solves on every edit, mostly with the same Biot numbers. The modes
 * depend on nothing else, so a hit is exact.
 */
const uniformModes = new Map<string, Mode[]>()
const UNIFORM_CACHE_SIZE = 64

/**
 * Shot modes of recent graded families, shared the same way. Each shot mode costs
 * a few integrations (tens of microseconds each), and one plan solves the same
 * families several times: runCase's two passes, the plan's headline and detailed
 * runs, every re-solve after an edit of anything but the size, material or
 * coefficients. The families are extended lazily, so a later solve that needs
 * more modes adds to the same list. A hit is exact: the modes depend on nothing
 * else than the key (scaled properties, Biot numbers, shooting accuracy).
 */
const gradedModes = new Map<string, (n: number, deadline?: Deadline) => Mode>()
const GRADED_CACHE_SIZE = 32

/**
 * The graded cache key: every number the modes depend on, bit for bit (their bytes as
 * latin1 text); formatting them as decimals cost more than the rest of a cached re-solve.
 */
function gradedKey(domain: ScaledDomain, innerBiot: number, outerBiot: number, shooting: ShootingAccuracy): string {
  const length = 6 + 6 * domain.pieces.length
  // One scratch array, grown when needed: allocating a typed array per call cost more than the rest.
  if (keyScratch.length < length) keyScratch = new Float64Array(2 * length)
  const v = keyScratch
  v[0] = domain.m
  v[1] = innerBiot
  v[2] = outerBiot
  v[3] = shooting.rateRtol
  v[4] = shooting.fine.rtol
  v[5] = shooting.fine.atol
  let i = 6
  for (const p of domain.pieces) {
    v[i++] = p.x0
    v[i++] = p.x1
    v[i++] = p.k0
    v[i++] = p.k1
    v[i++] = p.c0
    v[i++] = p.c1
  }
  return Buffer.from(v.buffer, 0, 8 * length).toString('latin1')
}
let keyScratch = new Float64Array(64)

export function modeFamily(
  geometry: Geometry,
  domain: ScaledDomain,
  innerBiot: number,
  outerBiot: number,
  shooting: ShootingAccuracy = FINE_SHOOTING,
): ModeFamily {
  if (domain.uniform) {
    const root =
      geometry === 'slab'
        ? (n: number) => slabRoot(n, innerBiot, outerBiot)
        : geometry === 'rod'
          ? (n: number) => rodRoot(n, outerBiot)
          : (n: number) => sphereRoot(n, outerBiot)
    const key = `${geometry} ${innerBiot} ${outerBiot}`
    let cache = uniformModes.get(key)
    if (!cache) {
      cache = []
      uniformModes.set(key, cache)
      if (uniformModes.size > UNIFORM_CACHE_SIZE) uniformModes.delete(uniformModes.keys().next().value as string)
    }
    const modes = cache
    return {
      analytic: true,
      mode: (n) => {
        while (modes.length < n) {
          const lam = root(modes.length + 1)
          const mode: Mode = { rate: lam * lam, shape: uniformShape(geometry, lam, innerBiot) }
          if (innerBiot === 0) mode.surface = surfaceValues(geometry, lam)
          modes.push(mode)
        }
        return modes[n - 1]
      },
    }
  }
  const key = gradedKey(domain, innerBiot, outerBiot, shooting)
  let mode = gradedModes.get(key)
  if (!mode) {
    // First in, first out, as for the uniform families.
    if (gradedModes.size >= GRADED_CACHE_SIZE) gradedModes.delete(gradedModes.keys().next().value as string)
    mode = shootingModes({ m: domain.m, pieces: domain.pieces, innerBiot, outerBiot }, shooting)
    gradedModes.set(key, mode)
  }
  return { analytic: false, mode }
}
