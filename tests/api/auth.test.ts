import { describe, expect, it } from 'vitest'
import { ROLES } from '../../shared/roles'
import { connectTestDb } from '../support/db'
import { anonymous, demoUser, signInAs, signInDemo } from '../support/http'

describe('sign-in through the real auth endpoints', () => {
  it.each(ROLES)('the demo %s signs in and the session carries the role', async (role) => {
    const client = await signInDemo(role)
    const { status, body } = await client.request('/api/auth/session')
    expect(status).toBe(200)
    expect(body.user.role).toBe(role)
    expect(body.user.email).toBe(demoUser(role).email)
    expect(JSON.stringify(body)).not.toContain('password')
  })

  it('refuses a wrong password and an unknown e-mail alike', async () => {
    expect(await signInAs(demoUser('qa').email, 'not-the-password')).toBeNull()
    expect(await signInAs('nobody@kestrelbay.example', 'not-the-password')).toBeNull()
  })

  it('slows down repeated failures for the same e-mail', async () => {
    const email = 'slowdown-probe@kestrelbay.example'
    for (let attempt = 0; attempt < 4; attempt++) await signInAs(email, 'wrong-password')
    const started = Date.now()
    await signInAs(email, 'wrong-password')
    // After three free failures the fifth attempt waits at least 2 × 0.5 s.
    expect(Date.now() - started).toBeGreaterThanOrEqual(900)
  })

  it('keeps the failure count in the database (a restart does not reset it) and clears it on a good sign-in', async () => {
    const db = await connectTestDb()
    const countOf = async (email: string) => {
      const [rows] = await db.query('SELECT count FROM sign_in_failures WHERE email = ?', [email])
      return (rows as { count: number }[])[0]?.count ?? null
    }
    try {
      const probe = 'stored-failures-probe@kestrelbay.example'
      for (let attempt = 0; attempt < 2; attempt++) await signInAs(probe, 'wrong-password')
      expect(await countOf(probe)).toBe(2)
      const { email, password } = demoUser('metallurgist')
      await signInAs(email, 'wrong-password')
      expect(await countOf(email)).toBe(1)
      expect(await signInAs(email, password)).not.toBeNull()
      expect(await countOf(email)).toBeNull()
    } finally {
      await db.end()
    }
  })

  it('answers API calls without a session with 401 JSON', async () => {
    const { status, body } = await anonymous().request('/api/users')
    expect(status).toBe(401)
    expect(body.statusMessage).toBe('Sign in required')
    expect(JSON.stringify(body)).not.toMatch(/stack|at \w+ \(/)
  })
})
