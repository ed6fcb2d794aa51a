import { describe, expect, it } from 'vitest'
import bessel from 'bessel'
import { solveCrankNicolson } from '../../../server/thermal/crankNicolson'
import { checkProduct, runProduct, type ProductDirection, type ProductInput } from '../../../server/thermal/productSolution'
import { pointValue } from '../../../shared/pointSeries'
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

  it('a short cylinder charged at 20 °C into a furnace at 860 °C heats as the closed form says (the heating term carries its sign in its weight)', () => {
    const input: ProductInput = { ...steelInput([rod(0.06), slab(0.02, 'length')], 150, undefined, 20, 860), target: { at: 'centre', above_C: 850 } }
    const run = runProduct(input)
    expect(referenceCentre_C(referenceOf(input), run.targetTime_s)).toBeCloseTo(850, 6)
    expect(checkProduct(input, [60, 600, run.targetTime_s])).toBeLessThan(0.2)
  })

  const cylinder = steelInput([rod(0.03), slab(0.05, 'length')], 500)
  it.each([
    ['material.k', { ...cylinder, material: { k: 0, rho: RHO, cp: CP } }],
    ['target.below_C', { ...cylinder, target: { at: 'centre' as const, below_C: 30 } }], // below the 40 °C bath
    ['part', steelInput([slab(0.02), slab(2.5, 'side 2'), slab(2.5, 'side 3')], 800)], // the long sides never reach the centre
  ])('refuses an input it cannot compute, naming %s', (field, input) => {
    expect(() => runProduct(input)).toThrow(expect.objectContaining({ field }))
  })
})

describe('product solution with a different surrounding temperature per stage (superposition, one term per change)', () => {
  const oilThenAir = [
    { h_W_m2K: 1500, ambient_C: 60, duration_s: 40 },
    { h_W_m2K: 15, ambient_C: 25 },
  ]

  // A rod direction alone is the 1-D rod: compared with the finite-volume solver run straight through both stages.
  it('a body with only a rod direction, oil at 60 °C then air at 25 °C, follows the 1-D Crank–Nicolson rod within 0.05 K', () => {
    const R = 0.02
    const times = [10, 40, 41, 120, 600, 1500]
    const cn = solveCrankNicolson(
      {
        domain: { geometry: 'rod', length_m: R, properties: [{ x: 0, k_W_mK: K, rhoCp_J_m3K: RHO * CP }, { x: 1, k_W_mK: K, rhoCp_J_m3K: RHO * CP }] },
        initial: START_C,
        stages: oilThenAir.map((s) => ({ outer: { type: 'convective' as const, h_W_m2K: s.h_W_m2K, ambient_C: s.ambient_C }, inner: { type: 'symmetry' as const }, ...(s.duration_s ? { duration_s: s.duration_s } : {}) })),
      },
      { times_s: times, points: [0] },
    )
    const input: ProductInput = { body: { directions: [rod(R)] }, material: { k: K, rho: RHO, cp: CP }, initial_C: START_C, stages: oilThenAir, target: { at: 'centre', below_C: 100 } }
    const run = runProduct(input, { times_s: times })
    times.forEach((t, i) => expect(Math.abs(run.profiles.T_C[i]![0]! - cn.T_C[i]![0]!), `t=${t}`).toBeLessThan(0.05))
  })

  // Bi = h L / k = 5e-4: the body is lumped, T − a(t) decays as e^{−t/τ} per stage with τ = ρ c_p L / (3 h) for a cube of
  // half-side L (V/A = L/3). Closed form (Incropera et al. §5.1, lumped capacitance), applied stage after stage; its own
  // error, about Bi/3 of the excess per time constant, stays under 0.1 K here.
  it('a near-lumped cube through two stages with different surroundings matches the lumped closed form to 0.1 K', () => {
    const L = 0.01
    const material = { k: 400, rho: 8900, cp: 385 }
    const stages = [
      { h_W_m2K: 20, ambient_C: 200, duration_s: 600 },
      { h_W_m2K: 10, ambient_C: 20 },
    ]
    const tau = (h: number) => (material.rho * material.cp * L) / (3 * h)
    const atSwitch = 200 + (800 - 200) * Math.exp(-600 / tau(20))
    const lumped = (t: number) => (t <= 600 ? 200 + (800 - 200) * Math.exp(-t / tau(20)) : 20 + (atSwitch - 20) * Math.exp(-(t - 600) / tau(10)))
    const input: ProductInput = { body: { directions: [slab(L), slab(L, 'side 2'), slab(L, 'side 3')] }, material, initial_C: 800, stages, target: { at: 'mean', below_C: 100 } }
    const run = runProduct(input)
    for (const t of [300, 600, 900, 1500, 2800]) {
      const i = run.curve.t_s.findIndex((s) => s >= t)
      expect(Math.abs(run.curve.mean_C[i]! - lumped(run.curve.t_s[i]!)), `t=${t}`).toBeLessThan(0.1)
    }
    expect(lumped(run.targetTime_s)).toBeCloseTo(100, 1)
  })

  it('the shipped series and the Crank–Nicolson check agree with the curve for a short cylinder, oil then air', () => {
    const input: ProductInput = { body: { directions: [rod(0.03), slab(0.03, 'length')] }, material: { k: K, rho: RHO, cp: CP }, initial_C: START_C, stages: oilThenAir, target: { at: 'centre', below_C: 100 } }
    const run = runProduct(input)
    run.curve.t_s.forEach((t, i) => {
      if (t > 1 && i % 50 === 0) expect(Math.abs(pointValue(run.series, t) - run.curve.centre_C[i]!), `t=${t}`).toBeLessThan(0.1)
    })
    expect(pointValue(run.series, run.targetTime_s)).toBeCloseTo(100, 1)
    expect(checkProduct(input, [20, 40, 60, 300, run.targetTime_s])).toBeLessThan(0.2)
  }, 60_000)
})
