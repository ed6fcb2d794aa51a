import { describe, expect, it } from 'vitest'
import { changeEndsSessions, SHIFT_SECONDS, sessionStands } from '../../../server/security/sessions'

const signedInAt = Date.parse('2026-12-02T06:00:00Z')
const account = { active: true, sessionVersion: 3, demo: false }
const token = { uid: 7, sv: 3, authAt: signedInAt }

describe('whether a session token still stands', () => {
  it.each([
    ['the same version, an hour in', account, token, signedInAt + 3600_000, true],
    ['a raised version (signed out, reset, deactivated, role changed)', { ...account, sessionVersion: 4 }, token, signedInAt + 1000, false],
    ['an inactive account', { ...account, active: false }, token, signedInAt + 1000, false],
    ['no account', undefined, token, signedInAt + 1000, false],
    ['one second short of a 12 h shift', account, token, signedInAt + SHIFT_SECONDS * 1000 - 1000, true],
    ['a 12 h shift after signing in, however busy', account, token, signedInAt + SHIFT_SECONDS * 1000, false],
    ['a token from before session versions (no sv)', account, { uid: 7, authAt: signedInAt }, signedInAt + 1000, false],
    ['a token without a sign-in time', account, { uid: 7, sv: 3 }, signedInAt + 1000, false],
  ])('%s', (_label, row, claims, now, stands) => {
    expect(sessionStands(row, claims, now, true)).toBe(stands)
  })

  it('a demo account stands only while demo sign-ins are allowed (loopback)', () => {
    expect(sessionStands({ ...account, demo: true }, token, signedInAt + 1000, true)).toBe(true)
    expect(sessionStands({ ...account, demo: true }, token, signedInAt + 1000, false)).toBe(false)
  })
})

describe('which administrator changes end the sessions', () => {
  const before = { role: 'operator', active: true }
  it.each([
    [{ password: 'Quarry-lantern-47-bellows' }, true],
    [{ role: 'qa' }, true],
    [{ role: 'operator' }, false],
    [{ active: false }, true],
    [{ active: true }, false],
    [{}, false],
  ])('%j → %s', (change, ends) => {
    expect(changeEndsSessions(before, change)).toBe(ends)
  })
})
