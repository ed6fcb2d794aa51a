/**
 * Part shapes to engine geometry, and the dimensionless groups shown beside results.
 * Framework-free (unit tests import it directly).
 */
import type { Part } from '../../shared/schemas/plan'
import type { ProductDirection } from '../thermal/productSolution'

/** A one-dimensional body for the series engine: half-thickness or radius. */
export interface OneDimensional {
  kind: 'series'
  geometry: 'slab' | 'rod' | 'sphere'
  size_m: number
}

/** A short cylinder or block: one 1-D factor per finite direction (product solution). */
export interface ProductBody {
  kind: 'product'
  directions: ProductDirection[]
}

export type EngineBody = OneDimensional | ProductBody

/** plate → slab of half the thickness; bar and sphere → radius (half the diameter). */
export function engineBody(part: Part): EngineBody {
  switch (part.shape) {
    case 'plate':
      return { kind: 'series', geometry: 'slab', size_m: part.thickness_m / 2 }
    case 'round-bar':
      return { kind: 'series', geometry: 'rod', size_m: part.diameter_m / 2 }
    case 'sphere':
      return { kind: 'series', geometry: 'sphere', size_m: part.diameter_m / 2 }
    case 'cylinder':
      return {
        kind: 'product',
        directions: [
          { label: 'diameter', geometry: 'rod', size_m: part.diameter_m / 2 },
          { label: 'length', geometry: 'slab', size_m: part.length_m / 2 },
        ],
      }
    case 'block':
      return {
        kind: 'product',
        directions: part.sides_m.map((side, i) => ({ label: `side ${i + 1}`, geometry: 'slab' as const, size_m: side / 2 })),
      }
  }
}

/**
 * The length L in Bi = hL/k and Fo = αt/L²: half-thickness or radius, and for a
 * product shape its smallest half-size (the direction that cools fastest).
 */
export function characteristicLength_m(part: Part): number {
  const body = engineBody(part)
  return body.kind === 'series' ? body.size_m : Math.min(...body.directions.map((d) => d.size_m))
}

/**
 * Volume over cooled surface. Plate (per unit face, both faces): t/2; long bar
 * (ends ignored): D/4; sphere: D/6; short cylinder πR²L/(2πRL + 2πR²) = RL/(2L + 2R);
 * block abc/(2(ab + bc + ca)).
 */
export function volumeToSurface_m(part: Part): number {
  switch (part.shape) {
    case 'plate':
      return part.thickness_m / 2
    case 'round-bar':
      return part.diameter_m / 4
    case 'sphere':
      return part.diameter_m / 6
    case 'cylinder': {
      const R = part.diameter_m / 2
      const L = part.length_m
      return (R * L) / (2 * L + 2 * R)
    }
    case 'block': {
      const [a, b, c] = part.sides_m
      return (a * b * c) / (2 * (a * b + b * c + c * a))
    }
  }
}

export const biot = (h_W_m2K: number, length_m: number, k_W_mK: number) => (h_W_m2K * length_m) / k_W_mK

export const fourier = (diffusivity_m2_s: number, t_s: number, length_m: number) => (diffusivity_m2_s * t_s) / (length_m * length_m)

/** Textbook rule: past Fo = 0.2 the first term of the series is within about 2 % of the full sum. */
export const ONE_TERM_MIN_FOURIER = 0.2
