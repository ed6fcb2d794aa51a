import { and, eq } from 'drizzle-orm'
import { users } from '../db/schema'
import { useDb } from '../utils/db'

/** True while an active demo account (published password) exists. */
export async function demoShopActive(): Promise<boolean> {
  const [row] = await useDb().select({ id: users.id }).from(users).where(and(eq(users.demo, true), eq(users.active, true))).limit(1)
  return row !== undefined
}
