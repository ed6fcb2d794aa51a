/**
 * Reads next-auth's session token (a JWE, "dir" + A256GCM, under a key derived from the
 * auth secret) without next-auth's session handler. That handler, run for every signed-in
 * API request, derives the key twice with HKDF, decrypts the token and encrypts a fresh
 * one that a server-side session read then throws away. Here the key is derived once per
 * secret and the token is only decrypted, by jose (the JOSE library next-auth itself
 * builds on): the GCM tag, so a changed byte is refused; only next-auth's algorithms;
 * expiry and not-before with next-auth's 15 s tolerance. No re-encryption.
 * Framework-free: the request glue is server/utils/auth.ts.
 */
import { hkdfSync, webcrypto } from 'node:crypto'
import { jwtDecrypt } from 'jose'
import type { SessionToken } from './sessions'

/** The HKDF info next-auth derives its token key with (next-auth/jwt). */
const KEY_INFO = 'NextAuth.js Generated Encryption Key'
/** next-auth's decode accepts a token this many seconds past its expiry. */
const CLOCK_TOLERANCE_S = 15
const COOKIE_NAME = 'next-auth.session-token'

/**
 * The 32-byte A256GCM key next-auth derives from `secret`, imported once as a Web Crypto
 * key: jose decrypts with Web Crypto and would import raw bytes again on every call
 * (43 µs a read with the imported key, 87 µs with the bytes).
 */
export type SessionTokenKey = webcrypto.CryptoKey

export function sessionTokenKey(secret: string): Promise<SessionTokenKey> {
  const raw = Buffer.from(hkdfSync('sha256', secret, '', KEY_INFO, 32))
  return webcrypto.subtle.importKey('raw', raw, { name: 'AES-GCM' }, false, ['decrypt'])
}

/** The session cookie's name: next-auth prefixes it with __Secure- when cookies are HTTPS-only. */
export function sessionCookieName(secureCookies: boolean): string {
  return secureCookies ? `__Secure-${COOKIE_NAME}` : COOKIE_NAME
}

/**
 * The token as next-auth's cookie store reads it: every cookie whose name starts with the
 * session cookie's name, joined in order (next-auth splits a token over 4 kB into chunks).
 */
export function sessionTokenFromCookies(cookies: Record<string, string>, cookieName: string): string | undefined {
  const parts = Object.keys(cookies).filter((name) => name.startsWith(cookieName)).map((name) => cookies[name])
  return parts.length > 0 ? parts.join('') : undefined
}

/**
 * The claims of a session token sealed under `key` that is in force at `nowMs`, else null
 * (not a token, tampered with, another secret, expired, not yet valid).
 */
export async function decodeSessionToken(token: string, key: SessionTokenKey, nowMs: number): Promise<SessionToken | null> {
  try {
    const { payload } = await jwtDecrypt(token, key, {
      keyManagementAlgorithms: ['dir'],
      contentEncryptionAlgorithms: ['A256GCM'],
      clockTolerance: CLOCK_TOLERANCE_S,
      currentDate: new Date(nowMs),
    })
    return payload as SessionToken
  } catch {
    return null // not a token, tampered with, another secret, expired or not yet valid
  }
}
