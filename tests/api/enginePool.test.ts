import { describe, expect, it } from 'vitest'
import { anonymous, signInDemo } from '../support/http'
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
    const preview = await metallurgist.request('/api/plans/preview', { method: 'POST', body: (({ library: _library, ...spec }) => spec)(detail.body.spec) })
    expect(preview.status).toBe(200)

    const after = await engineStats()
    // The save, the read and the preview: three jobs on the pool.
    expect(after.started - before.started).toBeGreaterThanOrEqual(3)
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
