import type { H3Event } from 'h3'
import { getServerSession } from '#auth'
import type { Role } from '../../shared/roles'
import { type Capability, can, rolesFor } from '../../shared/access'

export interface SessionUser {
  id: number
  email: string
  displayName: string
  role: Role
}

/**
 * The signed-in user as the session holds it. The session callback
 * (server/api/auth/[...].ts) reads the account fresh from the database on every
 * request and drops the user of a deactivated account, so a deactivation or a role
 * change takes effect at once, whatever the session token says.
 * 401 without a valid session, 403 when the role lacks `capability` (shared/access.ts).
 */
export async function requireRole(event: H3Event, capability: Capability): Promise<SessionUser> {
  const session = await getServerSession(event)
  const user = session?.user as { id?: unknown; email?: string; name?: string; role?: Role; mustChangePassword?: boolean } | undefined
  const id = Number(user?.id)
  if (!user || !Number.isInteger(id) || id <= 0 || !user.role) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in required' })
  }
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
  return { id, email: user.email as string, displayName: user.name as string, role: user.role }
}
