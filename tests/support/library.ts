import type { MaterialSnapshot, QuenchantSnapshot } from '../../shared/schemas/plan'
import type { Client } from './http'

/**
 * Library entries for planner and schedule tests, created through /api/materials and
 * /api/quenchants like a metallurgist would. Names carry a suffix so runs never collide.
 */
export interface LibraryFixture {
  steelId: number
  oilId: number
  oil25Id: number
  airId: number
  waterId: number
  values: typeof VALUES
}

type Medium = { hLow: number; h: number; hHigh: number; bath_C: number }

// Steel values: a medium-carbon steel near 500 °C, rounded; the coefficients are typical
// shop ranges for a moderately agitated quench oil, still air and a water tank.
const VALUES = {
  steel: { k: 40, rho: 7850, cp: 475 },
  oil: { hLow: 500, h: 800, hHigh: 1200, bath_C: 60 } as Medium,
  oil25: { hLow: 500, h: 800, hHigh: 1200, bath_C: 25 } as Medium,
  air: { hLow: 10, h: 15, hHigh: 25, bath_C: 25 } as Medium,
  water: { hLow: 2500, h: 3000, hHigh: 3500, bath_C: 30 } as Medium,
}

const SOURCE = 'test fixture'

/** A name no other run has used: library names are unique. */
export const uniqueName = (label: string) => `${label} ${Date.now()}-${Math.round(Math.random() * 1e6)}`

function materialBody(name: string) {
  const { k, rho, cp } = VALUES.steel
  return { name, k_W_mK: k, density_kg_m3: rho, specificHeat_J_kgK: cp, source: SOURCE }
}

const MEDIA = [
  ['oil', 'Test oil', 'oil'],
  ['oil25', 'Test cold oil', 'oil'],
  ['air', 'Test still air', 'still-air'],
  ['water', 'Test water', 'water'],
] as const

function quenchantBody(name: string, kind: string, q: Medium) {
  return { name, kind, hLow_W_m2K: q.hLow, hTypical_W_m2K: q.h, hHigh_W_m2K: q.hHigh, bath_C: q.bath_C, source: SOURCE }
}

/** Creates the fixture library through the API; `client` must be a metallurgist or admin. */
export async function createLibraryFixture(client: Client): Promise<LibraryFixture> {
  const suffix = `${Date.now()}-${Math.floor(Math.random() * 1e6)}`
  const create = async (path: string, body: Record<string, unknown>): Promise<number> => {
    const response = await client.request(path, { method: 'POST', body })
    if (response.status !== 201) throw new Error(`${path}: ${response.status} ${JSON.stringify(response.body)}`)
    return response.body.id
  }
  const steelId = await create('/api/materials', materialBody(`Test steel ${suffix}`))
  const [oilId, oil25Id, airId, waterId] = await Promise.all(MEDIA.map(([key, name, kind]) => create('/api/quenchants', quenchantBody(`${name} ${suffix}`, kind, VALUES[key]))))
  return { steelId, oilId: oilId!, oil25Id: oil25Id!, airId: airId!, waterId: waterId!, values: VALUES }
}

/**
 * The same library without a database, for unit tests that call the planner's compute
 * directly: fixed ids and the snapshots a saved revision would carry.
 */
export const OFFLINE_LIBRARY: LibraryFixture = { steelId: 1, oilId: 11, oil25Id: 12, airId: 13, waterId: 14, values: VALUES }

export function offlineSnapshots(): { material: MaterialSnapshot; quenchants: QuenchantSnapshot[] } {
  const ids = { oil: OFFLINE_LIBRARY.oilId, oil25: OFFLINE_LIBRARY.oil25Id, air: OFFLINE_LIBRARY.airId, water: OFFLINE_LIBRARY.waterId }
  return {
    material: { id: OFFLINE_LIBRARY.steelId, ...materialBody('Test steel'), gradedProfile: null },
    quenchants: MEDIA.map(([key, name, kind]) => ({ id: ids[key], ...quenchantBody(name, kind, VALUES[key]) }) as QuenchantSnapshot),
  }
}
