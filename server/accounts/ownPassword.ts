import { eq, sql } from 'drizzle-orm'
import { createError } from 'h3'
import type { OwnPasswordChange } from '../../shared/schemas/user'
import { users } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { hashPassword, verifyPassword } from '../utils/password'
import { assertPasswordAcceptable } from '../security/passwordPolicy'

/**
 * A user replaces their own password (also the generated first one). Every session of
 * the account ends, this one included: the page signs in again with the new password.
 */
export async function changeOwnPassword(userId: number, change: OwnPasswordChange): Promise<void> {
  const [account] = await useDb().select().from(users).where(eq(users.id, userId))
  if (!account || !account.active) throw createError({ statusCode: 401, statusMessage: 'Sign in required' })
  if (!(await verifyPassword(change.currentPassword, account.passwordHash))) {
    throw createError({ statusCode: 422, statusMessage: 'Current password is wrong', data: { problems: [{ field: 'currentPassword', message: 'This is not your current password' }] } })
  }
  if (change.newPassword === change.currentPassword) {
    throw createError({ statusCode: 422, statusMessage: 'Password refused', data: { problems: [{ field: 'newPassword', message: 'Choose a password different from the current one' }] } })
  }
  assertPasswordAcceptable(change.newPassword, account, 'newPassword')
  const passwordHash = await hashPassword(change.newPassword)
  await useDb().transaction(async (tx) => {
    await tx
      .update(users)
      .set({ passwordHash, mustChangePassword: false, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, userId))
    await recordAudit(tx, { actorId: userId, action: 'user.password-change', entityType: 'user', entityId: userId })
  })
}
