import type { Database, Transaction } from '../db/client'
import { auditLog } from '../db/schema'

export interface AuditEvent {
  actorId: number | null
  action: string
  entityType: string
  entityId?: string | number | null
  details?: Record<string, unknown>
}

/** Appends one audit row; pass the transaction that makes the change so both land or neither. */
export async function recordAudit(db: Database | Transaction, event: AuditEvent): Promise<void> {
  await db.insert(auditLog).values({
    actorId: event.actorId,
    action: event.action,
    entityType: event.entityType,
    entityId: event.entityId == null ? null : String(event.entityId),
    details: event.details ?? null,
  })
}
