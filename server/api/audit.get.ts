import { desc, eq } from 'drizzle-orm'
import { z } from 'zod'
import type { AuditEntry } from '../../shared/types/user'

const Query = z.object({
  entityType: z.string().max(64).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
})

export default defineEventHandler(async (event): Promise<AuditEntry[]> => {
  await requireRole(event, 'audit.read')
  const { entityType, limit } = queryValid(event, Query)
  const { auditLog, users } = tables
  const rows = await useDb()
    .select({ entry: auditLog, actorName: users.displayName })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(entityType ? eq(auditLog.entityType, entityType) : undefined)
    .orderBy(desc(auditLog.id))
    .limit(limit)
  return rows.map(({ entry, actorName }) => ({
    id: entry.id,
    at: entry.at.toISOString(),
    actorId: entry.actorId,
    actorName,
    action: entry.action,
    entityType: entry.entityType,
    entityId: entry.entityId,
    details: entry.details ?? null,
  }))
})
