import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import { getServerSession } from '#auth'
import { type Role, roleAllows } from '../../shared/roles'
import { users } from '../db/schema'

export interface SessionUser {
  id: number
  email: string
  displayName: string
  role: Role
}

/**
 * The signed-in user, read fresh from the database on every request so that a
 * deactivation or a role change takes effect at once, whatever the session token says.
 * 401 without a valid session, 403 when the role is not in `allowed` (empty: any role).
 */
export async function requireRole(event: H3Event, allowed: readonly Role[] = []): Promise<SessionUser> {
  const session = await getServerSession(event)
  const userId = Number((session?.user as { id?: unknown } | undefined)?.id)
  if (!Number.isInteger(userId) || userId <= 0) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in required' })
  }
  const [row] = await useDb()
    .select({ id: users.id, email: users.email, displayName: users.displayName, role: users.role, active: users.active })
    .from(users)
    .where(eq(users.id, userId))
  if (!row || !row.active) {
    throw createError({ statusCode: 401, statusMessage: 'This account is no longer active' })
  }
  if (!roleAllows(row.role, allowed)) {
    throw createError({
      statusCode: 403,
      statusMessage: 'Not allowed for your role',
      data: { role: row.role, allowedRoles: allowed },
    })
  }
  return { id: row.id, email: row.email, displayName: row.displayName, role: row.role }
}
