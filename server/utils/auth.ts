import { parseCookies, type H3Event } from 'h3'
import type { Role } from '../../shared/roles'
import { type Capability, can, rolesFor } from '../../shared/access'
import { decodeSessionToken, sessionCookieName, sessionTokenFromCookies, sessionTokenKey, type SessionTokenKey } from '../security/sessionToken'
import { sessionAccountUser, type SessionAccountUser } from '../security/sessionUser'
import { demoSignInsAllowed } from '../security/demoShop'

export interface SessionUser {
  id: number
  email: string
  displayName: string
  role: Role
}

/** Behind a TLS proxy (an https:// AUTH_ORIGIN) the session cookie is sent over HTTPS only. */
export function secureSessionCookies(): boolean {
  return (process.env.AUTH_ORIGIN ?? '').startsWith('https://')
}

let derivedKey: { secret: string; key: Promise<SessionTokenKey> } | undefined

/** The token key, derived once per secret rather than on every request. */
function tokenKey(secret: string): Promise<SessionTokenKey> {
  if (derivedKey?.secret !== secret) derivedKey = { secret, key: sessionTokenKey(secret) }
  return derivedKey.key
}

/**
 * Who is signed in on this request, or null. Reads the session cookie next-auth wrote
 * (server/security/sessionToken.ts: decrypted by jose under a cached key, not re-encrypted) and
 * then the account itself from the database, exactly as the session callback does
 * (server/security/sessionUser.ts): a deactivation, a role change or a raised session
 * version takes effect at once, whatever the token says.
 */
export async function readSessionUser(event: H3Event): Promise<SessionAccountUser | null> {
  const secret = useRuntimeConfig().authSecret
  if (!secret) return null
  const token = sessionTokenFromCookies(parseCookies(event), sessionCookieName(secureSessionCookies()))
  if (!token) return null
  const now = Date.now()
  const claims = await decodeSessionToken(token, await tokenKey(secret), now)
  return claims ? sessionAccountUser(useDb(), claims, now, demoSignInsAllowed()) : null
}

/**
 * The signed-in user (readSessionUser). 401 without a valid session, 403 when the role
 * lacks `capability` (shared/access.ts).
 */
export async function requireRole(event: H3Event, capability: Capability): Promise<SessionUser> {
  const user = await readSessionUser(event)
  if (!user) throw createError({ statusCode: 401, statusMessage: 'Sign in required' })
  if (user.mustChangePassword) {
    // A generated first password was shown once on a console; only its owner's own choice may act.
    throw createError({ statusCode: 403, statusMessage: 'Choose your own password first', data: { problems: [{ field: 'password', message: 'Change the generated password at /account/password' }] } })
  }
  if (!can(user.role, capability)) {
    throw createError({
      statusCode: 403,
      statusMessage: 'Not allowed for your role',
      data: { role: user.role, capability, allowedRoles: rolesFor(capability) },
    })
  }
  return { id: user.id, email: user.email, displayName: user.name, role: user.role }
}
