import { describe, expect, it } from 'vitest'
import { ROLES } from '../../shared/roles'
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

  it('answers API calls without a session with 401 JSON', async () => {
    const { status, body } = await anonymous().request('/api/users')
    expect(status).toBe(401)
    expect(body.statusMessage).toBe('Sign in required')
    expect(JSON.stringify(body)).not.toMatch(/stack|at \w+ \(/)
  })
})
