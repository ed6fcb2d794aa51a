import { beforeAll, describe, expect, it } from 'vitest'
import { anonymous, signInDemo, type Client } from '../support/http'
import { auditFor, latestAuditId } from '../support/audit'
import { uniqueName } from '../support/library'

let metallurgist: Client
let admin: Client

beforeAll(async () => {
  metallurgist = await signInDemo('metallurgist')
  admin = await signInDemo('admin')
})

const newQuenchant = (name: string) => ({
  name,
  kind: 'polymer',
  hLow_W_m2K: 1500,
  hTypical_W_m2K: 2400,
  hHigh_W_m2K: 3800,
  bath_C: 35,
  source: 'Kestrel Bay probe test, tank 2',
})

async function seeded(name: string) {
  const found = (await metallurgist.request('/api/quenchants')).body.find((q: { name: string }) => q.name === name)
  expect(found?.name, `seeded quench medium ${name}`).toBe(name)
  return found
}

describe('reading the quench media', () => {
  it.each(['admin', 'metallurgist', 'operator', 'qa'] as const)('%s reads the list and one entry', async (role) => {
    const client = await signInDemo(role)
    const list = await client.request('/api/quenchants')
    expect(list.status).toBe(200)
    // Incropera et al., Table 1.1: forced convection of gases 25–250 W/m²·K (from memory).
    expect(list.body.find((q: { name: string }) => q.name === 'Forced air (fan)')).toMatchObject({ kind: 'forced-air', hLow_W_m2K: 25, hHigh_W_m2K: 250 })
    const one = await client.request(`/api/quenchants/${list.body[0].id}`)
    expect(one.body).toEqual(list.body[0])
  })

  it('401 signed out, 404 unknown id', async () => {
    expect((await anonymous().request('/api/quenchants')).status).toBe(401)
    expect((await metallurgist.request('/api/quenchants/999999')).status).toBe(404)
  })
})

describe('editing the quench media', () => {
  it('create, read, update round trip with audit rows of the changed fields', async () => {
    const name = uniqueName('PAG 12 %')
    const created = await metallurgist.request('/api/quenchants', { method: 'POST', body: newQuenchant(name) })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ ...newQuenchant(name), notes: null })
    const id = created.body.id
    expect((await metallurgist.request(`/api/quenchants/${id}`)).body).toEqual(created.body)

    const updated = await metallurgist.request(`/api/quenchants/${id}`, { method: 'PATCH', body: { hTypical_W_m2K: 2600, bath_C: 40 } })
    expect(updated.status).toBe(200)
    expect(updated.body).toMatchObject({ id, hTypical_W_m2K: 2600, bath_C: 40, hLow_W_m2K: 1500 })

    const audit = await auditFor(admin, 'quenchant', id)
    expect(audit.map((entry: { action: string }) => entry.action)).toEqual(['quenchant.update', 'quenchant.create'])
    expect(audit[0].details).toEqual({ hTypical_W_m2K: { from: 2400, to: 2600 }, bath_C: { from: 35, to: 40 } })
    expect(audit[1].details).toMatchObject({ name, kind: 'polymer', hTypical_W_m2K: 2400 })
  })

  it.each(['operator', 'qa'] as const)('%s gets 403 on POST and PATCH', async (role) => {
    const client = await signInDemo(role)
    expect((await client.request('/api/quenchants', { method: 'POST', body: newQuenchant(uniqueName(role)) })).status).toBe(403)
    const water = await seeded('Water')
    expect((await client.request(`/api/quenchants/${water.id}`, { method: 'PATCH', body: { bath_C: 45 } })).status).toBe(403)
    expect((await seeded('Water')).bath_C).toBe(20)
  })

  it('401 signed out on POST and PATCH', async () => {
    expect((await anonymous().request('/api/quenchants', { method: 'POST', body: newQuenchant(uniqueName('anon')) })).status).toBe(401)
    expect((await anonymous().request('/api/quenchants/1', { method: 'PATCH', body: { bath_C: 30 } })).status).toBe(401)
  })

  it.each([
    [{ kind: 'brine' }, 'kind'],
    [{ hTypical_W_m2K: -10 }, 'hTypical_W_m2K'],
    [{ hLow_W_m2K: 3000 }, 'hLow_W_m2K'],
    [{ hHigh_W_m2K: 2000 }, 'hHigh_W_m2K'],
    [{ bath_C: 900 }, 'bath_C'],
    [{ bath_C: '35' }, 'bath_C'],
    [{ source: 'x' }, 'source'],
  ])('POST %j is a 400 naming %s, and nothing is written', async (change, field) => {
    const name = uniqueName('Invalid medium')
    const before = await latestAuditId(admin)
    const response = await metallurgist.request('/api/quenchants', { method: 'POST', body: { ...newQuenchant(name), ...change } })
    expect(response.status).toBe(400)
    expect(response.body.data.problems.map((problem: { field: string }) => problem.field)).toContain(field)
    expect((await metallurgist.request('/api/quenchants')).body.map((q: { name: string }) => q.name)).not.toContain(name)
    expect(await latestAuditId(admin)).toBe(before)
  })

  it('a PATCH that breaks low ≤ typical ≤ high on the merged record is a 400 naming the field, and the row is unchanged', async () => {
    const oil = await seeded('Fast quench oil, still')
    const before = await latestAuditId(admin)
    // Still oil spans 1000–1500 W/m²·K (Totten et al., from memory): a low of 1400 above the typical 1250 must be refused.
    const response = await metallurgist.request(`/api/quenchants/${oil.id}`, { method: 'PATCH', body: { hLow_W_m2K: 1400, notes: 'should not stick' } })
    expect(response.status).toBe(400)
    expect(response.body.data.problems).toEqual([{ field: 'hLow_W_m2K', message: 'The low coefficient cannot exceed the typical one' }])
    expect(await seeded('Fast quench oil, still')).toEqual(oil)
    expect(await latestAuditId(admin)).toBe(before)
  })

  it('the seeded media keep their band as curves with a source, air with an emissivity', async () => {
    const oil = await seeded('Fast quench oil, still')
    expect(oil.coolingCurves.typical.length).toBeGreaterThanOrEqual(3)
    expect(oil.curveSource).toMatch(/Common practice, from memory/)
    expect((await seeded('Still air')).emissivity).toBe(0.8)
  })

  it('curves are stored with their source; an emissivity on a liquid is a 400 on the merged record, and the row is unchanged', async () => {
    const created = await metallurgist.request('/api/quenchants', { method: 'POST', body: newQuenchant(uniqueName('Curved polymer')) })
    const curve = (scale: number) => [
      { T_C: 35, h: 800 * scale },
      { T_C: 300, h: 6000 * scale },
      { T_C: 850, h: 700 * scale },
    ]
    const coolingCurves = { low: curve(0.6), typical: curve(1), high: curve(1.5) }
    const set = await metallurgist.request(`/api/quenchants/${created.body.id}`, { method: 'PATCH', body: { coolingCurves, curveSource: 'probe test' } })
    expect(set.status).toBe(200)
    expect(set.body.coolingCurves).toEqual(coolingCurves)
    const radiating = await metallurgist.request(`/api/quenchants/${created.body.id}`, { method: 'PATCH', body: { emissivity: 0.8 } })
    expect(radiating.status).toBe(400)
    expect(radiating.body.data.problems.map((p: { field: string }) => p.field)).toContain('emissivity')
    expect((await metallurgist.request(`/api/quenchants/${created.body.id}`)).body.emissivity).toBeNull()
    const tooFew = await metallurgist.request(`/api/quenchants/${created.body.id}`, { method: 'PATCH', body: { coolingCurves: { ...coolingCurves, low: curve(0.6).slice(0, 2) } } })
    expect(tooFew.body.data.problems).toContainEqual({ field: 'coolingCurves.low', message: 'A cooling curve needs at least three points' })
  })

  it('a duplicate name is a 409 naming name, with nothing half-written', async () => {
    const before = await latestAuditId(admin)
    const count = (await metallurgist.request('/api/quenchants')).body.length
    const duplicate = await metallurgist.request('/api/quenchants', { method: 'POST', body: newQuenchant('WATER') })
    expect(duplicate.status).toBe(409)
    expect(duplicate.body.data.problems).toEqual([{ field: 'name', message: 'Another quenchant already has this name' }])
    expect((await metallurgist.request('/api/quenchants')).body.length).toBe(count)

    const salt = await seeded('Nitrate salt bath')
    const rename = await metallurgist.request(`/api/quenchants/${salt.id}`, { method: 'PATCH', body: { name: 'Still air', bath_C: 250 } })
    expect(rename.status).toBe(409)
    expect(rename.body.data.problems[0].field).toBe('name')
    expect(await seeded('Nitrate salt bath')).toEqual(salt)
    expect(await latestAuditId(admin)).toBe(before)
  })
})
