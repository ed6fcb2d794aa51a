import { describe, expect, it } from 'vitest'
import { secretProblem, secretProblems } from '../../../server/security/secrets'

describe('start-up check of the secrets', () => {
  it.each([
    ['unset', undefined, 'is not set'],
    ['the .env.example auth placeholder', 'change-me-to-a-long-random-string', 'placeholder ("change-me")'],
    ['the .env.example seal placeholder', 'change-me-to-another-long-random-string', 'placeholder'],
    ['too short (31 hex characters)', '2f9a6c1e8b7d4035a9c2e1f0b3d4a5c', 'has 31 characters'],
    ['one character repeated', 'a'.repeat(40), 'too easy to guess'],
    ['a keyboard run', 'abcdefghijklmnopqrstuvwxyz0123456789', 'too easy to guess'],
    ['a repeated word', 'passwordpasswordpasswordpassword12', 'too easy to guess'],
  ])('refuses %s', (_label, value, message) => {
    expect(secretProblem(value)).toContain(message)
  })

  it('accepts 32 random bytes in hex, as npm start makes them', () => {
    expect(secretProblem('2f9a6c1e8b7d4035a9c2e1f0b3d4a5c6e7f8091a2b3c4d5e6f708192a3b4c5d6')).toBeNull()
  })

  it('names the variable and how to make a good value', () => {
    const [message] = secretProblems([{ name: 'NUXT_RECORD_SEAL_KEY', value: 'short', hint: 'Make one with openssl rand -hex 32' }])
    expect(message).toBe('NUXT_RECORD_SEAL_KEY has 5 characters; at least 32 are needed. Make one with openssl rand -hex 32')
  })
})
