import { beforeAll, describe, expect, it } from 'vitest'
import { decode, encode } from 'next-auth/jwt'
import { ROLES } from '../../shared/roles'
import { AUTH_SECRET, BASE_URL } from '../support/stackConfig'
import { signInAs, signInDemo, type Client } from '../support/http'

// Issue 11 item 4: a copied session cookie must stop working when the account's
// sessions are ended. Each test copies the cookie into a second client first.
let admin: Client

beforeAll(async () => {
  admin = await signInDemo('admin')
})

const strong = 'Cobalt-harbour-62-tongs'

async function newAccount(label: string, role = 'operator') {
  const email = `session-${label}-${Date.now()}@kestrelbay.example`
  const created = await admin.request('/api/users', { method: 'POST', body: { email, displayName: `Sam ${label}`, role, password: strong } })
  expect(created.status).toBe(201)
  const client = (await signInAs(email, strong))!
  expect(client).not.toBeNull()
  return { id: created.body.id as number, email, client }
}

/** The status of an API read every role may make (`plans.read`) with this cookie header. */
async function apiStatus(cookie: string): Promise<number> {
  return (await fetch(`${BASE_URL}/api/plans`, { headers: { cookie, accept: 'application/json' } })).status
}

/**
 * The stolen copy: the same cookie header sent by someone else. Asked of both session
 * readers, next-auth's (the browser's /api/auth/session) and the API's own
 * (server/utils/auth.ts), which must agree.
 */
async function copyStillWorks(cookie: string): Promise<boolean> {
  const response = await fetch(`${BASE_URL}/api/auth/session`, { headers: { cookie } })
  const body = (await response.json()) as { user?: unknown }
  const signedIn = body.user !== undefined
  expect(await apiStatus(cookie)).toBe(signedIn ? 200 : 401)
  return signedIn
}

const SESSION_COOKIE = 'next-auth.session-token'

/** The session token in a cookie header, and the header with it replaced. */
function sessionToken(cookie: string): { token: string; withToken: (token: string) => string } {
  const pairs = cookie.split('; ')
  const index = pairs.findIndex((pair) => pair.startsWith(`${SESSION_COOKIE}=`))
  expect(index).toBeGreaterThanOrEqual(0)
  const withToken = (token: string) => pairs.map((pair, i) => (i === index ? `${SESSION_COOKIE}=${token}` : pair)).join('; ')
  return { token: pairs[index]!.slice(SESSION_COOKIE.length + 1), withToken }
}

describe('revocable sessions', () => {
  it('sign-out ends the session for a copied cookie too', async () => {
    const { client } = await newAccount('signout')
    const copied = client.cookie
    expect(await copyStillWorks(copied)).toBe(true)
    const csrf = (await client.request('/api/auth/csrf')).body.csrfToken as string
    const out = await fetch(`${BASE_URL}/api/auth/signout`, {
      method: 'POST',
      headers: { 'cookie': client.cookie, 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ csrfToken: csrf, json: 'true', callbackUrl: '/login' }),
      redirect: 'manual',
    })
    expect(out.status).toBeLessThan(400)
    expect(await copyStillWorks(copied)).toBe(false)
  })

  it('an administrator\'s password reset ends the user\'s sessions', async () => {
    const { id, client } = await newAccount('reset')
    const copied = client.cookie
    expect((await admin.request(`/api/users/${id}`, { method: 'PATCH', body: { password: 'Granite-furnace-19-atlas' } })).status).toBe(200)
    expect(await copyStillWorks(copied)).toBe(false)
    expect((await client.request('/api/floor')).status).toBe(401)
  })

  it('deactivate then reactivate does not bring the old session back', async () => {
    const { id, client } = await newAccount('reactivate')
    const copied = client.cookie
    expect((await admin.request(`/api/users/${id}`, { method: 'PATCH', body: { active: false } })).status).toBe(200)
    expect((await admin.request(`/api/users/${id}`, { method: 'PATCH', body: { active: true } })).status).toBe(200)
    expect(await copyStillWorks(copied)).toBe(false)
  })

  it('a role change ends the sessions; a name change does not', async () => {
    const { id, client } = await newAccount('role')
    expect((await admin.request(`/api/users/${id}`, { method: 'PATCH', body: { displayName: 'Sam Renamed' } })).status).toBe(200)
    expect(await copyStillWorks(client.cookie)).toBe(true)
    expect((await admin.request(`/api/users/${id}`, { method: 'PATCH', body: { role: 'qa' } })).status).toBe(200)
    expect(await copyStillWorks(client.cookie)).toBe(false)
  })
})

describe('the API reads the session itself (no next-auth handler per request)', () => {
  it.each(ROLES.filter((role) => role !== 'admin'))('the demo %s is the same user to the API as to next-auth', async (role) => {
    const client = await signInDemo(role)
    const session = (await client.request('/api/auth/session')).body.user as { role: string }
    // people.manage is the administrator's alone: the 403 names the role the API read.
    const refused = await client.request('/api/users')
    expect(refused.status).toBe(403)
    expect(refused.body.data.role).toBe(session.role)
    expect(session.role).toBe(role)
  })

  it('refuses a tampered cookie, as next-auth does', async () => {
    const { client } = await newAccount('tampered')
    const { token, withToken } = sessionToken(client.cookie)
    expect(await apiStatus(client.cookie)).toBe(200)
    const parts = token.split('.')
    const ciphertext = Buffer.from(parts[3]!, 'base64url')
    ciphertext[0] = ciphertext[0]! ^ 1
    parts[3] = ciphertext.toString('base64url')
    expect(await copyStillWorks(withToken(parts.join('.')))).toBe(false)
  })

  it('accepts next-auth\'s own token and refuses it expired or sealed under another secret', async () => {
    const { client } = await newAccount('resealed')
    const { token, withToken } = sessionToken(client.cookie)
    // The reference: next-auth/jwt, the library that writes the cookie, re-sealing the same claims.
    const claims = (await decode({ token, secret: AUTH_SECRET }))!
    const { exp: _exp, iat: _iat, jti: _jti, ...kept } = claims
    expect(await copyStillWorks(withToken(await encode({ token: kept, secret: AUTH_SECRET, maxAge: 600 })))).toBe(true)
    expect(await copyStillWorks(withToken(await encode({ token: kept, secret: AUTH_SECRET, maxAge: -60 })))).toBe(false)
    expect(await copyStillWorks(withToken(await encode({ token: kept, secret: 'another-shop-secret-not-for-production', maxAge: 600 })))).toBe(false)
  })
})

describe('users change their own password', () => {
  it('refuses a wrong current password, a weak or own-name new one, with the field named', async () => {
    const { client } = await newAccount('own-refusals')
    const wrong = await client.request('/api/account/password', { method: 'POST', body: { currentPassword: 'not-my-password', newPassword: 'Basalt-kettle-55-orbit' } })
    expect(wrong.status).toBe(422)
    expect(wrong.body.data.problems[0].field).toBe('currentPassword')
    for (const [newPassword, status, message] of [
      ['bbbbbbbbbbbb', 422, /Too easy to guess/],
      ['Sam own-refusals 2026', 422, /e-mail or name/],
      ['short-one', 400, /at least 12 characters/],
    ] as const) {
      const refused = await client.request('/api/account/password', { method: 'POST', body: { currentPassword: strong, newPassword } })
      expect(refused.status).toBe(status)
      expect(refused.body.data.problems[0].field).toBe('newPassword')
      expect(refused.body.data.problems[0].message).toMatch(message)
    }
    expect(await copyStillWorks(client.cookie)).toBe(true)
  })

  it('a change ends every session; the new password signs in, the old one does not', async () => {
    const { email, client } = await newAccount('own-change')
    const changed = await client.request('/api/account/password', { method: 'POST', body: { currentPassword: strong, newPassword: 'Basalt-kettle-55-orbit' } })
    expect(changed.status).toBe(204)
    expect(await copyStillWorks(client.cookie)).toBe(false)
    expect(await signInAs(email, strong)).toBeNull()
    expect(await signInAs(email, 'Basalt-kettle-55-orbit')).not.toBeNull()
  })

  it('without a session the change is 401', async () => {
    const response = await fetch(`${BASE_URL}/api/account/password`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ currentPassword: strong, newPassword: 'Basalt-kettle-55-orbit' }) })
    expect(response.status).toBe(401)
  })
})

describe('administrators set passwords by the same rules', () => {
  it.each([
    ['ten of one letter', 'aaaaaaaaaa', 400, /at least 12/],
    ['twelve of one letter', 'aaaaaaaaaaaa', 422, /Too easy to guess/],
    ['the user\'s own e-mail', 'EMAIL', 422, /e-mail or name/],
  ])('refuses %s when creating a user', async (_label, password, status, message) => {
    const email = `weak-${Date.now()}@kestrelbay.example`
    const response = await admin.request('/api/users', { method: 'POST', body: { email, displayName: 'Weak Pat', role: 'qa', password: password === 'EMAIL' ? email : password } })
    expect(response.status).toBe(status)
    expect(response.body.data.problems[0]).toMatchObject({ field: 'password', message: expect.stringMatching(message) })
    const list = (await admin.request('/api/users')).body as { email: string }[]
    expect(list.some((user) => user.email === email)).toBe(false)
  })
})
