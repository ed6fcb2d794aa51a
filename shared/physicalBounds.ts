import { z } from 'zod'

/**
 * The physical ranges every computed input must lie in, in one place: the plan,
 * material and quenchant schemas (API and editor) and the engine's case format
 * (command line) all read them, so both edges refuse the same inputs with the same
 * words. Inside them the engine's scaled problem stays finite and every case ends in
 * seconds; outside them it could underflow (a 1e-300 m plate has a time scale of
 * zero) or need more modes than any budget allows. Each range says where it comes from.
 */
export interface PhysicalRange {
  min: number
  max: number
  /** The ends as a shop would write them ("0.1 mm", "5 m"). */
  minText: string
  maxText: string
  /** What a value in range is, said after the bounds. */
  what: string
}

/** "must be between 0.1 mm and 5 m (a part's thickness or diameter)". */
export function rangeMessage(range: PhysicalRange): string {
  return `must be between ${range.minText} and ${range.maxText} (${range.what})`
}

export const PHYSICAL = {
  /** A plan's part dimension. Common practice: foil-thin shims to the largest pit-furnace loads (from memory). */
  partSize_m: { min: 1e-4, max: 5, minText: '0.1 mm', maxText: '5 m', what: 'a part’s thickness, diameter, length or side' },
  /** The engine's length: half a part's thickness or its radius, or a slab's full thickness when x = 0 is a face. */
  engineSize_m: { min: 5e-5, max: 5, minText: '0.05 mm', maxText: '5 m', what: 'a half-thickness or radius, or the full thickness of a slab with a face at x = 0' },
  /** From memory: scale and ceramic coatings near 1 W/m·K, steels 15–60, silver 429, the best metallic conductor. */
  conductivity_W_mK: { min: 0.1, max: 500, minText: '0.1 W/m·K', maxText: '500 W/m·K', what: 'from insulating coatings to silver and copper' },
  /** From memory: lithium 534 kg/m³ is the lightest metal, osmium 22 590 the densest. */
  density_kg_m3: { min: 500, max: 25000, minText: '500 kg/m³', maxText: '25 000 kg/m³', what: 'from the lightest to the densest metals' },
  /** From memory: lead, gold and tungsten near 130 J/kg·K; no metal near 5000. */
  specificHeat_J_kgK: { min: 100, max: 5000, minText: '100 J/kg·K', maxText: '5000 J/kg·K', what: 'a metal or alloy' },
  /** The products of the density and specific-heat ends (solids sit near 1–4.5 MJ/m³·K, from memory). */
  volumetricHeatCapacity_J_m3K: { min: 5e4, max: 1.25e8, minText: '5e4 J/m³·K', maxText: '1.25e8 J/m³·K', what: 'density times specific heat of a metal' },
  /**
   * Incropera et al. Table 1.1: free convection of gases 2–25 W/m²·K; a vigorous
   * spray quench a few 10⁴ (common practice, from memory). 1 leaves room for a vacuum furnace.
   */
  heatTransfer_W_m2K: { min: 1, max: 100000, minText: '1 W/m²·K', maxText: '100 000 W/m²·K', what: 'from still gas to the fiercest spray quench' },
  /** Common practice: cryogenic treatment in liquid nitrogen (−196 °C) to above the melting range of steels. */
  temperature_C: { min: -200, max: 1600, minText: '−200 °C', maxText: '1600 °C', what: 'cryogenic treatment to above the melting range of steels' },
  /** A stage a shop can time, up to a month-long slow cool (common practice). */
  stageDuration_s: { min: 0.1, max: 30 * 86400, minText: '0.1 s', maxText: '30 days', what: 'a stage a shop can time' },
  /** Reading times: from the start to a year. */
  readingTime_s: { min: 0, max: 365 * 86400, minText: '0 s', maxText: '365 days', what: 'a time after the start of the first stage' },
} as const satisfies Record<string, PhysicalRange>

/**
 * Counts and ratios that keep a case small enough to solve in seconds. Common practice:
 * a layered or case-hardened section needs a handful of points and a shop schedule a few
 * stages; a coating on copper differs by ~1000× in conductivity (from memory), so larger
 * jumps between neighbouring points describe no real part.
 */
export const CASE_LIMITS = {
  stages: 6,
  profilePoints: 64,
  /** Largest k ratio between neighbouring profile points. */
  conductivityJump: 1000,
  /** Distinct x of a profile closer than this are a jump written badly, not a layer. */
  profileSpacing: 1e-4,
  /** Points read in a command-line case's table. */
  readingPoints: 200,
  /** Times read: a probe log replayed at 10 Hz for a quarter of an hour (server/measurements). */
  readingTimes: 10000,
} as const

/**
 * A number in a physical range; `label` starts the message ("Thickness must be between …").
 * Anything else, text or a non-finite number (JSON's 1e400 parses to Infinity), gets the same message.
 */
export function inRange(range: PhysicalRange, label?: string) {
  const message = label ? `${label} ${rangeMessage(range)}` : rangeMessage(range)
  return z.number({ message }).min(range.min, message).max(range.max, message)
}

/**
 * Issues of a property profile beyond its order: neighbouring conductivities within
 * CASE_LIMITS.conductivityJump of each other and distinct x at least profileSpacing apart.
 * Each issue names the later point of the pair.
 */
export function profileLimitIssues(points: readonly { x: number; k: number }[]): { index: number; key: 'k' | 'x'; message: string }[] {
  const issues: { index: number; key: 'k' | 'x'; message: string }[] = []
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!
    const b = points[i]!
    const ratio = Math.max(a.k / b.k, b.k / a.k)
    if (!(ratio <= CASE_LIMITS.conductivityJump))
      issues.push({ index: i, key: 'k', message: `differs from the previous point’s conductivity by more than ${CASE_LIMITS.conductivityJump}× (no real layer does)` })
    if (b.x !== a.x && Math.abs(b.x - a.x) < CASE_LIMITS.profileSpacing)
      issues.push({ index: i, key: 'x', message: `must be the previous x (a jump) or at least ${CASE_LIMITS.profileSpacing} from it` })
  }
  return issues
}
