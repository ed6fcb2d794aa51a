/**
 * Reads next-auth's session token (a JWE, "dir" + A256GCM, under a key derived from the
 * auth secret) without next-auth's session handler. That handler, run for every signed-in
 * API request, derives the key twice with HKDF, decrypts the token and encrypts a fresh
 * one that a server-side session read then throws away. Here the key is derived once per
 * secret and the token is only decrypted: the same checks (the GCM tag, so a changed
 * byte is refused; expiry and not-before with next-auth's 15 s tolerance), no re-encryption.
 * Only the token shape next-auth writes is accepted; anything else is no session.
 * Framework-free: the request glue is server/utils/auth.ts.
 */
import { createDecipheriv, hkdfSync } from 'node:crypto'
import type { SessionToken } from './sessions'

/** The HKDF info next-auth derives its token key with (next-auth/jwt). */
const KEY_INFO = 'NextAuth.js Generated Encryption Key'
/** next-auth's decode accepts a token this many seconds past its expiry. */
const CLOCK_TOLERANCE_S = 15
const IV_BYTES = 12
const TAG_BYTES = 16
const COOKIE_NAME = 'next-auth.session-token'

/** The 32-byte A256GCM key next-auth derives from `secret`. */
export function sessionTokenKey(secret: string): Buffer {
  return Buffer.from(hkdfSync('sha256', secret, '', KEY_INFO, 32))
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

function jsonObject(bytes: Buffer): Record<string, unknown> | null {
  try {
    const value: unknown = JSON.parse(bytes.toString('utf8'))
    return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : null
  } catch {
    return null
  }
}

function decrypt(token: string, key: Buffer): Buffer | null {
  const parts = token.split('.')
  if (parts.length !== 5) return null
  const [protectedHeader, encryptedKey, ivText, ciphertextText, tagText] = parts as [string, string, string, string, string]
  const header = jsonObject(Buffer.from(protectedHeader, 'base64url'))
  // Exactly next-auth's header: no other algorithm, no compression, no critical extensions.
  if (!header || header.alg !== 'dir' || header.enc !== 'A256GCM' || Object.keys(header).length !== 2) return null
  if (encryptedKey !== '') return null
  const iv = Buffer.from(ivText, 'base64url')
  const tag = Buffer.from(tagText, 'base64url')
  // A short tag would be accepted by GCM and weaken it: only the full 16 bytes.
  if (iv.length !== IV_BYTES || tag.length !== TAG_BYTES) return null
  try {
    const decipher = createDecipheriv('aes-256-gcm', key, iv, { authTagLength: TAG_BYTES })
    decipher.setAAD(Buffer.from(protectedHeader, 'ascii'))
    decipher.setAuthTag(tag)
    return Buffer.concat([decipher.update(Buffer.from(ciphertextText, 'base64url')), decipher.final()])
  } catch {
    return null // the tag does not match: the token was changed or sealed under another secret
  }
}

/**
 * The claims of a session token sealed under `key` that is in force at `nowMs`, else null
 * (not a token, tampered with, another secret, expired, not yet valid).
 */
export function decodeSessionToken(token: string, key: Buffer, nowMs: number): SessionToken | null {
  const plaintext = decrypt(token, key)
  const claims = plaintext && jsonObject(plaintext)
  if (!claims) return null
  const now = Math.floor(nowMs / 1000)
  const { exp, nbf, iat } = claims
  if (typeof exp !== 'number' || exp <= now - CLOCK_TOLERANCE_S) return null
  if (nbf !== undefined && (typeof nbf !== 'number' || nbf > now + CLOCK_TOLERANCE_S)) return null
  if (iat !== undefined && typeof iat !== 'number') return null
  return claims
}
