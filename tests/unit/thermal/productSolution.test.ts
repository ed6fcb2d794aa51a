import { describe, expect, it } from 'vitest'
import bessel from 'bessel'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { runProduct, type ProductDirection, type ProductInput } from '../../../server/thermal/productSolution'
import { bisect } from '../../support/bisect'
import { centreFraction1D, referenceCentre_C, referenceTimeToCentre_s } from '../../support/productReference'

// Reference values come from tests/support/productReference.ts (closed-form series with
// their own bisection roots), not through the engine's eigenvalue code.

const J = (x: number, n: number) => bessel.besselj(x, n)

const K = 40
const RHO = 7850
const CP = 475
const ALPHA = K / (RHO * CP)
const START_C = 850
const BATH_C = 40

const slab = (size_m: number, label = 'side'): ProductDirection => ({ label, geometry: 'slab', size_m })
const rod = (size_m: number): ProductDirection => ({ label: 'diameter', geometry: 'rod', size_m })

/** One stage into the bath; the target (5 % of the drop left) only sets how far the run goes. */
function steelInput(directions: ProductDirection[], h_W_m2K: number, material = { k: K, rho: RHO, cp: CP }, start_C = START_C, bath_C = BATH_C): ProductInput {
  return {
    body: { directions },
    material,
    initial_C: start_C,
    stages: [{ h_W_m2K, ambient_C: bath_C }],
    target: { at: 'centre', below_C: bath_C + 0.05 * (start_C - bath_C) },
  }
}

const referenceOf = (input: ProductInput) => ({
  directions: input.body.directions,
  k_W_mK: input.material.k,
  rhoCp_J_m3K: input.material.rho * input.material.cp,
  h_W_m2K: input.stages[0]!.h_W_m2K,
  initial_C: input.initial_C,
  ambient_C: input.stages[0]!.ambient_C,
})

/** The engine's centre at each time (the profile's x = 0) and its truncation bound for the stage. */
function centres(input: ProductInput, times_s: number[]) {
  const run = runProduct(input, { times_s })
  return { centre_C: run.profiles.T_C.map((profile) => profile[0]!), bound_K: run.stages[0]!.truncationError_K }
}

describe('product solution of short cylinders and blocks', () => {
  it.each([
    [200, 0.03],
    [1500, 0.03],
    [5000, 0.015],
  ])('a body with only a rod direction (h = %d W/m²K, R = %d m) cools like the 1-D rod from the finite-volume solver, within 0.05 K', (h, R) => {
    const times = [5, 20, 60, 200]
    const cn = solveCrankNicolson(
      {
        domain: {
          geometry: 'rod',
          length_m: R,
          properties: [
            { x: 0, k_W_mK: K, rhoCp_J_m3K: RHO * CP },
            { x: 1, k_W_mK: K, rhoCp_J_m3K: RHO * CP },
          ],
        },
        initial: START_C,
        stages: [{ outer: { type: 'convective', h_W_m2K: h, ambient_C: BATH_C }, inner: { type: 'symmetry' } }],
      },
      { times_s: times, points: [0] },
    )
    const { centre_C } = centres(steelInput([rod(R)], h), times)
    times.forEach((t, i) => expect(Math.abs(centre_C[i]! - cn.T_C[i]![0]!), `t=${t}`).toBeLessThan(0.05))
  })

  it.each([
    [0.2, 0.25],
    [1, 0.1],
    [10, 0.05],
    [10, 0.6],
  ])('a cube (Bi = %d, Fo = %d) has the closed-form slab centre cubed, a square bar the slab squared, to 1e-9 of the drop', (bi, fo) => {
    const a = 0.04
    const h = (bi * K) / a
    const t = (fo * a * a) / ALPHA
    const slabFraction = centreFraction1D('slab', bi, fo)
    const cube = centres(steelInput([slab(a), slab(a), slab(a)], h), [t])
    const bar = centres(steelInput([slab(a), slab(a)], h), [t])
    const fraction = (T: number) => (T - BATH_C) / (START_C - BATH_C)
    // The reported truncation bound (~0.01 K) is a worst case at the earliest time; the terms actually left out are far smaller.
    expect(cube.bound_K).toBeLessThan(0.03)
    expect(fraction(cube.centre_C[0]!)).toBeCloseTo(slabFraction ** 3, 9)
    expect(fraction(bar.centre_C[0]!)).toBeCloseTo(slabFraction ** 2, 9)
  })

  it('short brass cylinder, D = 10 cm, H = 12 cm, 120 °C into 25 °C air at h = 60: centre ≈ 62.8 °C after 15 min (Çengel, Heat and Mass Transfer, worked example, quoted from memory; ±0.5 K for one-term table precision)', () => {
    const alpha = 3.39e-5
    const k = 110
    // Brass ρ ≈ 8530 kg/m³ (from memory); c_p follows from the example's k and α (≈ 380 J/kg·K).
    const rho = 8530
    const input = steelInput([rod(0.05), slab(0.06, 'length')], 60, { k, rho, cp: k / alpha / rho }, 120, 25)
    const T = centres(input, [15 * 60]).centre_C[0]!
    expect(Math.abs(T - 62.8)).toBeLessThan(0.5)
    // and the time to that temperature lands back on 15 min
    expect(runProduct({ ...input, target: { at: 'centre', below_C: T } }).targetTime_s).toBeCloseTo(900, 6)
  })

  // One-term forms (Incropera, Fundamentals of Heat and Mass Transfer, eqs. 5.40, 5.52):
  // slab C1 = 4 sin λ1/(2λ1 + sin 2λ1), rod C1 = 2J1(λ1)/(λ1(J0² + J1²)).
  // The dropped terms are bounded by 1.3·e^{−(λ2²−λ1²)Fo} per direction.
  it.each([
    [300, 0.25],
    [300, 1],
    [3000, 0.4],
  ])('steel disc R = 30 mm, half-length 25 mm, h = %d: centre equals the product of one-term values at Fo_R = %d', (h, foR) => {
    const R = 0.03
    const Lh = 0.025 // shorter than R, so Fo_L > Fo_R > 0.2
    const t = (foR * R * R) / ALPHA
    const biR = (h * R) / K
    const biL = (h * Lh) / K
    const lr = bisect((l) => l * J(l, 1) - biR * J(l, 0), 1e-12, 2.404825557695773)
    const lr2 = bisect((l) => l * J(l, 1) - biR * J(l, 0), 3.8317059702075125, 5.520078110286311)
    const ls = bisect((l) => l * Math.sin(l) - biL * Math.cos(l), 1e-12, 0.5 * Math.PI)
    const ls2 = bisect((l) => l * Math.sin(l) - biL * Math.cos(l), Math.PI, 1.5 * Math.PI)
    const foL = (ALPHA * t) / (Lh * Lh)
    const rodTerm = ((2 * J(lr, 1)) / (lr * (J(lr, 0) ** 2 + J(lr, 1) ** 2))) * Math.exp(-lr * lr * foR)
    const slabTerm = ((4 * Math.sin(ls)) / (2 * ls + Math.sin(2 * ls))) * Math.exp(-ls * ls * foL)
    const tol = 1.3 * (Math.exp(-(lr2 ** 2 - lr ** 2) * foR) + Math.exp(-(ls2 ** 2 - ls ** 2) * foL)) + 1e-9
    const { centre_C, bound_K } = centres(steelInput([rod(R), slab(Lh, 'length')], h), [t])
    const fraction = (centre_C[0]! - BATH_C) / (START_C - BATH_C)
    expect(foL).toBeGreaterThan(0.2)
    expect(Math.abs(fraction - rodTerm * slabTerm)).toBeLessThan(tol + bound_K / (START_C - BATH_C))
  })

  it('the time to a centre temperature, put into the closed form, gives that temperature back for a bar section and a block', () => {
    const bar = [slab(0.025), slab(0.04)]
    const block = [slab(0.025), slab(0.04), slab(0.1)]
    const timeTo = (directions: ProductDirection[], below_C: number) =>
      runProduct({ ...steelInput(directions, 800), target: { at: 'centre', below_C } })
    for (const directions of [bar, block]) {
      const reference = referenceOf(steelInput(directions, 800))
      for (const target of [700, 400, 100, 45]) {
        const run = timeTo(directions, target)
        expect(referenceCentre_C(reference, run.targetTime_s), `${directions.length} directions, ${target} °C`).toBeCloseTo(target, 7)
      }
      expect(timeTo(directions, 100).targetTime_s / referenceTimeToCentre_s(reference, 100) - 1).toBeCloseTo(0, 8)
    }
    // the block, cooled on more faces, gets there first
    expect(timeTo(block, 100).targetTime_s).toBeLessThan(timeTo(bar, 100).targetTime_s)
  })

  const cylinder = steelInput([rod(0.03), slab(0.05, 'length')], 500)
  it.each([
    ['stages', { ...cylinder, stages: [{ h_W_m2K: 500, ambient_C: 40, duration_s: 60 }, { h_W_m2K: 15, ambient_C: 25 }] }],
    ['material.k', { ...cylinder, material: { k: 0, rho: RHO, cp: CP } }],
    ['target.below_C', { ...cylinder, target: { at: 'centre' as const, below_C: 30 } }], // below the 40 °C bath
    ['part', steelInput([slab(0.02), slab(2.5, 'side 2'), slab(2.5, 'side 3')], 800)], // the long sides never reach the centre
  ])('refuses an input it cannot compute, naming %s', (field, input) => {
    expect(() => runProduct(input)).toThrow(expect.objectContaining({ field }))
  })
})
