import { count } from 'drizzle-orm'
import type { Database } from '../client'
import { users } from '../schema'
import { hashPassword } from '../../utils/password'
import { recordAudit } from '../../utils/audit'
import { DEMO_USERS } from './shop'

/** Seeds the demo shop once: only when there are no users at all. Returns whether it seeded. */
export async function seedDemoData(db: Database): Promise<boolean> {
  const [{ total }] = await db.select({ total: count() }).from(users)
  if (total > 0) return false
  const hashed = await Promise.all(DEMO_USERS.map(async (user) => ({ ...user, passwordHash: await hashPassword(user.password) })))
  await db.transaction(async (tx) => {
    for (const user of hashed) {
      await tx.insert(users).values({ email: user.email, displayName: user.displayName, role: user.role, passwordHash: user.passwordHash })
    }
    await recordAudit(tx, { actorId: null, action: 'demo.seed', entityType: 'shop', details: { users: hashed.length } })
  })
  return true
}
