import { expect } from 'vitest'
import type { Client } from './http'

/** The audit rows of one entity (a library entry, batch, plan, user…), newest first; `admin` must be able to read the audit trail. */
export async function auditFor(admin: Client, entityType: string, id: number) {
  const response = await admin.request(`/api/audit?entityType=${entityType}&limit=500`)
  expect(response.status).toBe(200)
  return response.body.filter((entry: { entityId: string }) => entry.entityId === String(id))
}

/** The newest audit row's id: a refused change must leave it where it was. */
export async function latestAuditId(admin: Client): Promise<number> {
  return (await admin.request('/api/audit?limit=1')).body[0].id
}
