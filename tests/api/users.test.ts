import { beforeAll, describe, expect, it } from 'vitest'
import { anonymous, demoUser, signInAs, signInDemo, type Client } from '../support/http'
import { auditFor } from '../support/audit'

let admin: Client

beforeAll(async () => {
  admin = await signInDemo('admin')
})

describe('role matrix for the admin routes', () => {
  const routes = [
    { method: 'GET', path: '/api/users' },
    { method: 'POST', path: '/api/users', body: { email: 'matrix@kestrelbay.example', displayName: 'Matrix', role: 'qa', password: 'long-enough-pw' } },
    { method: 'PATCH', path: '/api/users/1', body: { displayName: 'Renamed' } },
  ]
  it.each(routes)('$method $path: 401 signed out', async ({ method, path, body }) => {
    expect((await anonymous().request(path, { method, body })).status).toBe(401)
  })
  it.each(['metallurgist', 'operator', 'qa'] as const)('403 for %s on every admin route', async (role) => {
    const client = await signInDemo(role)
    for (const { method, path, body } of routes) {
      const response = await client.request(path, { method, body })
      expect(response.status, `${method} ${path}`).toBe(403)
      expect(response.body.statusMessage).toBe('Not allowed for your role')
    }
  })
  it('the audit trail is open to qa and closed to operators', async () => {
    expect((await (await signInDemo('qa')).request('/api/audit')).status).toBe(200)
    expect((await (await signInDemo('operator')).request('/api/audit')).status).toBe(403)
    expect((await (await signInDemo('operator')).request('/api/audit/people')).status).toBe(403)
  })
})

describe('the audit trail, readable and filtered', () => {
  it('filters by person, kind and day, and names the person an entry is about', async () => {
    const qa = await signInDemo('qa')
    const email = `audit.subject.${Date.now()}@kestrelbay.example`
    const created = await admin.request('/api/users', { method: 'POST', body: { email, displayName: 'Audit Subject', role: 'operator', password: 'long-enough-pw' } })
    expect(created.status).toBe(201)
    const people = (await qa.request('/api/audit/people')).body as { id: number; name: string }[]
    const adminId = people.find((p) => p.name === demoUser('admin').displayName)!.id
    const today = new Date().toISOString().slice(0, 10)
    const mine = (await qa.request(`/api/audit?actorId=${adminId}&entityType=user&from=${today}&to=${today}&limit=500`)).body as { actorId: number; entityType: string; at: string; entityId: string; entityName: string | null; action: string }[]
    expect(mine.length).toBeGreaterThan(0)
    expect(mine.every((e) => e.actorId === adminId && e.entityType === 'user' && e.at.startsWith(today))).toBe(true)
    expect(mine.find((e) => e.entityId === String(created.body.id) && e.action === 'user.create')!.entityName).toBe('Audit Subject')
    expect((await qa.request('/api/audit?from=2000-01-01&to=2000-01-02')).body).toEqual([])
    const bad = await qa.request('/api/audit?from=yesterday')
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems).toEqual([{ field: 'from', message: 'From must be a date (YYYY-MM-DD)' }])
  })
})

describe('user lifecycle', () => {
  it('creates a user who can sign in, then deactivates them: sign-in refused and open session dropped', async () => {
    const email = `new.operator.${Date.now()}@kestrelbay.example`
    const password = 'first-shift-password'
    const created = await admin.request('/api/users', { method: 'POST', body: { email, displayName: 'New Operator', role: 'operator', password } })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ email, role: 'operator', active: true })
    expect(created.body).not.toHaveProperty('passwordHash')

    const listed = await admin.request('/api/users')
    expect(listed.body.map((user: { email: string }) => user.email)).toContain(email)
    expect(JSON.stringify(listed.body)).not.toMatch(/scrypt|passwordHash/)

    const operator = await signInAs(email, password)
    expect(operator).not.toBeNull()
    expect((await operator!.request('/api/auth/session')).body.user.role).toBe('operator')

    const deactivated = await admin.request(`/api/users/${created.body.id}`, { method: 'PATCH', body: { active: false } })
    expect(deactivated.status).toBe(200)
    expect(deactivated.body.active).toBe(false)

    // The session cookie issued before deactivation no longer works.
    expect((await operator!.request('/api/auth/session')).body.user).toBeUndefined()
    expect((await operator!.request('/api/audit')).status).toBe(401)
    expect(await signInAs(email, password)).toBeNull()

    const actions = await auditFor(admin, 'user', created.body.id)
    expect(actions.map((entry: { action: string }) => entry.action)).toEqual(expect.arrayContaining(['user.create', 'user.update']))
    const update = actions.find((entry: { action: string }) => entry.action === 'user.update')
    expect(update.details).toEqual({ active: { from: true, to: false } })
    expect(update.actorName).toBe('Rowan Achterberg')
  })

  it('a role change ends the open session; signing in again carries the new role', async () => {
    const email = `promoted.${Date.now()}@kestrelbay.example`
    const created = await admin.request('/api/users', { method: 'POST', body: { email, displayName: 'Promoted Person', role: 'operator', password: 'promote-me-please' } })
    const person = (await signInAs(email, 'promote-me-please'))!
    expect((await person.request('/api/audit')).status).toBe(403)
    await admin.request(`/api/users/${created.body.id}`, { method: 'PATCH', body: { role: 'qa' } })
    // Issue 11: a role change raises the session version, so the old session stops at once.
    expect((await person.request('/api/audit')).status).toBe(401)
    const again = (await signInAs(email, 'promote-me-please'))!
    expect((await again.request('/api/audit')).status).toBe(200)
  })

  it('refuses a duplicate e-mail with 409 naming the field', async () => {
    const response = await admin.request('/api/users', {
      method: 'POST',
      body: { email: 'qa@kestrelbay.example', displayName: 'Copy', role: 'qa', password: 'another-password' },
    })
    expect(response.status).toBe(409)
    expect(response.body.data.problems[0].field).toBe('email')
  })

  it('an admin cannot deactivate themselves', async () => {
    const self = (await admin.request('/api/auth/session')).body.user.id
    const response = await admin.request(`/api/users/${self}`, { method: 'PATCH', body: { active: false } })
    expect(response.status).toBe(422)
    expect(response.body.data.problems[0].field).toBe('active')
  })
})

describe('bad input', () => {
  it('malformed JSON is a 400 without a stack trace', async () => {
    const response = await admin.request('/api/users', { method: 'POST', rawBody: '{"email": ' })
    expect(response.status).toBe(400)
    expect(JSON.stringify(response.body)).not.toMatch(/\.ts:|\.mjs:|at \w+ \(/)
  })

  it.each([
    [{ email: 'not-an-email', displayName: 'X Y', role: 'qa', password: 'long-enough-pw' }, 'email'],
    [{ email: 'ok@kestrelbay.example', displayName: 'X', role: 'qa', password: 'long-enough-pw' }, 'displayName'],
    [{ email: 'ok@kestrelbay.example', displayName: 'X Y', role: 'foreman', password: 'long-enough-pw' }, 'role'],
    [{ email: 'ok@kestrelbay.example', displayName: 'X Y', role: 'qa', password: 'short' }, 'password'],
    [{ email: 'ok@kestrelbay.example', displayName: 'X Y', role: 'qa', password: 'long-enough-pw', extra: 1 }, '(body)'],
  ])('%j is refused naming %s', async (body, field) => {
    const response = await admin.request('/api/users', { method: 'POST', body })
    expect(response.status).toBe(400)
    expect(response.body.data.problems.map((problem: { field: string }) => problem.field)).toContain(field)
    const list = await admin.request('/api/users')
    expect(list.body.map((user: { email: string }) => user.email)).not.toContain('ok@kestrelbay.example')
  })

  it('a non-numeric id is a 400 naming the id, an unknown one a 404', async () => {
    expect((await admin.request('/api/users/abc', { method: 'PATCH', body: { active: true } })).body.data.problems[0].field).toBe('id')
    expect((await admin.request('/api/users/999999', { method: 'PATCH', body: { active: true } })).status).toBe(404)
  })
})
