import { asc, eq } from 'drizzle-orm'

/** Everyone who appears in the audit trail as the one who acted: the person filter's choices. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'audit.read')
  const { auditLog, users } = tables
  return await useDb()
    .selectDistinct({ id: users.id, name: users.displayName })
    .from(auditLog)
    .innerJoin(users, eq(users.id, auditLog.actorId))
    .orderBy(asc(users.displayName))
})
