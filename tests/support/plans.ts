import { computePlan } from '../../server/planning/computePlan'
import { planSpecSchema, type PlanSpecInput } from '../../shared/schemas/plan'
import type { PlanSummary } from '../../shared/types/plan'
import type { Client } from './http'
import { offlineSnapshots, type LibraryFixture } from './library'

/**
 * Plans the schedule and floor tests book, as the editor would send them, each beside
 * the same part written by hand as an engine case (the tests' reference: runCase on it).
 */

/** A Ø40 mm pin from 850 °C: 180 s in the 60 °C oil, then still air until the centre is below 100 °C; soak at 860 °C. */
export function pinSpec(lib: LibraryFixture): PlanSpecInput {
  return {
    name: 'Pin Ø40 oil then air',
    part: { shape: 'round-bar', diameter_m: 0.04 },
    materialId: lib.steelId,
    start_C: 850,
    stages: [{ quenchantId: lib.oilId, duration_s: 180 }, { quenchantId: lib.airId }],
    handling: { below_C: 100, at: 'centre' },
    // The furnace coefficient is given, so the heat-up case below can be written by hand.
    soak: { furnace_C: 860, tolerance_K: 10, minimumSoak_s: 1800, charge_C: 20, furnaceH_W_m2K: 120 },
  }
}

const steel = { k: 40, rho: 7850, cp: 475 }

export const PIN_QUENCH_CASE = {
  geometry: 'rod', size_m: 0.02, material: steel, initial_C: 850,
  stages: [{ surface: { h: 800, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 15, ambient_C: 25 } }],
  target: { at: 'centre', below_C: 100 },
}

/** The same pin at the slow end of the band: every medium at its low coefficient (oil 500, air 10); what "safe to handle" books. */
export const PIN_QUENCH_SLOW_END_CASE = {
  ...PIN_QUENCH_CASE,
  stages: [{ surface: { h: 500, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 10, ambient_C: 25 } }],
}

export const PIN_HEAT_UP_CASE = {
  geometry: 'rod', size_m: 0.02, material: steel, initial_C: 20,
  stages: [{ surface: { h: 120, ambient_C: 860 } }],
  target: { at: 'centre', above_C: 850 },
}

/** A 2 mm sheet quenched in water: the core reaches 60 °C within seconds. */
export function thinSheetSpec(lib: LibraryFixture): PlanSpecInput {
  return {
    name: 'Thin sheet 2 mm water',
    part: { shape: 'plate', thickness_m: 0.002 },
    materialId: lib.steelId,
    start_C: 850,
    stages: [{ quenchantId: lib.waterId }],
    handling: { below_C: 60, at: 'centre' },
    soak: { furnace_C: 860, tolerance_K: 10, minimumSoak_s: 600, charge_C: 20, furnaceH_W_m2K: 150 },
  }
}

export const THIN_SHEET_QUENCH_CASE = {
  geometry: 'slab', size_m: 0.001, material: steel, initial_C: 850,
  stages: [{ surface: { h: 3000, ambient_C: 30 } }],
  target: { at: 'centre', below_C: 60 },
}

/** The sheet at the slow end of the band: water at its low coefficient, 2500. */
export const THIN_SHEET_SLOW_END_CASE = { ...THIN_SHEET_QUENCH_CASE, stages: [{ surface: { h: 2500, ambient_C: 30 } }] }

export interface SavedPlan {
  planId: number
  planRevisionId: number
  summary: PlanSummary
}

/** Saves a plan through POST /api/plans under a unique name; `client` must be a metallurgist or admin. */
export async function savePlan(client: Client, spec: PlanSpecInput): Promise<SavedPlan> {
  const name = `${spec.name} ${Date.now()}-${Math.random().toString(36).slice(2, 6)}`
  const response = await client.request('/api/plans', { method: 'POST', body: { ...spec, name } })
  if (response.status !== 201) throw new Error(`plan: ${response.status} ${JSON.stringify(response.body)}`)
  return { planId: response.body.id, planRevisionId: response.body.planRevisionId, summary: response.body.result.summary }
}

/** The summary the planner would store for `spec` over the offline library, computed without a server (unit tests). */
export function offlineSummary(spec: PlanSpecInput): PlanSummary {
  return computePlan({ ...planSpecSchema.parse(spec), library: offlineSnapshots() }).summary
}
