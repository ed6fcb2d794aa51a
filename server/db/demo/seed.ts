import { count } from 'drizzle-orm'
import type { Database, Transaction } from '../client'
import { materials, quenchants, users } from '../schema'
import { hashPassword } from '../../utils/password'
import { recordAudit } from '../../utils/audit'
import { materialInputSchema } from '../../../shared/schemas/material'
import { quenchantInputSchema } from '../../../shared/schemas/quenchant'
import { DEMO_USERS } from './shop'
import { DEMO_MATERIALS } from './materials'
import { DEMO_QUENCHANTS } from './quenchants'
import { seedDemoPlans } from './plans'

/** How many rows of each kind were seeded (0: the table had rows and was left alone). */
export interface SeedResult {
  users: number
  materials: number
  quenchants: number
  plans: number
}

async function isEmpty(db: Database | Transaction, table: typeof users | typeof materials | typeof quenchants): Promise<boolean> {
  const [row] = await db.select({ total: count() }).from(table)
  return !row || row.total === 0
}

/**
 * Seeds the demo shop, each table only when it is empty: a database that already has
 * people still receives the library when the library arrives, and a shop's own
 * entries are never overwritten. Order: people, library, then plans (which name
 * library entries and are created by the demo metallurgist).
 */
export async function seedDemoData(db: Database): Promise<SeedResult> {
  const result: SeedResult = { users: 0, materials: 0, quenchants: 0, plans: 0 }
  const seedUsers = await isEmpty(db, users)
  // Hashing is slow (scrypt); do it before the transaction opens.
  const hashed = seedUsers ? await Promise.all(DEMO_USERS.map(async (user) => ({ ...user, passwordHash: await hashPassword(user.password) }))) : []
  await db.transaction(async (tx) => {
    for (const user of hashed) {
      await tx.insert(users).values({ email: user.email, displayName: user.displayName, role: user.role, passwordHash: user.passwordHash, demo: true })
    }
    result.users = hashed.length
    if (await isEmpty(tx, materials)) {
      // Parsed through the shared schema so seed rows obey the same rules as the forms.
      for (const material of DEMO_MATERIALS) await tx.insert(materials).values(materialInputSchema.parse(material))
      result.materials = DEMO_MATERIALS.length
    }
    if (await isEmpty(tx, quenchants)) {
      for (const quenchant of DEMO_QUENCHANTS) await tx.insert(quenchants).values(quenchantInputSchema.parse(quenchant))
      result.quenchants = DEMO_QUENCHANTS.length
    }
    if (result.users + result.materials + result.quenchants > 0) {
      await recordAudit(tx, { actorId: null, action: 'demo.seed', entityType: 'shop', details: { users: result.users, materials: result.materials, quenchants: result.quenchants } })
    }
  })
  // Outside the library transaction: the planner's service opens its own per plan
  // (and audits each one), exactly as when a metallurgist saves a plan.
  result.plans = await seedDemoPlans(db)
  return result
}
