import { boolean, datetime, index, int, json, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core'
import { sql } from 'drizzle-orm'
import { ROLES } from '../../shared/roles'

const timestamps = {
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`).$onUpdate(() => new Date()),
}

export const users = mysqlTable('users', {
  id: int('id').autoincrement().primaryKey(),
  email: varchar('email', { length: 190 }).notNull().unique(),
  displayName: varchar('display_name', { length: 120 }).notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  /** scrypt$N$r$p$salt$hash — see server/utils/password.ts */
  passwordHash: varchar('password_hash', { length: 255 }).notNull(),
  active: boolean('active').notNull().default(true),
  ...timestamps,
})

/** Append-only record of who changed what; rows are never updated or deleted by the app. */
export const auditLog = mysqlTable(
  'audit_log',
  {
    id: int('id').autoincrement().primaryKey(),
    at: datetime('at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    actorId: int('actor_id').references(() => users.id),
    action: varchar('action', { length: 64 }).notNull(),
    entityType: varchar('entity_type', { length: 64 }).notNull(),
    entityId: varchar('entity_id', { length: 64 }),
    details: json('details').$type<Record<string, unknown>>(),
  },
  (table) => [index('audit_entity_idx').on(table.entityType, table.entityId), index('audit_at_idx').on(table.at)],
)

export type UserRow = typeof users.$inferSelect
export type AuditRow = typeof auditLog.$inferSelect
