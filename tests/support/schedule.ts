import type { Client } from './http'

let counter = 0
/**
 * A furnace served by a station of its own, both with unique names, created through the
 * admin API. The station holds `kind`: oil for the pin plan, water for the thin sheet.
 */
export async function createLine(admin: Client, label = 'Test', kind = 'oil') {
  const tag = `${label} ${Date.now().toString(36)}${(counter += 1)}`
  const station = await admin.request('/api/quench-stations', { method: 'POST', body: { name: `${tag} tank`, kind, maxTemp_C: 90, capacity_kg: 3000 } })
  if (station.status !== 201) throw new Error(`station: ${JSON.stringify(station.body)}`)
  const furnace = await admin.request('/api/furnaces', {
    method: 'POST',
    body: { name: `${tag} furnace`, kind: 'box', maxTemp_C: 1100, capacity_kg: 1000, zoneWidth_mm: 600, zoneDepth_mm: 900, zoneHeight_mm: 600, stationIds: [station.body.id] },
  })
  if (furnace.status !== 201) throw new Error(`furnace: ${JSON.stringify(furnace.body)}`)
  return { furnace: furnace.body as { id: number; name: string }, station: station.body as { id: number; name: string } }
}

export function booking(planRevisionId: number, line: { furnace: { id: number }; station: { id: number } }, plannedCharge: number, reference = 'WO-TEST') {
  return {
    planRevisionId,
    furnaceId: line.furnace.id,
    stationId: line.station.id,
    plannedCharge: new Date(plannedCharge).toISOString(),
    partCount: 24,
    mass_kg: 320,
    reference,
  }
}
