import { createError, type H3Event } from 'h3'
import { getServerSession } from '#auth'

/**
 * The signed-in account's id, even while it must still replace a generated password
 * (requireRole refuses such an account everything else). 401 without a session.
 */
export async function requireSignedInId(event: H3Event): Promise<number> {
  const session = await getServerSession(event)
  const id = Number((session?.user as { id?: unknown } | undefined)?.id)
  if (!Number.isInteger(id) || id <= 0) throw createError({ statusCode: 401, statusMessage: 'Sign in required' })
  return id
}
