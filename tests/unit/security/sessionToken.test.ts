import { describe, expect, it } from 'vitest'
import { decode, encode } from 'next-auth/jwt'
import { decodeSessionToken, sessionCookieName, sessionTokenFromCookies, sessionTokenKey } from '../../../server/security/sessionToken'

// The reference is next-auth itself (next-auth/jwt, the library that writes the cookie):
// every token here is sealed by its encode, and the reader must accept exactly what its
// decode accepts.
const secret = 'kestrel-bay-session-secret-for-tests-only'
const key = await sessionTokenKey(secret)
const claims = { name: 'Morgan Hale', email: 'morgan@kestrelbay.example', sub: '7', uid: 7, sv: 3, authAt: 1_796_000_000_000 }

/** next-auth's own verdict: the claims, or null where it refuses (it throws). */
async function nextAuthDecode(token: string, withSecret = secret) {
  try {
    return await decode({ token, secret: withSecret })
  } catch {
    return null
  }
}

/** Replaces one base64url part of a compact JWE. */
function withPart(token: string, index: number, part: string) {
  const parts = token.split('.')
  parts[index] = part
  return parts.join('.')
}

function flipFirstByte(part: string) {
  const bytes = Buffer.from(part, 'base64url')
  bytes[0] = bytes[0]! ^ 1
  return bytes.toString('base64url')
}

describe('reading the session token without next-auth\'s session handler', () => {
  it('returns the claims next-auth sealed, the same as next-auth\'s decode', async () => {
    const token = await encode({ token: claims, secret, maxAge: 3600 })
    const read = await decodeSessionToken(token, key, Date.now())
    expect(read).toMatchObject(claims)
    expect(read).toEqual(await nextAuthDecode(token))
  })

  it.each([
    ['a changed ciphertext byte', 3],
    ['a changed tag byte', 4],
    ['a changed IV byte', 2],
  ])('refuses %s, as next-auth does', async (_label, index) => {
    const token = await encode({ token: claims, secret, maxAge: 3600 })
    const tampered = withPart(token, index, flipFirstByte(token.split('.')[index]!))
    expect(await decodeSessionToken(tampered, key, Date.now())).toBeNull()
    expect(await nextAuthDecode(tampered)).toBeNull()
  })

  it('refuses a token sealed under another secret', async () => {
    const token = await encode({ token: claims, secret: 'another-shop-secret-for-tests-only', maxAge: 3600 })
    expect(await decodeSessionToken(token, key, Date.now())).toBeNull()
    expect(await nextAuthDecode(token)).toBeNull()
  })

  it('refuses a changed header (it is authenticated as the AAD) and a truncated tag', async () => {
    const token = await encode({ token: claims, secret, maxAge: 3600 })
    const header = Buffer.from(JSON.stringify({ enc: 'A256GCM', alg: 'dir' })).toString('base64url')
    expect(await decodeSessionToken(withPart(token, 0, header), key, Date.now())).toBeNull()
    const shortTag = Buffer.from(token.split('.')[4]!, 'base64url').subarray(0, 12).toString('base64url')
    expect(await decodeSessionToken(withPart(token, 4, shortTag), key, Date.now())).toBeNull()
    expect(await decodeSessionToken('not.a.token', key, Date.now())).toBeNull()
  })

  it('refuses an expired token past next-auth\'s 15 s tolerance and keeps one within it, as next-auth does', async () => {
    // encode sets exp = now + maxAge (seconds): 60 s ago is expired, 10 s ago is within the tolerance.
    const expired = await encode({ token: claims, secret, maxAge: -60 })
    const justExpired = await encode({ token: claims, secret, maxAge: -10 })
    expect(await decodeSessionToken(expired, key, Date.now())).toBeNull()
    expect(await nextAuthDecode(expired)).toBeNull()
    expect(await decodeSessionToken(justExpired, key, Date.now())).toMatchObject(claims)
    expect(await nextAuthDecode(justExpired)).toMatchObject(claims)
  })

  it('stops accepting a token once its expiry plus 15 s has passed', async () => {
    const token = await encode({ token: claims, secret, maxAge: 3600 })
    const { exp } = (await decodeSessionToken(token, key, Date.now())) as { exp: number }
    expect(await decodeSessionToken(token, key, (exp + 14) * 1000)).not.toBeNull()
    expect(await decodeSessionToken(token, key, (exp + 15) * 1000)).toBeNull()
  })
})

describe('the session cookie', () => {
  it('is named as next-auth names it, with __Secure- behind HTTPS', () => {
    expect(sessionCookieName(false)).toBe('next-auth.session-token')
    expect(sessionCookieName(true)).toBe('__Secure-next-auth.session-token')
  })

  it('joins next-auth\'s chunks in order and ignores other cookies', () => {
    const name = sessionCookieName(false)
    expect(sessionTokenFromCookies({ 'next-auth.csrf-token': 'x', [name]: 'abc' }, name)).toBe('abc')
    expect(sessionTokenFromCookies({ [`${name}.0`]: 'ab', [`${name}.1`]: 'cd', other: 'z' }, name)).toBe('abcd')
    expect(sessionTokenFromCookies({ 'next-auth.csrf-token': 'x' }, name)).toBeUndefined()
    // The plain cookie name is not a prefix of the secure one: an HTTP server ignores it.
    expect(sessionTokenFromCookies({ '__Secure-next-auth.session-token': 'abc' }, name)).toBeUndefined()
  })
})
