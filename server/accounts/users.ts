import { asc, eq, sql } from 'drizzle-orm'
import { createError } from 'h3'
import type { PublicUser } from '../../shared/types/user'
import type { UserCreate, UserUpdate } from '../../shared/schemas/user'
import { users, type UserRow } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { isDuplicateKey } from '../utils/dbErrors'
import { hashPassword } from '../utils/password'
import { useDb } from '../utils/db'
import { assertPasswordAcceptable } from '../security/passwordPolicy'
import { changeEndsSessions } from '../security/sessions'

export function toPublicUser(row: UserRow): PublicUser {
  return {
    id: row.id,
    email: row.email,
    displayName: row.displayName,
    role: row.role,
    active: row.active,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

export async function listUsers(): Promise<PublicUser[]> {
  const rows = await useDb().select().from(users).orderBy(asc(users.displayName))
  return rows.map(toPublicUser)
}

export async function createUser(input: UserCreate, actorId: number): Promise<PublicUser> {
  assertPasswordAcceptable(input.password, input)
  const passwordHash = await hashPassword(input.password)
  try {
    return await useDb().transaction(async (tx) => {
      const [{ id }] = await tx
        .insert(users)
        .values({ email: input.email, displayName: input.displayName, role: input.role, passwordHash })
        .$returningId()
      await recordAudit(tx, {
        actorId,
        action: 'user.create',
        entityType: 'user',
        entityId: id,
        details: { email: input.email, role: input.role },
      })
      const [row] = await tx.select().from(users).where(eq(users.id, id))
      return toPublicUser(row!)
    })
  } catch (error) {
    if (isDuplicateKey(error)) {
      throw createError({
        statusCode: 409,
        statusMessage: 'E-mail already in use',
        data: { problems: [{ field: 'email', message: 'Another account already uses this e-mail' }] },
      })
    }
    throw error
  }
}

export async function updateUser(id: number, change: UserUpdate, actorId: number): Promise<PublicUser> {
  if (id === actorId && (change.active === false || (change.role && change.role !== 'admin'))) {
    // An admin locking themselves out could leave the shop with no administrator.
    throw createError({
      statusCode: 422,
      statusMessage: 'Cannot demote or deactivate yourself',
      data: { problems: [{ field: change.active === false ? 'active' : 'role', message: 'Ask another administrator to do this' }] },
    })
  }
  if (change.password) {
    const [owner] = await useDb().select().from(users).where(eq(users.id, id))
    if (owner) assertPasswordAcceptable(change.password, { email: owner.email, displayName: change.displayName ?? owner.displayName })
  }
  const passwordHash = change.password ? await hashPassword(change.password) : undefined
  return await useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(users).where(eq(users.id, id)).for('update')
    if (!before) throw createError({ statusCode: 404, statusMessage: 'User not found' })
    const values: Partial<UserRow> = {}
    if (change.displayName !== undefined) values.displayName = change.displayName
    if (change.role !== undefined) values.role = change.role
    if (change.active !== undefined) values.active = change.active
    if (passwordHash) values.passwordHash = passwordHash
    // A reset, a role change or a deactivation ends the sessions the account has open.
    const endSessions = changeEndsSessions(before, change)
    await tx.update(users).set({ ...values, ...(endSessions ? { sessionVersion: sql`${users.sessionVersion} + 1` } : {}) }).where(eq(users.id, id))
    const details: Record<string, unknown> = {}
    for (const key of ['displayName', 'role', 'active'] as const) {
      if (change[key] !== undefined && change[key] !== before[key]) details[key] = { from: before[key], to: change[key] }
    }
    if (passwordHash) details.password = 'reset'
    await recordAudit(tx, { actorId, action: 'user.update', entityType: 'user', entityId: id, details })
    const [after] = await tx.select().from(users).where(eq(users.id, id))
    return toPublicUser(after!)
  })
}
