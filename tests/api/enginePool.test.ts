import { describe, expect, it } from 'vitest'
import { anonymous, signInDemo } from '../support/http'
import { BASE_URL } from '../support/stackConfig'
import { createLibraryFixture } from '../support/library'
import { pinSpec, savePlan } from '../support/plans'
import { computePlan } from '../../server/planning/computePlan'

const engineStats = async () => (await anonymous().request('/api/health')).body.engine

describe('the engine worker pool', () => {
  it('the built server finds its worker file: previews and saves run on worker threads and agree with the engine run here', async () => {
    const metallurgist = await signInDemo('metallurgist')
    const before = await engineStats()
    expect(before.mode).toBe('worker')
    expect(before.threads).toBeGreaterThanOrEqual(1)
    expect(before.jobSeconds).toBe(8)

    const saved = await savePlan(metallurgist, pinSpec(await createLibraryFixture(metallurgist)))
    const detail = await metallurgist.request(`/api/plans/${saved.planId}`)
    expect(detail.status).toBe(200)
    const previewSpec = (({ library: _library, ...spec }) => spec)(detail.body.spec)
    const preview = await metallurgist.request('/api/plans/preview', { method: 'POST', body: previewSpec })
    expect(preview.status).toBe(200)
    // Serialised on the worker thread and sent as that text: still labelled JSON, which the editor's $fetch parses by.
    const raw = await fetch(`${BASE_URL}/api/plans/preview`, {
      method: 'POST',
      headers: { 'cookie': metallurgist.cookie, 'accept': 'application/json', 'content-type': 'application/json' },
      body: JSON.stringify(previewSpec),
    })
    expect(raw.headers.get('content-type')).toMatch(/^application\/json/)
    expect(((await raw.json()) as { quenchToHandling_s: number }).quenchToHandling_s).toBe(preview.body.quenchToHandling_s)

    const after = await engineStats()
    // The save, the read and the two previews: four jobs on the pool.
    expect(after.started - before.started).toBeGreaterThanOrEqual(4)
    // The same stored plan computed in this process by the framework-free code.
    const here = computePlan(detail.body.spec)
    expect(preview.body.quenchToHandling_s).toBeCloseTo(here.quenchToHandling_s, 9)
    expect(detail.body.result.quenchToHandling_s).toBeCloseTo(here.quenchToHandling_s, 9)
  })

  it('an engine refusal from a worker is still a 422 naming the plan field', async () => {
    const metallurgist = await signInDemo('metallurgist')
    const lib = await createLibraryFixture(metallurgist)
    // Short cylinders take the centre or the mean as handling point, never the surface.
    const spec = { ...pinSpec(lib), part: { shape: 'cylinder', diameter_m: 0.1, length_m: 0.12 }, handling: { at: 'surface', below_C: 100 } }
    const response = await metallurgist.request('/api/plans/preview', { method: 'POST', body: spec })
    expect(response.status).toBe(422)
    expect(response.body.data.problems).toEqual([{ field: 'handling.at', message: 'for a short cylinder or block the handling point is the centre or the mean' }])
  })
})
