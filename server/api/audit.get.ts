import { and, desc, eq, gte, inArray, lt } from 'drizzle-orm'
import { z } from 'zod'
import type { AuditEntry } from '../../shared/types/user'

const day = (label: string) => z.iso.date({ message: `${label} must be a date (YYYY-MM-DD)` }).optional()
const Query = z.object({
  entityType: z.string().max(64).optional(),
  actorId: z.coerce.number({ message: 'Person must be an id' }).int().positive('Person must be an id').optional(),
  from: day('From'),
  to: day('To'),
  limit: z.coerce.number().int().min(1).max(500).default(100),
})

export default defineEventHandler(async (event): Promise<AuditEntry[]> => {
  await requireRole(event, 'audit.read')
  const { entityType, actorId, from, to, limit } = queryValid(event, Query)
  const { auditLog, users } = tables
  const dayAfter = (date: string) => new Date(Date.parse(`${date}T00:00:00Z`) + 86_400_000)
  const rows = await useDb()
    .select({ entry: auditLog, actorName: users.displayName })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(and(
      entityType ? eq(auditLog.entityType, entityType) : undefined,
      actorId ? eq(auditLog.actorId, actorId) : undefined,
      from ? gte(auditLog.at, new Date(`${from}T00:00:00Z`)) : undefined,
      to ? lt(auditLog.at, dayAfter(to)) : undefined,
    ))
    .orderBy(desc(auditLog.id))
    .limit(limit)
  // People are named, never "user #14": entries about a person carry that person's name.
  const personIds = [...new Set(rows.filter(({ entry }) => entry.entityType === 'user' && entry.entityId).map(({ entry }) => Number(entry.entityId)))]
  const people = personIds.length ? await useDb().select({ id: users.id, name: users.displayName }).from(users).where(inArray(users.id, personIds)) : []
  const names = new Map(people.map((u) => [String(u.id), u.name]))
  return rows.map(({ entry, actorName }) => {
    const details = (entry.details ?? null) as Record<string, unknown> | null
    const named = entry.entityType === 'user' ? names.get(String(entry.entityId)) : (details?.loadNumber ?? details?.name)
    return {
      id: entry.id,
      at: entry.at.toISOString(),
      actorId: entry.actorId,
      actorName,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId,
      entityName: typeof named === 'string' ? named : null,
      details,
    }
  })
})
