/**
 * The account a session token stands for, read fresh from the database: the one check
 * behind both next-auth's session callback (the browser's /api/auth/session) and the
 * API's own session read (server/utils/auth.ts), so the two can never disagree about a
 * deactivated account, a changed role or a raised session version.
 */
import { eq, sql } from 'drizzle-orm'
import { users } from '../db/schema'
import type { Database } from '../db/client'
import { preparedPerDatabase } from '../db/preparedQueries'
import type { Role } from '../../shared/roles'
import { sessionStands, type SessionToken } from './sessions'

export interface SessionAccountUser {
  id: number
  email: string
  name: string
  role: Role
  mustChangePassword: boolean
}

// Run on every signed-in request: built once, not per request.
const accountById = preparedPerDatabase((db) => db.select().from(users).where(eq(users.id, sql.placeholder('id'))).prepare())

export async function sessionAccountUser(db: Database, token: SessionToken, nowMs: number, demoAllowed: boolean): Promise<SessionAccountUser | null> {
  const id = Number(token.uid)
  if (!Number.isInteger(id) || id <= 0) return null
  const [row] = await accountById(db).execute({ id })
  if (!sessionStands(row, token, nowMs, demoAllowed)) return null
  return { id: row!.id, email: row!.email, name: row!.displayName, role: row!.role, mustChangePassword: row!.mustChangePassword }
}
