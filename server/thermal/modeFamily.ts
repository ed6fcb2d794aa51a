/**
 * The eigenmodes of one stage, computed on demand: closed forms for uniform
 * properties where they exist (eigenRoots.ts), shooting otherwise (shooting.ts).
 * Uniform rods and spheres always have a symmetric centre, and every uniform slab
 * — symmetric, one fixed or convective inner face, or two different faces — has
 * the closed form cos(λx − atan(Bi₀/λ)), so shooting is only used for graded bodies.
 */
import { rodRoot, slabRoot, sphereRoot, uniformShape } from './eigenRoots'
import type { ScaledDomain } from './properties'
import { FINE_SHOOTING, shootingModes, type ShootingAccuracy } from './shooting'
import type { Geometry } from './types'

export interface Mode {
  /** Dimensionless decay rate μ̂ (μ = μ̂ / timeScale_s). */
  rate: number
  shape: (x: number) => number
}

export interface ModeFamily {
  analytic: boolean
  /** n-th mode, n ≥ 1 (n − 1 interior zeros). */
  mode: (n: number) => Mode
}

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
    const cache: Mode[] = []
    return {
      analytic: true,
      mode: (n) => {
        while (cache.length < n) {
          const lam = root(cache.length + 1)
          cache.push({ rate: lam * lam, shape: uniformShape(geometry, lam, innerBiot) })
        }
        return cache[n - 1]
      },
    }
  }
  return { analytic: false, mode: shootingModes({ m: domain.m, pieces: domain.pieces, innerBiot, outerBiot }, shooting) }
}
