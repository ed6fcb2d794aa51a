/**
 * The warnings of a computed plan (shared/planWarnings.ts). Pure: computePlan calls it
 * with the plan and its curve; tests call it directly.
 */
import type { Part } from '../../shared/schemas/plan'
import type { PlanWarning } from '../../shared/planWarnings'

/**
 * Quench-cracking rule of thumb (common practice, from memory; not a specification):
 * a surface-to-centre difference above the class's limit during the cooldown of a
 * section of 25 mm or more makes cracking likely. Low-conductivity steels (room k below
 * 25 W/m·K: tool, high-alloy and stainless) build the steepest gradients and are flagged
 * sooner. Holes, sharp corners and changes of section make any quench worse. With the
 * library's mean coefficients the limits part a 60 mm carbon-steel bar in water (about
 * 410 K) from the same bar in oil (about 170 K).
 */
export const CRACKING_RULE = {
  minimumSection_m: 0.025,
  lowConductivity_W_mK: 25,
  limit_K: { 'carbon or low-alloy': 350, 'high-alloy or stainless': 250 },
} as const

export type CrackingClass = keyof typeof CRACKING_RULE.limit_K

export function crackingClass(roomK_W_mK: number): CrackingClass {
  return roomK_W_mK < CRACKING_RULE.lowConductivity_W_mK ? 'high-alloy or stainless' : 'carbon or low-alloy'
}

/** The thinnest through-section: what sets how steep the gradient can get. */
export function sectionSize_m(part: Part): number {
  switch (part.shape) {
    case 'plate':
      return part.thickness_m
    case 'round-bar':
    case 'sphere':
      return part.diameter_m
    case 'cylinder':
      return Math.min(part.diameter_m, part.length_m)
    case 'block':
      return Math.min(...part.sides_m)
  }
}

/** A handling temperature at or below the last medium's: the last stage can never reach it. */
export function handlingAtMediumWarning(handling_C: number, last: { name: string; bath_C: number }): PlanWarning | null {
  if (handling_C > last.bath_C) return null
  return {
    kind: 'handling-at-medium',
    field: 'handling.below_C',
    text: `The handling temperature {handling} is at or below the temperature of the last medium (${last.name}, {medium}): the part cannot get there in it, so the time shown is set by when an earlier stage ends, not by cooling. Raise the handling temperature or change the last medium.`,
    temperatures_C: { handling: handling_C, medium: last.bath_C },
  }
}

/** The cracking rule on the largest centre-minus-surface difference of the curve. */
export function crackingWarning(curve: { centre_C: number[]; surface_C: number[] }, part: Part, roomK_W_mK: number): PlanWarning | null {
  const section = sectionSize_m(part)
  if (section < CRACKING_RULE.minimumSection_m) return null
  const spread = Math.max(...curve.centre_C.map((c, i) => Math.abs(c - curve.surface_C[i]!)))
  const cls = crackingClass(roomK_W_mK)
  const limit = CRACKING_RULE.limit_K[cls]
  if (spread <= limit) return null
  return {
    kind: 'cracking-risk',
    field: 'stages.0.quenchantId',
    text:
      `Cracking likely: the surface runs up to {spread} colder than the centre, above the {limit} a ${cls} section of ${Math.round(section * 1000)} mm ` +
      'tolerates by the usual rule of thumb (common practice, from memory, not a specification). Consider a milder first medium, an interrupted quench or a prompt temper, and follow the material specification.',
    temperatures_C: {},
    differences_K: { spread, limit },
  }
}

/** Lowest and highest of a list, for the ranges below. */
function span(values: number[]): { low: number; high: number } {
  return { low: Math.min(...values), high: Math.max(...values) }
}

/**
 * The material's table read outside its rows: beyond its ends the engine holds the end
 * row's values, which a metallurgist should know before trusting the time.
 */
export function tableRangeWarning(table: { T_C: number }[], materialName: string, curve: { centre_C: number[]; surface_C: number[] }): PlanWarning | null {
  const covered = span(table.map((r) => r.T_C))
  const seen = span([...curve.centre_C, ...curve.surface_C])
  if (seen.low >= covered.low && seen.high <= covered.high) return null
  return {
    kind: 'outside-table',
    field: 'materialId',
    text: `The property table of ${materialName} covers {tableLow} to {tableHigh}, but the part runs from {hot} down to {cold}: beyond the table the end rows are held constant. Extend the table to trust the time.`,
    temperatures_C: { tableLow: covered.low, tableHigh: covered.high, hot: seen.high, cold: seen.low },
  }
}

/** A stage's cooling-power curve read at surface temperatures it does not cover (its end points are held there). */
export function curveRangeWarning(stage: number, medium: { name: string; curve: { T_C: number }[] }, surface_C: number[]): PlanWarning | null {
  const covered = span(medium.curve.map((p) => p.T_C))
  const seen = span(surface_C)
  if (seen.low >= covered.low && seen.high <= covered.high) return null
  return {
    kind: 'outside-curve',
    field: `stages.${stage}.quenchantId`,
    text: `The cooling curve of ${medium.name} covers surface temperatures {curveLow} to {curveHigh}, but in stage ${stage + 1} the surface runs from {hot} down to {cold}: beyond the curve its end values are held. Extend the curve to trust the time.`,
    temperatures_C: { curveLow: covered.low, curveHigh: covered.high, hot: seen.high, cold: seen.low },
  }
}

/** Short cylinders and blocks are product solutions, which need one k, ρc and h: the library's tables and curves go unused. */
export function uniformPropertiesWarning(): PlanWarning {
  return {
    kind: 'uniform-properties',
    field: 'part',
    text:
      'The library has a property table or cooling curves for this plan, but a short cylinder or block is computed with uniform properties and one coefficient per medium (a product of one-dimensional solutions). ' +
      'For the temperature-dependent time, plan the part as the round bar or plate that sets its core temperature.',
    temperatures_C: {},
  }
}
