/**
 * Previews over HTTP: one preview from any signed-in role could once hold the server for
 * good (a 1e-300 m plate) and heavy graded previews held it for 10–13 s. Each input
 * now answers within 5 s with a field and a reason, and the server answers right after.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { anonymous, signInDemo, type Client } from '../support/http'
import { createLibraryFixture, uniqueName, type LibraryFixture } from '../support/library'

const ANSWER_WITHIN_MS = 5000

let metallurgist: Client
let lib: LibraryFixture

beforeAll(async () => {
  metallurgist = await signInDemo('metallurgist')
  lib = await createLibraryFixture(metallurgist)
})

function barSpec(part: Record<string, unknown>) {
  return {
    name: 'Limits check',
    part,
    materialId: lib.steelId,
    start_C: 850,
    stages: [{ quenchantId: lib.oilId, duration_s: 60 }, { quenchantId: lib.airId }],
    handling: { below_C: 100 },
  }
}

async function timedRequest(client: Client, path: string, body: unknown) {
  const start = performance.now()
  const response = await client.request(path, { method: 'POST', body })
  return { ...response, ms: performance.now() - start }
}

async function expectHealthy() {
  const health = await anonymous().request('/api/health')
  expect(health.status).toBe(200)
}

const fields = (body: { data: { problems: { field: string }[] } }) => body.data.problems.map((p) => p.field)

describe('previews that hung or held the server now answer', () => {
  it.each(['operator', 'qa', 'metallurgist'] as const)('a plate 1e-300 m thick from %s: 400 naming part.thickness_m within 5 s, then /api/health answers', async (role) => {
    const client = await signInDemo(role)
    const response = await timedRequest(client, '/api/plans/preview', barSpec({ shape: 'plate', thickness_m: 1e-300 }))
    expect(response.status).toBe(400)
    expect(fields(response.body)).toContain('part.thickness_m')
    expect(response.body.data.problems[0].message).toBe('Thickness must be between 0.1 mm and 5 m (a part’s thickness, diameter, length or side)')
    expect(response.ms).toBeLessThan(ANSWER_WITHIN_MS)
    await expectHealthy()
  })

  it('a round bar 1e-300 m across: 400 naming part.diameter_m', async () => {
    const response = await timedRequest(metallurgist, '/api/plans/preview', barSpec({ shape: 'round-bar', diameter_m: 1e-300 }))
    expect(response.status).toBe(400)
    expect(fields(response.body)).toContain('part.diameter_m')
    expect(response.ms).toBeLessThan(ANSWER_WITHIN_MS)
    await expectHealthy()
  })

  it('seven stages: 400 naming stages (at most six)', async () => {
    const stages = [...Array.from({ length: 6 }, (_, i) => ({ quenchantId: i % 2 ? lib.airId : lib.oilId, duration_s: 60 })), { quenchantId: lib.airId }]
    const response = await timedRequest(metallurgist, '/api/plans/preview', { ...barSpec({ shape: 'round-bar', diameter_m: 0.04 }), stages })
    expect(response.status).toBe(400)
    expect(fields(response.body)).toContain('stages')
  })
})

describe('graded materials that crashed the engine are refused by the library', () => {
  const material = (gradedProfile: unknown) => ({ name: uniqueName('Graded limits'), k_W_mK: 40, density_kg_m3: 7850, specificHeat_J_kgK: 475, gradedProfile, source: 'test fixture' })

  it('a conductivity jump of 1e12: 400 naming the point', async () => {
    const profile = [{ x: 0, k: 1e-6, rhoCp: 3.7e6 }, { x: 0.5, k: 1e-6, rhoCp: 3.7e6 }, { x: 0.5, k: 1e6, rhoCp: 3.7e6 }, { x: 1, k: 1e6, rhoCp: 3.7e6 }]
    const response = await timedRequest(metallurgist, '/api/materials', material(profile))
    expect(response.status).toBe(400)
    expect(fields(response.body)).toContain('gradedProfile.0.k')
  })

  it('1000 alternating points: 400 naming gradedProfile (at most 64 points)', async () => {
    const profile = Array.from({ length: 1000 }, (_, i) => ({ x: i / 999, k: i % 2 ? 10 : 60, rhoCp: 3.6e6 }))
    const response = await timedRequest(metallurgist, '/api/materials', material(profile))
    expect(response.status).toBe(400)
    expect(fields(response.body)).toContain('gradedProfile')
    expect(response.ms).toBeLessThan(ANSWER_WITHIN_MS)
  })

  it('a graded sphere 2 m across through six alternating stages with soak planning: a result or a 422 on materialId within 5 s, then /api/health answers', async () => {
    const profile = [{ x: 0, k: 45, rhoCp: 3.7e6 }, { x: 0.9, k: 45, rhoCp: 3.7e6 }, { x: 0.9, k: 40, rhoCp: 3.7e6 }, { x: 1, k: 40, rhoCp: 3.7e6 }]
    const created = await metallurgist.request('/api/materials', { method: 'POST', body: material(profile) })
    expect(created.status).toBe(201)
    const stages = Array.from({ length: 6 }, (_, i) => (i < 5 ? { quenchantId: i % 2 ? lib.airId : lib.oilId, duration_s: 600 } : { quenchantId: lib.airId }))
    const spec = { ...barSpec({ shape: 'sphere', diameter_m: 2 }), materialId: created.body.id, stages, soak: { furnace_C: 860, tolerance_K: 10, minimumSoak_s: 600 } }
    const response = await timedRequest(await signInDemo('operator'), '/api/plans/preview', spec)
    if (response.status === 422) {
      expect(fields(response.body)).toEqual(['materialId'])
      expect(response.body.data.problems[0].message).toMatch(/^this case needs more than 4 s to solve/)
    } else {
      expect(response.status).toBe(200)
      expect(Number.isFinite(response.body.quenchToHandling_s)).toBe(true)
    }
    expect(response.ms).toBeLessThan(ANSWER_WITHIN_MS)
    await expectHealthy()
  })
})
