import type { Role } from '../roles'

/** A user as the API returns it: never the password hash. */
export interface PublicUser {
  id: number
  email: string
  displayName: string
  role: Role
  active: boolean
  createdAt: string
  updatedAt: string
}

export interface AuditEntry {
  id: number
  at: string
  actorId: number | null
  actorName: string | null
  action: string
  entityType: string
  entityId: string | null
  details: Record<string, unknown> | null
}
