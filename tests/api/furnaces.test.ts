import { beforeAll, describe, expect, it } from 'vitest'
import { anonymous, signInDemo, type Client } from '../support/http'
import { auditFor } from '../support/audit'

let admin: Client
beforeAll(async () => {
  admin = await signInDemo('admin')
})

const furnaceBody = (name: string, stationIds: number[] = []) => ({ name, kind: 'pit', maxTemp_C: 1050, capacity_kg: 2200, zoneWidth_mm: 900, zoneDepth_mm: 900, zoneHeight_mm: 2000, stationIds })

describe('furnaces and quench stations', () => {
  it('an admin adds a station and a furnace served by it, edits the link, and both are listed for every role', async () => {
    const tag = Date.now().toString(36)
    const station = await admin.request('/api/quench-stations', { method: 'POST', body: { name: `Tank ${tag}`, kind: 'polymer', maxTemp_C: 55, capacity_kg: 4000 } })
    expect(station.status).toBe(201)
    expect(station.body).toMatchObject({ name: `Tank ${tag}`, kind: 'polymer', maxTemp_C: 55, capacity_kg: 4000, active: true })
    const furnace = await admin.request('/api/furnaces', { method: 'POST', body: furnaceBody(`Pit ${tag}`, [station.body.id]) })
    expect(furnace.status).toBe(201)
    expect(furnace.body).toMatchObject({ name: `Pit ${tag}`, kind: 'pit', maxTemp_C: 1050, capacity_kg: 2200, zoneHeight_mm: 2000, stationIds: [station.body.id] })

    const unlinked = await admin.request(`/api/furnaces/${furnace.body.id}`, { method: 'PATCH', body: { stationIds: [], maxTemp_C: 980 } })
    expect(unlinked.status).toBe(200)
    expect(unlinked.body).toMatchObject({ stationIds: [], maxTemp_C: 980 })

    const qa = await signInDemo('qa')
    const listed = await qa.request('/api/furnaces')
    expect(listed.status).toBe(200)
    expect(listed.body.find((f: { id: number }) => f.id === furnace.body.id)).toMatchObject({ maxTemp_C: 980, stationIds: [] })
    expect((await qa.request('/api/quench-stations')).body.map((s: { id: number }) => s.id)).toContain(station.body.id)

    const audit = await auditFor(admin, 'furnace', furnace.body.id)
    expect(audit.map((e: { action: string }) => e.action).sort()).toEqual(['furnace.create', 'furnace.update'])
  })

  it('only admins may change equipment; signed-out visitors may not even read', async () => {
    for (const role of ['metallurgist', 'operator', 'qa'] as const) {
      const client = await signInDemo(role)
      expect((await client.request('/api/furnaces', { method: 'POST', body: furnaceBody(`Nope ${role}`) })).status).toBe(403)
      expect((await client.request('/api/quench-stations', { method: 'POST', body: { name: 'Nope', kind: 'oil', maxTemp_C: 80, capacity_kg: 100 } })).status).toBe(403)
    }
    expect((await anonymous().request('/api/furnaces')).status).toBe(401)
  })

  it.each([
    [{ ...furnaceBody('X'), name: 'X' }, 'name'],
    [{ ...furnaceBody('Kiln A'), kind: 'rotary' }, 'kind'],
    [{ ...furnaceBody('Kiln B'), maxTemp_C: -5 }, 'maxTemp_C'],
    [{ ...furnaceBody('Kiln C'), capacity_kg: 'lots' }, 'capacity_kg'],
    [{ ...furnaceBody('Kiln D'), stationIds: [999999] }, 'stationIds'],
  ])('%j is refused naming %s', async (body, field) => {
    const response = await admin.request('/api/furnaces', { method: 'POST', body })
    expect(response.status).toBe(400)
    expect(response.body.data.problems.map((p: { field: string }) => p.field)).toContain(field)
  })

  it('a duplicate furnace name is a 409 naming the field; an unknown furnace a 404', async () => {
    const name = `Twin ${Date.now().toString(36)}`
    expect((await admin.request('/api/furnaces', { method: 'POST', body: furnaceBody(name) })).status).toBe(201)
    const again = await admin.request('/api/furnaces', { method: 'POST', body: furnaceBody(name) })
    expect(again.status).toBe(409)
    expect(again.body.data.problems[0].field).toBe('name')
    expect((await admin.request('/api/furnaces/999999', { method: 'PATCH', body: { active: false } })).status).toBe(404)
  })
})
