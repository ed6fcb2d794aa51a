import { describe, expect, it } from 'vitest'
import { resolvedPlanSchema, type ResolvedPlan } from '../../shared/schemas/plan'
import { computePlan } from '../../server/planning/computePlan'
import { CRACKING_RULE, crackingWarning, handlingAtMediumWarning } from '../../server/planning/warnings'
import { warningText, type PlanWarning } from '../../shared/planWarnings'

const inC = (w: PlanWarning | null) => (w ? warningText(w, (c) => `${Math.round(c * 10) / 10} °C`, (k) => `${Math.round(k)} K`) : null)

const library: ResolvedPlan['library'] = {
  material: { id: 1, name: 'Medium-carbon steel', k_W_mK: 40, density_kg_m3: 7850, specificHeat_J_kgK: 475, gradedProfile: null, source: 'test' },
  quenchants: [
    { id: 1, name: 'Oil', kind: 'oil', hLow_W_m2K: 500, hTypical_W_m2K: 800, hHigh_W_m2K: 1200, bath_C: 60, source: 'test' },
    { id: 2, name: 'Still air', kind: 'still-air', hLow_W_m2K: 10, hTypical_W_m2K: 15, hHigh_W_m2K: 25, bath_C: 25, source: 'test' },
    { id: 3, name: 'Agitated water', kind: 'water', hLow_W_m2K: 2500, hTypical_W_m2K: 3000, hHigh_W_m2K: 3500, bath_C: 20, source: 'test' },
  ],
}
const plan = (over: Record<string, unknown>) =>
  resolvedPlanSchema.parse({ name: 'Warned', part: { shape: 'round-bar', diameter_m: 0.04 }, materialId: 1, start_C: 850, stages: [{ quenchantId: 1 }], handling: { below_C: 100 }, ...over, library })

describe('handling at or below the last medium', () => {
  it('names both temperatures and the medium, and says the time is set by a stage ending', () => {
    expect(inC(handlingAtMediumWarning(25, { name: 'Still air', bath_C: 25 }))).toBe(
      'The handling temperature 25 °C is at or below the temperature of the last medium (Still air, 25 °C): the part cannot get there in it, so the time shown is set by when an earlier stage ends, not by cooling. Raise the handling temperature or change the last medium.',
    )
    expect(handlingAtMediumWarning(25.5, { name: 'Still air', bath_C: 25 })).toBeNull()
  })

  it('a plan that reaches 22 °C only in 20 °C water before 25 °C air is warned, and its time falls inside the water stage', () => {
    const result = computePlan(plan({ stages: [{ quenchantId: 3, duration_s: 1800 }, { quenchantId: 2 }], handling: { below_C: 22 } }))
    expect(result.warnings.map((w) => w.kind)).toContain('handling-at-medium')
    expect(result.quenchToHandling_s).toBeLessThanOrEqual(1800)
  })

  it('an ordinary oil-then-air plan carries no such warning', () => {
    const result = computePlan(plan({ stages: [{ quenchantId: 1, duration_s: 60 }, { quenchantId: 2 }] }))
    expect(result.warnings.map((w) => w.kind)).not.toContain('handling-at-medium')
  })
})

describe('cracking rule (common practice, from memory)', () => {
  const curve = (spread: number) => ({ centre_C: [850, 800, 400], surface_C: [850, 800 - spread, 380] })
  const bar = (d: number) => ({ shape: 'round-bar' as const, diameter_m: d })

  it.each([
    [40, 0.04, 360, true],
    [40, 0.04, 340, false],
    [40, 0.02, 700, false], // below the 25 mm section of the rule
    [15, 0.04, 260, true], // low conductivity: the 250 K limit
    [15, 0.04, 240, false],
  ])('room k %d W/m·K, section %d m, spread %d K → warned: %s', (k, d, spread, warned) => {
    expect(crackingWarning(curve(spread), bar(d), k) !== null).toBe(warned)
  })

  it('states the spread, the limit, the class and its status', () => {
    expect(inC(crackingWarning(curve(520), bar(0.04), 40))).toMatch(
      /^Cracking likely: the surface runs up to 520 K colder than the centre, above the 350 K a carbon or low-alloy section of 40 mm tolerates by the usual rule of thumb \(common practice, from memory, not a specification\)/,
    )
    expect(CRACKING_RULE.minimumSection_m).toBe(0.025)
  })

  // A water quench builds a far steeper gradient than oil in the same 60 mm bar.
  it('a 60 mm carbon-steel bar is warned in water, not in oil', () => {
    const inWater = computePlan(plan({ part: bar(0.06), stages: [{ quenchantId: 3 }], handling: { below_C: 100 } }))
    const inOil = computePlan(plan({ part: bar(0.06), stages: [{ quenchantId: 1 }], handling: { below_C: 100 } }))
    expect(inWater.warnings.map((w) => w.kind)).toContain('cracking-risk')
    expect(inOil.warnings.map((w) => w.kind)).not.toContain('cracking-risk')
  }, 30_000)
})

describe('warning text in the user’s unit', () => {
  it('writes temperatures in °F when the user chose °F (°F = °C × 9/5 + 32)', () => {
    const w = handlingAtMediumWarning(20, { name: 'Water', bath_C: 20 })!
    expect(warningText(w, (c) => `${(c * 9) / 5 + 32} °F`, (k) => `${(k * 9) / 5} °F`)).toContain('68 °F')
  })
})
