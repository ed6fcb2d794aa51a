import { createError, type H3Event } from 'h3'
import { readSessionUser } from '../utils/auth'

/**
 * The signed-in account's id, even while it must still replace a generated password
 * (requireRole refuses such an account everything else). 401 without a session.
 */
export async function requireSignedInId(event: H3Event): Promise<number> {
  const user = await readSessionUser(event)
  if (!user) throw createError({ statusCode: 401, statusMessage: 'Sign in required' })
  return user.id
}
