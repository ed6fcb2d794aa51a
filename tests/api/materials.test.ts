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

const newMaterial = (name: string) => ({
  name,
  k_W_mK: 42.3,
  density_kg_m3: 7858,
  specificHeat_J_kgK: 442,
  propertiesAt_C: 26.85,
  source: 'Incropera et al., Table A.1, 1 Cr–½ Mo, 300 K (from memory)',
})

describe('reading the materials library', () => {
  it.each(['admin', 'metallurgist', 'operator', 'qa'] as const)('%s reads the list with the seeded handbook values', async (role) => {
    const client = await signInDemo(role)
    const response = await client.request('/api/materials')
    expect(response.status).toBe(200)
    // Incropera et al., Table A.1, AISI 1010 at 300 K: k 63.9 W/m·K, ρ 7832 kg/m³, c_p 434 J/kg·K (from memory).
    expect(response.body.find((m: { name: string }) => m.name === 'AISI 1010')).toMatchObject({ k_W_mK: 63.9, density_kg_m3: 7832, specificHeat_J_kgK: 434 })
    const one = await client.request(`/api/materials/${response.body[0].id}`)
    expect(one.status).toBe(200)
    expect(one.body).toEqual(response.body[0])
  })

  it('the graded demo bar arrives with its two-layer profile', async () => {
    const list = (await metallurgist.request('/api/materials')).body
    const bar = list.find((m: { name: string }) => m.name === 'Case-hardened AISI 1010 bar (demo)')
    // ρc_p = 7832 × 434 = 3 399 088 J/m³·K (Table A.1 values for AISI 1010); case k = 0.9 × 63.9 ≈ 57.5.
    expect(bar.gradedProfile).toEqual([
      { x: 0, k: 63.9, rhoCp: 3399088 },
      { x: 0.9, k: 63.9, rhoCp: 3399088 },
      { x: 0.9, k: 57.5, rhoCp: 3399088 },
      { x: 1, k: 57.5, rhoCp: 3399088 },
    ])
  })

  it('401 signed out, 404 for an unknown id, 400 naming the id for a bad one', async () => {
    expect((await anonymous().request('/api/materials')).status).toBe(401)
    expect((await anonymous().request('/api/materials/1')).status).toBe(401)
    expect((await metallurgist.request('/api/materials/999999')).status).toBe(404)
    const bad = await metallurgist.request('/api/materials/abc')
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems[0].field).toBe('id')
  })
})

describe('editing the materials library', () => {
  it('create, read, update round trip with audit rows of the changed fields', async () => {
    const name = uniqueName('Cr-Mo bar stock')
    const created = await metallurgist.request('/api/materials', { method: 'POST', body: newMaterial(name) })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ ...newMaterial(name), gradedProfile: null, notes: null })
    const id = created.body.id

    expect((await metallurgist.request(`/api/materials/${id}`)).body).toEqual(created.body)

    const updated = await metallurgist.request(`/api/materials/${id}`, { method: 'PATCH', body: { k_W_mK: 40.1, notes: 'Mill certificate heat 4471' } })
    expect(updated.status).toBe(200)
    expect(updated.body).toMatchObject({ id, name, k_W_mK: 40.1, density_kg_m3: 7858, notes: 'Mill certificate heat 4471' })
    expect((await metallurgist.request(`/api/materials/${id}`)).body.k_W_mK).toBe(40.1)

    const entries = await auditFor(admin, 'material', id)
    expect(entries.map((entry: { action: string }) => entry.action)).toEqual(['material.update', 'material.create'])
    expect(entries[0].details).toEqual({ k_W_mK: { from: 42.3, to: 40.1 }, notes: { from: null, to: 'Mill certificate heat 4471' } })
    expect(entries[0].actorName).toBe('Mira Okonkwo')
    expect(entries[1].details).toMatchObject({ name, k_W_mK: 42.3 })
  })

  it('an admin may edit too; a patch that changes nothing writes no audit row', async () => {
    const created = await admin.request('/api/materials', { method: 'POST', body: newMaterial(uniqueName('Admin steel')) })
    expect(created.status).toBe(201)
    const before = await latestAuditId(admin)
    const same = await admin.request(`/api/materials/${created.body.id}`, { method: 'PATCH', body: { k_W_mK: 42.3 } })
    expect(same.status).toBe(200)
    expect(await latestAuditId(admin)).toBe(before)
  })

  it('a graded profile can be set and cleared', async () => {
    const created = await metallurgist.request('/api/materials', { method: 'POST', body: newMaterial(uniqueName('Graded')) })
    const profile = [
      { x: 0, k: 42.3, rhoCp: 3473236 },
      { x: 1, k: 38, rhoCp: 3473236 },
    ]
    const set = await metallurgist.request(`/api/materials/${created.body.id}`, { method: 'PATCH', body: { gradedProfile: profile } })
    expect(set.body.gradedProfile).toEqual(profile)
    const cleared = await metallurgist.request(`/api/materials/${created.body.id}`, { method: 'PATCH', body: { gradedProfile: null } })
    expect(cleared.body.gradedProfile).toBeNull()
  })

  it('the seeded steels carry their Table A.1 temperature columns with a source', async () => {
    const list = (await metallurgist.request('/api/materials')).body
    const carbon = list.find((m: { name: string }) => m.name === 'Plain carbon steel (Mn ≤ 1 %, Si ≤ 0.1 %)')
    // Incropera et al., Table A.1, plain carbon steel, 600 K: k 48.0, c_p 559 (from memory; DEVELOPERS.md provenance).
    expect(carbon.propertyTable).toContainEqual({ T_C: 326.85, k: 48, cp: 559 })
    expect(carbon.propertyTableSource).toMatch(/Table A\.1/)
  })

  it('a property table can be set with its source and cleared; an unsorted one is a 400 naming the row', async () => {
    const created = await metallurgist.request('/api/materials', { method: 'POST', body: newMaterial(uniqueName('Tabled')) })
    const table = [
      { T_C: 20, k: 42.3, cp: 442 },
      { T_C: 400, k: 38, cp: 560, rho: 7740 },
    ]
    const set = await metallurgist.request(`/api/materials/${created.body.id}`, { method: 'PATCH', body: { propertyTable: table, propertyTableSource: 'Kestrel Bay lab, heat 2231' } })
    expect(set.status).toBe(200)
    expect(set.body.propertyTable).toEqual(table)
    const unsorted = await metallurgist.request(`/api/materials/${created.body.id}`, { method: 'PATCH', body: { propertyTable: [...table].reverse() } })
    expect(unsorted.status).toBe(400)
    expect(unsorted.body.data.problems).toContainEqual({ field: 'propertyTable.1.T_C', message: 'Temperatures must rise strictly from row to row' })
    const cleared = await metallurgist.request(`/api/materials/${created.body.id}`, { method: 'PATCH', body: { propertyTable: null, propertyTableSource: null } })
    expect(cleared.body.propertyTable).toBeNull()
  })

  it.each(['operator', 'qa'] as const)('%s gets 403 on POST and PATCH, and nothing changes', async (role) => {
    const client = await signInDemo(role)
    const name = uniqueName(`${role} steel`)
    const post = await client.request('/api/materials', { method: 'POST', body: newMaterial(name) })
    expect(post.status).toBe(403)
    const list = (await client.request('/api/materials')).body
    expect(list.map((m: { name: string }) => m.name)).not.toContain(name)
    const target = list.find((m: { name: string }) => m.name === 'AISI 304 stainless')
    const patch = await client.request(`/api/materials/${target.id}`, { method: 'PATCH', body: { k_W_mK: 99 } })
    expect(patch.status).toBe(403)
    expect((await client.request(`/api/materials/${target.id}`)).body.k_W_mK).toBe(14.9)
  })

  it('401 signed out on POST and PATCH', async () => {
    expect((await anonymous().request('/api/materials', { method: 'POST', body: newMaterial(uniqueName('Anon')) })).status).toBe(401)
    expect((await anonymous().request('/api/materials/1', { method: 'PATCH', body: { k_W_mK: 1 } })).status).toBe(401)
  })

  it.each([
    [{ k_W_mK: -3 }, 'k_W_mK'],
    [{ density_kg_m3: 'heavy' }, 'density_kg_m3'],
    [{ specificHeat_J_kgK: 9000 }, 'specificHeat_J_kgK'],
    [{ name: 'X' }, 'name'],
    [{ source: '' }, 'source'],
    [{ gradedProfile: [{ x: 0, k: 40, rhoCp: 3e6 }] }, 'gradedProfile'],
    [{ diffusivity: 12 }, '(body)'],
  ])('POST %j is a 400 naming %s, and nothing is written', async (change, field) => {
    const name = uniqueName('Invalid')
    const before = await latestAuditId(admin)
    const response = await metallurgist.request('/api/materials', { method: 'POST', body: { ...newMaterial(name), ...change } })
    expect(response.status).toBe(400)
    expect(response.body.data.problems.map((problem: { field: string }) => problem.field)).toContain(field)
    expect((await metallurgist.request('/api/materials')).body.map((m: { name: string }) => m.name)).not.toContain(name)
    expect(await latestAuditId(admin)).toBe(before)
  })

  it('PATCH with a bad value or nothing to change is a 400 naming the field; unknown id 404', async () => {
    const seeded = (await metallurgist.request('/api/materials')).body.find((m: { name: string }) => m.name === 'AISI 316 stainless')
    const bad = await metallurgist.request(`/api/materials/${seeded.id}`, { method: 'PATCH', body: { density_kg_m3: 0 } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems[0].field).toBe('density_kg_m3')
    expect((await metallurgist.request(`/api/materials/${seeded.id}`, { method: 'PATCH', body: {} })).status).toBe(400)
    expect((await metallurgist.request('/api/materials/999999', { method: 'PATCH', body: { k_W_mK: 20 } })).status).toBe(404)
    expect((await metallurgist.request(`/api/materials/${seeded.id}`)).body.density_kg_m3).toBe(8238)
  })

  it('a duplicate name is a 409 naming name (also case-insensitively and on rename), with nothing half-written', async () => {
    const before = await latestAuditId(admin)
    const count = (await metallurgist.request('/api/materials')).body.length
    const duplicate = await metallurgist.request('/api/materials', { method: 'POST', body: newMaterial('aisi 1010') })
    expect(duplicate.status).toBe(409)
    expect(duplicate.body.data.problems).toEqual([{ field: 'name', message: 'Another material already has this name' }])
    expect((await metallurgist.request('/api/materials')).body.length).toBe(count)

    const other = (await metallurgist.request('/api/materials')).body.find((m: { name: string }) => m.name === 'AISI 302 stainless')
    const rename = await metallurgist.request(`/api/materials/${other.id}`, { method: 'PATCH', body: { name: 'AISI 304 stainless', k_W_mK: 99 } })
    expect(rename.status).toBe(409)
    expect(rename.body.data.problems[0].field).toBe('name')
    // The k change in the same request rolled back with the failed rename.
    expect((await metallurgist.request(`/api/materials/${other.id}`)).body).toMatchObject({ name: 'AISI 302 stainless', k_W_mK: 15.1 })
    expect(await latestAuditId(admin)).toBe(before)
  })
})
