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
  /** What the entry is about, by name: the person's name, the load number, the plan's name. */
  entityName: string | null
  details: Record<string, unknown> | null
}
