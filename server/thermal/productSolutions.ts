/**
 * Centre temperature of short cylinders and rectangular bars/blocks by product
 * solutions: with uniform properties, a uniform start temperature and one
 * convective condition (h, T∞) on every face, the excess θ = T − T∞ separates,
 *
 *   θ(0,t)/θi = Π_directions  Σ_n C_n e^{−λ_n² Fo}              (Fo = αt/L²),
 *
 * one 1-D symmetric solution per direction: λ tan λ = Bi for a slab of
 * half-thickness L, λ J1(λ)/J0(λ) = Bi for a rod of radius R (Carslaw & Jaeger,
 * Conduction of Heat in Solids, §1.15 and §8.2; Incropera et al., Fundamentals of
 * Heat and Mass Transfer, §5.8). An infinite direction contributes a factor 1.
 * Eigenvalues and coefficients come from ./eigenRoots (the engine's bracketed
 * roots, Incropera Table 5.1), so this file only adds the series and the product.
 *
 * Checked in tests/unit/thermal/productSolutions.test.ts against the 1-D limits,
 * the one-term product and a textbook short-cylinder example.
 */
import { z } from 'zod'
import { symmetricRoot, uniformInitialCoefficient } from './eigenRoots'
import { brent } from './roots'

/** A positive length, or Infinity for a direction with no end. */
const halfSize = z.union([z.number().positive(), z.literal(Infinity)])

const productCoolingSchema = z.object({
  body: z.discriminatedUnion('shape', [
    z.object({ shape: z.literal('cylinder'), radius_m: halfSize, halfLength_m: halfSize }),
    z.object({ shape: z.literal('block'), halfWidths_m: z.tuple([halfSize, halfSize, halfSize]) }),
  ]),
  k_W_mK: z.number().positive(),
  rhoCp_J_m3K: z.number().positive(),
  h_W_m2K: z.number().positive(),
  initial_C: z.number(),
  ambient_C: z.number(),
})

/**
 * A short cylinder (radius, half-length) or a rectangular block given by its three
 * half-widths; a bar is a block with one half-width Infinity, a plate two.
 */
export type ProductCooling = z.infer<typeof productCoolingSchema>

/** Parse or throw a RangeError naming the first offending field. */
function validate(problem: ProductCooling): ProductCooling {
  const parsed = productCoolingSchema.safeParse(problem)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]
    throw new RangeError(`${issue.path.join('.')}: ${issue.message}`)
  }
  const p = parsed.data
  if (p.body.shape === 'cylinder' && p.body.radius_m === Infinity) {
    throw new RangeError('body.radius_m: must be finite, or the centre never cools')
  }
  if (p.body.shape === 'block' && p.body.halfWidths_m.every((s) => s === Infinity)) {
    throw new RangeError('body.halfWidths_m: at least one must be finite, or the centre never cools')
  }
  return p
}

/**
 * Below this Fo the centre of a 1-D body has not felt the surface: the deficit
 * is at most 2·erfc(1/(2√Fo)) < 1e-50 (Carslaw & Jaeger §3.3, image solution),
 * and the series would need thousands of terms.
 */
const UNDISTURBED_FO = 0.002

/**
 * Centre value Σ C_n e^{−λ_n² Fo} of the 1-D symmetric solution for a slab
 * (half-thickness) or rod (radius), uniform start, surface Biot number Bi.
 * Terms are summed until e^{−λ_n² Fo} < 1e-17, past which they cannot change the sum.
 */
export function centreFraction1D(geometry: 'slab' | 'rod', bi: number, fo: number): number {
  if (fo < UNDISTURBED_FO) return 1
  let sum = 0
  for (let n = 1; ; n++) {
    const lam = symmetricRoot(geometry, n, bi)
    const decay = Math.exp(-lam * lam * fo)
    sum += uniformInitialCoefficient(geometry, lam) * decay
    if (decay < 1e-17) return sum
  }
}

/** The 1-D factors as functions of time, one per finite direction. */
function factors(p: ProductCooling): ((t_s: number) => number)[] {
  const alpha = p.k_W_mK / p.rhoCp_J_m3K
  const directions: ['slab' | 'rod', number][] =
    p.body.shape === 'cylinder'
      ? [['rod', p.body.radius_m], ['slab', p.body.halfLength_m]]
      : p.body.halfWidths_m.map((s) => ['slab', s] as ['slab', number])
  return directions
    .filter(([, size]) => size !== Infinity)
    .map(([geometry, size]) => {
      const bi = (p.h_W_m2K * size) / p.k_W_mK
      return (t_s: number) => centreFraction1D(geometry, bi, (alpha * t_s) / (size * size))
    })
}

/** Centre temperature (°C) at time t_s after the part meets the ambient. */
export function productCentreTemperature(problem: ProductCooling, t_s: number): number {
  const p = validate(problem)
  if (!(t_s >= 0) || !Number.isFinite(t_s)) throw new RangeError('t_s: must be a time ≥ 0')
  const fraction = factors(p).reduce((acc, f) => acc * f(t_s), 1)
  return p.ambient_C + (p.initial_C - p.ambient_C) * fraction
}

/**
 * Time (s) for the centre to reach target_C. The centre excess falls
 * monotonically from θi to 0, so the root of θ(t) = θ_target is bracketed by
 * doubling from the shortest diffusion time and polished by Brent.
 */
export function productTimeToCentre(problem: ProductCooling, target_C: number): number {
  const p = validate(problem)
  const fractionTarget = (target_C - p.ambient_C) / (p.initial_C - p.ambient_C)
  if (!(fractionTarget > 0 && fractionTarget <= 1)) {
    throw new RangeError(
      `target_C: ${target_C} °C is not between the start (${p.initial_C} °C) and the ambient (${p.ambient_C} °C)`,
    )
  }
  if (fractionTarget === 1) return 0
  const fs = factors(p)
  const excess = (t_s: number) => fs.reduce((acc, f) => acc * f(t_s), 1) - fractionTarget
  const sizes = p.body.shape === 'cylinder' ? [p.body.radius_m, p.body.halfLength_m] : p.body.halfWidths_m
  const shortest = Math.min(...sizes)
  let hi = (shortest * shortest * p.rhoCp_J_m3K) / p.k_W_mK
  let fHi = excess(hi)
  while (fHi > 0) {
    hi *= 2
    fHi = excess(hi)
  }
  return brent(excess, 0, hi, { fa: 1 - fractionTarget, fb: fHi, rtol: 1e-12 })
}
