import { createDatabase } from '../../server/db/client'
import { DEMO_PLANS, insertComputedPlan } from '../../server/db/demo/schedule'
import type { SummaryCases } from '../../server/utils/planSummary'
import type { Client } from './http'
import { TEST_DATABASE_URL } from './stackConfig'

/** A thin sheet (1 mm half-thickness) quenched in water: reaches 60 °C at the core within seconds, by the engine. */
export const THIN_SHEET: SummaryCases = {
  quench: {
    geometry: 'slab', size_m: 0.001, material: { k: 40, rho: 7850, cp: 475 }, initial_C: 850,
    stages: [{ surface: { h: 3000, ambient_C: 30 } }],
    target: { at: 'centre', below_C: 60 },
  },
  heatUp: {
    geometry: 'slab', size_m: 0.001, material: { k: 40, rho: 7850, cp: 475 }, initial_C: 20,
    stages: [{ surface: { h: 150, ambient_C: 860 } }],
    target: { at: 'centre', above_C: 850 },
  },
  furnace_C: 860,
  minimumSoak_s: 600,
}

/** Inserts a plan and a revision with an engine-computed summary straight into the test database. */
export async function createPlan(name: string, cases: SummaryCases = DEMO_PLANS[0]!.cases) {
  const { db, pool } = createDatabase(TEST_DATABASE_URL)
  try {
    return await insertComputedPlan(db, `${name} ${Date.now()}-${Math.random().toString(36).slice(2, 6)}`, cases, null)
  } finally {
    await pool.end()
  }
}

let counter = 0
/** A furnace served by a station of its own, both with unique names, created through the admin API. */
export async function createLine(admin: Client, label = 'Test') {
  const tag = `${label} ${Date.now().toString(36)}${(counter += 1)}`
  const station = await admin.request('/api/quench-stations', { method: 'POST', body: { name: `${tag} tank`, kind: 'oil', maxTemp_C: 90, capacity_kg: 3000 } })
  if (station.status !== 201) throw new Error(`station: ${JSON.stringify(station.body)}`)
  const furnace = await admin.request('/api/furnaces', {
    method: 'POST',
    body: { name: `${tag} furnace`, kind: 'box', maxTemp_C: 1100, capacity_kg: 1000, zoneWidth_mm: 600, zoneDepth_mm: 900, zoneHeight_mm: 600, stationIds: [station.body.id] },
  })
  if (furnace.status !== 201) throw new Error(`furnace: ${JSON.stringify(furnace.body)}`)
  return { furnace: furnace.body as { id: number; name: string }, station: station.body as { id: number; name: string } }
}

export function booking(planRevisionId: number, line: { furnace: { id: number }; station: { id: number } }, plannedCharge: number, reference = 'WO-TEST') {
  return { planRevisionId, furnaceId: line.furnace.id, stationId: line.station.id, plannedCharge: new Date(plannedCharge).toISOString(), partCount: 24, mass_kg: 320, reference }
}
